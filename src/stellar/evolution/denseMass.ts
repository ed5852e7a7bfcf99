/**
 * Integrates a star's mass through one evolutionary phase and keeps a dense output. Within a phase the
 * mass-loss equation is written in a progress variable x in [0, 1] in which the rate is smooth (the
 * core mass on the giant branches, the phase fraction elsewhere), so that a classical fixed-step
 * fourth-order Runge-Kutta scheme (written by hand: a few lines, and no maintained JS package offers a
 * fixed-step integrator with dense output on typed arrays) is accurate with few steps; segment breaks
 * go where the rate has kinks. Between steps the mass is a cubic Hermite interpolant of the values and
 * derivatives at the steps, which is accurate to the same order.
 */

export interface MassDerivative {
  /** dM/dx at progress x with current mass m (negative: mass is lost). */
  dMassDx(phase: number, x: number, m: number): number;
  /** Core mass at progress x; the envelope is gone when the mass reaches it. */
  coreMassAt(phase: number, x: number): number;
}

export class DenseMass {
  n = 0;
  x: Float64Array;
  m: Float64Array;
  dm: Float64Array;
  /** Progress at which the envelope was exhausted, or +Infinity. */
  xDead = Number.POSITIVE_INFINITY;

  constructor(capacity: number) {
    this.x = new Float64Array(capacity);
    this.m = new Float64Array(capacity);
    this.dm = new Float64Array(capacity);
  }

  private push(x: number, m: number, dm: number): void {
    if (this.n >= this.x.length) {
      const grow = (a: Float64Array): Float64Array => {
        const b = new Float64Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.x = grow(this.x);
      this.m = grow(this.m);
      this.dm = grow(this.dm);
    }
    this.x[this.n] = x;
    this.m[this.n] = m;
    this.dm[this.n] = dm;
    this.n++;
  }

  /**
   * Integrate from x = breaks[0] to x = breaks[last] with `steps` RK4 steps in every segment between
   * consecutive breaks (zero-length segments are skipped). Returns the mass at the end.
   */
  integrate(f: MassDerivative, phase: number, mStart: number, breaks: ArrayLike<number>, steps: number): number {
    this.n = 0;
    this.xDead = Number.POSITIVE_INFINITY;
    let m = mStart;
    let x = breaks[0];
    let d = f.dMassDx(phase, x, m);
    this.push(x, m, d);
    for (let s = 1; s < breaks.length; s++) {
      const x1 = breaks[s];
      if (!(x1 > x)) continue;
      const h = (x1 - x) / steps;
      for (let i = 0; i < steps; i++) {
        const k1 = d;
        const k2 = f.dMassDx(phase, x + 0.5 * h, m + 0.5 * h * k1);
        const k3 = f.dMassDx(phase, x + 0.5 * h, m + 0.5 * h * k2);
        const k4 = f.dMassDx(phase, x + h, m + h * k3);
        m += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
        x = i === steps - 1 ? x1 : x + h;
        const core = f.coreMassAt(phase, x);
        if (m <= core) {
          if (this.xDead === Number.POSITIVE_INFINITY) this.xDead = x;
          m = core;
        }
        d = f.dMassDx(phase, x, m);
        this.push(x, m, d);
      }
    }
    return m;
  }

  /** Mass at progress x (clamped to the integrated range). */
  at(x: number): number {
    const n = this.n;
    if (n === 0) return Number.NaN;
    const xs = this.x;
    if (x <= xs[0]) return this.m[0];
    if (x >= xs[n - 1]) return this.m[n - 1];
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (xs[mid] <= x) lo = mid;
      else hi = mid;
    }
    const h = xs[hi] - xs[lo];
    const s = (x - xs[lo]) / h;
    const s2 = s * s;
    const s3 = s2 * s;
    return (
      (2 * s3 - 3 * s2 + 1) * this.m[lo] +
      (s3 - 2 * s2 + s) * h * this.dm[lo] +
      (-2 * s3 + 3 * s2) * this.m[hi] +
      (s3 - s2) * h * this.dm[hi]
    );
  }
}

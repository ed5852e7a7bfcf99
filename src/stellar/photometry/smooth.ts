/**
 * Smooth joins between calibrations. Every place where two relations meet (dwarf and giant, adjacent
 * temperature pieces, a range edge and its extension) goes through these, so that no magnitude jumps as a
 * function of any input: the sampler would see a jump as a cliff in the posterior.
 */

/** Quintic smoothstep: 0 for t <= 0, 1 for t >= 1, and continuous with two continuous derivatives between. */
export function smoothstep(t: number): number {
  if (t <= 0) return 0;
  if (t >= 1) return 1;
  return t * t * t * (t * (6 * t - 15) + 10);
}

/** Weight rising smoothly from 0 at x <= a to 1 at x >= b (a < b). */
export function smoothWeight(x: number, a: number, b: number): number {
  return smoothstep((x - a) / (b - a));
}

/**
 * x held inside [lo, hi] with a continuous first derivative: unchanged more than `width` inside the
 * interval, equal to the bound more than `width` outside it, and a quadratic join between. Used where a
 * relation's [Fe/H] range ends: the relation is evaluated at the nearest metallicity it covers. Needs
 * hi - lo >= 2 width.
 */
export function softClamp(x: number, lo: number, hi: number, width: number): number {
  if (x > hi - width) {
    if (x >= hi + width) return hi;
    const d = x - (hi - width);
    return x - (d * d) / (4 * width);
  }
  if (x < lo + width) {
    if (x <= lo - width) return lo;
    const d = lo + width - x;
    return x + (d * d) / (4 * width);
  }
  return x;
}

export function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}

/** Evaluates sum c[i] x^i (Horner). */
export function poly(c: readonly number[], x: number): number {
  let s = 0;
  for (let i = c.length - 1; i >= 0; i--) s = s * x + c[i];
  return s;
}

/** Derivative of poly(c, x) with respect to x. */
export function polyDerivative(c: readonly number[], x: number): number {
  let s = 0;
  for (let i = c.length - 1; i >= 1; i--) s = s * x + i * c[i];
  return s;
}

/** 10^x. Math.exp(ln10 x) is several times faster than `10 ** x` in V8, with the same accuracy here. */
export function pow10(x: number): number {
  return Math.exp(Math.LN10 * x);
}

/**
 * Interpolating cubic spline with natural end conditions (second derivative zero at both ends), the
 * construction Fitzpatrick 1999 uses through his anchor points. Written here because it is twelve lines
 * over nine points, and the standalone stdlib packages offer no cubic spline.
 */

export interface CubicSpline {
  (x: number): number;
}

/** The natural cubic spline through (xs[i], ys[i]); xs strictly increasing. Extrapolates with the end cubics. */
export function naturalCubicSpline(xs: readonly number[], ys: readonly number[]): CubicSpline {
  const n = xs.length;
  const h = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) h[i] = xs[i + 1] - xs[i];
  // Second derivatives m: tridiagonal system with m[0] = m[n-1] = 0, solved by the Thomas algorithm.
  const m = new Float64Array(n);
  const c = new Float64Array(n);
  const d = new Float64Array(n);
  for (let i = 1; i < n - 1; i++) {
    const a = h[i - 1];
    const b = 2 * (h[i - 1] + h[i]);
    const cc = h[i];
    const r = 6 * ((ys[i + 1] - ys[i]) / h[i] - (ys[i] - ys[i - 1]) / h[i - 1]);
    const denom = b - a * c[i - 1];
    c[i] = cc / denom;
    d[i] = (r - a * d[i - 1]) / denom;
  }
  for (let i = n - 2; i >= 1; i--) m[i] = d[i] - c[i] * m[i + 1];
  return (x: number) => {
    let i = 0;
    while (i < n - 2 && x > xs[i + 1]) i++;
    const t = x - xs[i];
    const u = xs[i + 1] - x;
    const hi = h[i];
    return (m[i] * u * u * u + m[i + 1] * t * t * t) / (6 * hi) + (ys[i] / hi - (m[i] * hi) / 6) * u + (ys[i + 1] / hi - (m[i + 1] * hi) / 6) * t;
  };
}

/**
 * Chebyshev-Lobatto points and barycentric Lagrange weights (Berrut & Trefethen 2004, SIAM Review 46,
 * 501, eq. 5.2 with the Lobatto weights (-1)^j, halved at the ends). Interpolation through these points
 * is well conditioned and converges fast for smooth functions; a dozen lines, so written here.
 */

/** k Chebyshev-Lobatto points on [a, b], increasing, into out[0..k-1]. */
export function lobattoPoints(a: number, b: number, k: number, out: Float64Array): void {
  if (k === 1) {
    out[0] = 0.5 * (a + b);
    return;
  }
  for (let j = 0; j < k; j++) out[j] = 0.5 * (a + b) - 0.5 * (b - a) * Math.cos((Math.PI * j) / (k - 1));
  out[0] = a;
  out[k - 1] = b;
}

/** Normalised barycentric weights of the k Lobatto points xs[o..o+k-1] at x, into w[0..k-1]. */
export function barycentricWeights(x: number, xs: ArrayLike<number>, k: number, w: Float64Array, o = 0): void {
  if (k === 1) {
    w[0] = 1;
    return;
  }
  let sum = 0;
  for (let j = 0; j < k; j++) {
    const d = x - xs[o + j];
    if (d === 0) {
      for (let i = 0; i < k; i++) w[i] = i === j ? 1 : 0;
      return;
    }
    const wj = ((j & 1 ? -1 : 1) * (j === 0 || j === k - 1 ? 0.5 : 1)) / d;
    w[j] = wj;
    sum += wj;
  }
  for (let j = 0; j < k; j++) w[j] /= sum;
}

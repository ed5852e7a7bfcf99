/**
 * Where the walkers start after the optimiser: draws from a Gaussian (Laplace) approximation of the
 * posterior at the optimum, so that every ensemble starts with about the posterior's own spread and
 * correlations instead of in a tiny ball it must first grow out of (with posteriors as narrow as 0.001 dex
 * in age, a ball sized from the prior can be 100 times too small or too large).
 *
 *  1. For each parameter, the step h at which the log-posterior drops by 0.125-2 from the optimum is
 *     found by scaling h by 4 or 1/3; sigma = h / sqrt(2 drop) is the conditional width a quadratic would
 *     give. One-sided where the other side is outside the prior (a parameter at its bound).
 *  2. With those steps, the Hessian of -log p by central differences (4 corners per pair).
 *  3. If it is positive definite (Cholesky succeeds), draws are x + L^-T z, z ~ N(0, I), with H = L L^T;
 *     otherwise independent normals with the conditional widths.
 *
 * Hand-written because no maintained JavaScript library does a finite-difference Hessian over a batched,
 * worker-pool evaluator; the Cholesky factorisation is the textbook one (Golub & Van Loan, Alg. 4.2.1).
 */
import type { Evaluator, RandomSource } from '../sampler/index.js';

export interface LaplaceStart {
  /** Conditional 1-sigma widths per parameter. */
  sigma: Float64Array;
  /** Whether the full Hessian was used (else independent normals). */
  correlated: boolean;
  evaluations: number;
  draw: (rng: RandomSource, out: Float64Array) => void;
}

async function evaluateMany(evaluator: Evaluator, points: Float64Array[]): Promise<Float64Array> {
  const ndim = evaluator.ndim;
  const batch = new Float64Array(points.length * ndim);
  points.forEach((p, i) => batch.set(p, i * ndim));
  const lp = new Float64Array(points.length);
  await evaluator.evaluate(batch, points.length, lp, new Float64Array(points.length * evaluator.blobNames.length));
  return lp;
}

/** Lower-triangular L with A = L L^T, or undefined when A is not positive definite. */
export function cholesky(a: Float64Array[], n: number): Float64Array[] | undefined {
  const l = Array.from({ length: n }, () => new Float64Array(n));
  for (let j = 0; j < n; j++) {
    let d = a[j][j];
    for (let k = 0; k < j; k++) d -= l[j][k] * l[j][k];
    if (!(d > 0)) return undefined;
    l[j][j] = Math.sqrt(d);
    for (let i = j + 1; i < n; i++) {
      let s = a[i][j];
      for (let k = 0; k < j; k++) s -= l[i][k] * l[j][k];
      l[i][j] = s / l[j][j];
    }
  }
  return l;
}

export async function laplaceStart(evaluator: Evaluator, best: Float64Array, initialStep: Float64Array): Promise<LaplaceStart> {
  const n = best.length;
  let evaluations = 0;
  const f0 = (await evaluateMany(evaluator, [best]))[0];
  evaluations++;
  const h = Float64Array.from(initialStep);
  const sigma = new Float64Array(n).fill(Number.NaN);
  const shifted = (j: number, dj: number, k = -1, dk = 0): Float64Array => {
    const x = Float64Array.from(best);
    x[j] += dj;
    if (k >= 0) x[k] += dk;
    return x;
  };
  for (let round = 0; round < 16; round++) {
    const open = [...Array(n).keys()].filter((j) => Number.isNaN(sigma[j]));
    if (open.length === 0) break;
    const lp = await evaluateMany(evaluator, open.flatMap((j) => [shifted(j, h[j]), shifted(j, -h[j])]));
    evaluations += lp.length;
    open.forEach((j, i) => {
      const drops = [f0 - lp[2 * i], f0 - lp[2 * i + 1]].filter((d) => Number.isFinite(d));
      if (drops.length === 0) {
        h[j] /= 3;
        return;
      }
      const drop = Math.max(...drops);
      if (drop < 0.125) h[j] *= 4;
      else if (drop > 2) h[j] /= 3;
      else sigma[j] = h[j] / Math.sqrt(2 * drop);
    });
  }
  for (let j = 0; j < n; j++) if (Number.isNaN(sigma[j])) sigma[j] = h[j];
  // The Hessian of -log p with steps of one conditional sigma.
  const pts: Float64Array[] = [];
  for (let j = 0; j < n; j++) pts.push(shifted(j, sigma[j]), shifted(j, -sigma[j]));
  for (let j = 0; j < n; j++) for (let k = 0; k < j; k++) pts.push(shifted(j, sigma[j], k, sigma[k]), shifted(j, sigma[j], k, -sigma[k]), shifted(j, -sigma[j], k, sigma[k]), shifted(j, -sigma[j], k, -sigma[k]));
  const lp = await evaluateMany(evaluator, pts);
  evaluations += lp.length;
  let chol: Float64Array[] | undefined;
  if (lp.every((v) => Number.isFinite(v))) {
    const hess = Array.from({ length: n }, () => new Float64Array(n));
    for (let j = 0; j < n; j++) hess[j][j] = (2 * f0 - lp[2 * j] - lp[2 * j + 1]) / (sigma[j] * sigma[j]);
    let p = 2 * n;
    for (let j = 0; j < n; j++) {
      for (let k = 0; k < j; k++) {
        const v = -(lp[p] - lp[p + 1] - lp[p + 2] + lp[p + 3]) / (4 * sigma[j] * sigma[k]);
        hess[j][k] = v;
        hess[k][j] = v;
        p += 4;
      }
    }
    chol = cholesky(hess, n);
  }
  const z = new Float64Array(n);
  const draw = (rng: RandomSource, out: Float64Array): void => {
    for (let j = 0; j < n; j++) z[j] = rng.normal();
    if (chol) {
      // Solve L^T y = z (back substitution): y ~ N(0, H^-1).
      for (let j = n - 1; j >= 0; j--) {
        let s = z[j];
        for (let k = j + 1; k < n; k++) s -= chol[k][j] * out[k];
        out[j] = s / chol[j][j];
      }
      for (let j = 0; j < n; j++) out[j] += best[j];
    } else {
      for (let j = 0; j < n; j++) out[j] = best[j] + sigma[j] * z[j];
    }
  };
  return { sigma, correlated: chol !== undefined, evaluations, draw };
}

/**
 * Test targets with known answers, and a fixed ill-conditioned covariance.
 */
import { choleskyLower } from '../../../src/sampler/targets/gaussian.js';

/**
 * A 10-D covariance with condition number exactly 1e4, strongly correlated and badly scaled:
 * C = Q diag(λ) Q^T with λ log-spaced from 1 to 1e4 and Q a product of three fixed Householder
 * reflections (orthogonal), so the eigenvalues, hence the condition number, are known exactly and every
 * pair of parameters is correlated.
 */
export function illConditionedCov(ndim = 10): Float64Array {
  const lambda = Array.from({ length: ndim }, (_, i) => 10 ** ((4 * i) / (ndim - 1)));
  let q = new Float64Array(ndim * ndim);
  for (let i = 0; i < ndim; i++) q[i * ndim + i] = 1;
  const vectors = [
    Array.from({ length: ndim }, (_, i) => 1 + i),
    Array.from({ length: ndim }, (_, i) => Math.sin(1 + 2 * i)),
    Array.from({ length: ndim }, (_, i) => (i % 3) - 1 + 0.5),
  ];
  for (const v of vectors) {
    const norm2 = v.reduce((s, x) => s + x * x, 0);
    // q <- (I - 2 v v^T / |v|^2) q
    const next = new Float64Array(ndim * ndim);
    for (let i = 0; i < ndim; i++) {
      for (let j = 0; j < ndim; j++) {
        let s = q[i * ndim + j];
        for (let k = 0; k < ndim; k++) s -= (2 * v[i] * v[k] * q[k * ndim + j]) / norm2;
        next[i * ndim + j] = s;
      }
    }
    q = next;
  }
  const c = new Float64Array(ndim * ndim);
  for (let i = 0; i < ndim; i++) for (let j = 0; j < ndim; j++) for (let k = 0; k < ndim; k++) c[i * ndim + j] += q[i * ndim + k] * lambda[k] * q[j * ndim + k];
  // Symmetrise the rounding.
  for (let i = 0; i < ndim; i++) for (let j = 0; j < i; j++) c[i * ndim + j] = c[j * ndim + i] = 0.5 * (c[i * ndim + j] + c[j * ndim + i]);
  return c;
}

/** Draws from N(mean, cov) for starting walkers in the stationary distribution. */
export function gaussianPrior(mean: ArrayLike<number>, cov: Float64Array) {
  const n = mean.length;
  const l = choleskyLower(cov, n);
  const z = new Float64Array(n);
  return (rng: { normal(): number }, out: Float64Array): void => {
    for (let i = 0; i < n; i++) z[i] = rng.normal();
    for (let i = 0; i < n; i++) {
      let s = mean[i];
      for (let k = 0; k <= i; k++) s += l[i * n + k] * z[k];
      out[i] = s;
    }
  };
}

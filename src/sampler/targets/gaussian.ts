/**
 * A multivariate normal target N(mean, cov), for testing the sampler against exact answers. The log-density
 * is -1/2 |L^-1 (x - mean)|^2 (without the normalising constant), with L the Cholesky factor of cov, so
 * one evaluation costs ndim^2 / 2 multiply-adds and no inverse is formed.
 */
import type { LogDensity } from '../types.js';

export interface GaussianArgs {
  mean: ArrayLike<number>;
  /** Row-major ndim x ndim covariance; default the identity. */
  cov?: ArrayLike<number>;
  /** Report the squared Mahalanobis distance as a blob named `mahalanobis2`. */
  withBlobs?: boolean;
}

export function gaussianDensity(args: GaussianArgs): LogDensity {
  const ndim = args.mean.length;
  const mean = Float64Array.from(args.mean);
  const chol = choleskyLower(args.cov ? Float64Array.from(args.cov) : identity(ndim), ndim);
  const z = new Float64Array(ndim);
  return {
    ndim,
    blobNames: args.withBlobs ? ['mahalanobis2'] : [],
    evaluate(theta, blobsOut) {
      // Forward substitution L z = theta - mean.
      let q = 0;
      for (let i = 0; i < ndim; i++) {
        let s = theta[i] - mean[i];
        for (let k = 0; k < i; k++) s -= chol[i * ndim + k] * z[k];
        z[i] = s / chol[i * ndim + i];
        q += z[i] * z[i];
      }
      if (blobsOut.length > 0) blobsOut[0] = q;
      return -0.5 * q;
    },
  };
}

export function identity(n: number): Float64Array {
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) m[i * n + i] = 1;
  return m;
}

/** Lower Cholesky factor of a symmetric positive-definite row-major matrix (Cholesky–Banachiewicz). */
export function choleskyLower(a: Float64Array, n: number): Float64Array {
  const l = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
      if (i === j) {
        if (!(s > 0)) throw new RangeError(`the covariance matrix is not positive definite (pivot ${i} is ${s})`);
        l[i * n + i] = Math.sqrt(s);
      } else {
        l[i * n + j] = s / l[j * n + j];
      }
    }
  }
  return l;
}

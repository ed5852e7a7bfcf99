/**
 * An evaluator computes the log-density of a batch of points. The sampler hands it each half-ensemble's
 * proposals and waits; whether the work happens in this thread or in a worker pool changes nothing in
 * the results, since the density is a pure function of its input and all randomness stays in the sampler.
 */
import type { LogDensity } from './types.js';

export interface Evaluator {
  readonly ndim: number;
  readonly blobNames: readonly string[];
  /** Worker threads used; 0 for an in-thread evaluator. */
  readonly workers: number;
  /**
   * Evaluate n points (walker-major in `positions`): log-density of point i into logProbOut[i], its blobs
   * into blobsOut[i * nBlobs ...]. Values are passed through unchecked (the sampler checks for NaN).
   */
  evaluate(positions: Float64Array, n: number, logProbOut: Float64Array, blobsOut: Float64Array): Promise<void>;
  /** Release threads. Idempotent. */
  close(): Promise<void>;
}

/** Evaluate in the calling thread: for cheap densities, tests, and machines with one core. */
export function inThreadEvaluator(density: LogDensity): Evaluator {
  const { ndim } = density;
  const nBlobs = density.blobNames.length;
  const theta = new Float64Array(ndim);
  const blobs = new Float64Array(nBlobs);
  return {
    ndim,
    blobNames: density.blobNames,
    workers: 0,
    evaluate(positions, n, logProbOut, blobsOut) {
      evaluateBatch(density, positions, 0, n, logProbOut, 0, blobsOut, 0, theta, blobs);
      return Promise.resolve();
    },
    close: () => Promise.resolve(),
  };
}

/**
 * Evaluate points [start, start + n) of `positions` into the outputs at the given offsets. Copies each
 * point into `theta` so that a density may keep or modify its argument without touching the batch.
 */
export function evaluateBatch(
  density: LogDensity,
  positions: Float64Array,
  start: number,
  n: number,
  logProbOut: Float64Array,
  lpOffset: number,
  blobsOut: Float64Array,
  blobOffset: number,
  theta: Float64Array,
  blobs: Float64Array,
): void {
  const ndim = density.ndim;
  const nBlobs = blobs.length;
  for (let i = 0; i < n; i++) {
    const p = (start + i) * ndim;
    for (let d = 0; d < ndim; d++) theta[d] = positions[p + d];
    blobs.fill(Number.NaN);
    logProbOut[lpOffset + i] = density.evaluate(theta, blobs);
    for (let k = 0; k < nBlobs; k++) blobsOut[blobOffset + i * nBlobs + k] = blobs[k];
  }
}

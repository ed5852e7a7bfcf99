/**
 * The values that pass between the sampler and everything that consumes it (storage, progress,
 * checkpoints, diagnostics). They are plain data in typed arrays, so they can be copied, cloned to workers
 * or written to disk without conversion.
 */

/**
 * A log-density over R^ndim, as the sampler sees it: numbers in, a number out. It may also write extra
 * per-evaluation values ("blobs", e.g. the log prior and the log likelihood) into `blobsOut`.
 * It returns -Infinity outside the support, and must never return NaN (the sampler treats NaN as an error).
 */
export interface LogDensity {
  readonly ndim: number;
  /** Names of the blobs, in order; their count is `blobNames.length`. */
  readonly blobNames: readonly string[];
  evaluate(theta: Float64Array, blobsOut: Float64Array): number;
}

/** One ensemble after one step. Arrays are walker-major: value j of walker w is at [w * ndim + j]. */
export interface EnsembleState {
  /** Index of the ensemble in the run (0 .. K-1). */
  ensemble: number;
  /** Steps taken so far, counting every step (1 after the first step; 0 for the initial state). */
  step: number;
  nWalkers: number;
  ndim: number;
  positions: Float64Array;
  logProb: Float64Array;
  nBlobs: number;
  /** blobs[w * nBlobs + k]. */
  blobs: Float64Array;
  /** 1 where walker w's proposal in this step was accepted. */
  accepted: Uint8Array;
}

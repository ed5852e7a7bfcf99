/**
 * A two-component normal mixture in ndim dimensions: weight w at mean (-s/2, 0, ...), weight 1 - w at
 * (+s/2, 0, ...), each with unit covariance. With s = 8 the modes are 8 standard deviations apart, so a
 * walker crosses the gap only with a move that jumps (the DE move's γ = 1 steps). The blob `mode` is 0 or 1
 * for the nearer mode (x1 < 0 or not), for counting visits.
 */
import type { LogDensity } from '../types.js';

export interface BimodalArgs {
  ndim: number;
  separation?: number;
  /** Weight of the mode at negative x1. */
  weight?: number;
}

export function bimodalDensity(args: BimodalArgs): LogDensity {
  const { ndim } = args;
  const half = (args.separation ?? 8) / 2;
  const w = args.weight ?? 0.3;
  const logW0 = Math.log(w);
  const logW1 = Math.log(1 - w);
  return {
    ndim,
    blobNames: ['mode'],
    evaluate(theta, blobsOut) {
      let rest = 0;
      for (let d = 1; d < ndim; d++) rest += theta[d] * theta[d];
      const a = theta[0] + half;
      const b = theta[0] - half;
      const l0 = logW0 - 0.5 * (a * a + rest);
      const l1 = logW1 - 0.5 * (b * b + rest);
      const m = Math.max(l0, l1);
      blobsOut[0] = theta[0] < 0 ? 0 : 1;
      return m + Math.log(Math.exp(l0 - m) + Math.exp(l1 - m));
    },
  };
}

/**
 * A standard normal that returns NaN wherever x1 > `nanAbove`: for checking that the sampler stops with a
 * clear error instead of carrying a NaN along.
 */
import type { LogDensity } from '../types.js';

export function faultyDensity(args: { ndim: number; nanAbove: number }): LogDensity {
  return {
    ndim: args.ndim,
    blobNames: [],
    evaluate(theta) {
      if (theta[0] > args.nanAbove) return Number.NaN;
      let q = 0;
      for (let d = 0; d < args.ndim; d++) q += theta[d] * theta[d];
      return -0.5 * q;
    },
  };
}

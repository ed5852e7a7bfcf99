/**
 * A standard normal made deliberately expensive by a fixed amount of arithmetic per evaluation (not a
 * timed spin, so that a busy CPU slows it down as it would a real likelihood): for benchmarking the pool.
 */
import type { LogDensity } from '../types.js';

export function costlyDensity(args: { ndim: number; iterations: number }): LogDensity {
  const { ndim, iterations } = args;
  return {
    ndim,
    blobNames: [],
    evaluate(theta) {
      let q = 0;
      for (let d = 0; d < ndim; d++) q += theta[d] * theta[d];
      let acc = 0;
      for (let i = 0; i < iterations; i++) acc += Math.sqrt(i + q);
      // acc is never negative, but the compiler cannot know that, so the loop is not optimised away.
      return acc < 0 ? Number.NEGATIVE_INFINITY : -0.5 * q;
    },
  };
}

/**
 * Sample quantiles by linear interpolation between order statistics (Hyndman & Fan 1996, definition 7; the
 * default of R's `quantile` and numpy's `percentile`, which the reference implementations use).
 */
import type { Chains } from './chains.js';
import { pool } from './chains.js';
import { sortedCopy } from './radixSort.js';

/** All draws, sorted ascending (a new array). No NaN allowed. */
export function sortedDraws(chains: Chains): Float64Array {
  return sortedCopy(pool(chains));
}

/**
 * Quantile p of already-sorted values, written as R writes it: index h = 1 + (n - 1) p, and
 * (1 - f) x[lo] + f x[hi] when x[hi] differs from x[lo]; the exact form matters because posterior compares
 * draws against this value with `<=`.
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0 || !(p >= 0 && p <= 1)) return NaN;
  const index = 1 + (n - 1) * p;
  const lo = Math.floor(index);
  const hi = Math.ceil(index);
  const qs = sorted[lo - 1];
  const xhi = sorted[hi - 1];
  if (index > lo && xhi !== qs) {
    const h = index - lo;
    return (1 - h) * qs + h * xhi;
  }
  return qs;
}

/** Median of all draws. */
export function medianOf(chains: Chains): number {
  return quantileSorted(sortedDraws(chains), 0.5);
}

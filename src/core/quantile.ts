/**
 * The p-quantile of sorted values by linear interpolation between order statistics: definition 7 of
 * Hyndman & Fan 1996 (The American Statistician 50, 361), the default of numpy.percentile and R's quantile.
 * NaN for an empty array; p outside [0, 1] is clamped.
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * Math.min(1, Math.max(0, p));
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

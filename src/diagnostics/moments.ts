import { accurateSum } from '../core/sum.js';

/**
 * Mean and sample variance with compensated sums, so that results match reference implementations that
 * accumulate in extended precision (R) or pairwise (numpy) to the last few bits.
 */
export function mean(x: ArrayLike<number>): number {
  return accurateSum(x) / x.length;
}

/** Sum of squared deviations from `centre`, compensated. */
export function sumSquaredDeviations(x: ArrayLike<number>, centre: number): number {
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < x.length; i++) {
    const d = x[i] - centre;
    const sq = d * d;
    const t = sum + sq;
    if (sum >= sq) comp += sum - t + sq;
    else comp += sq - t + sum;
    sum = t;
  }
  return sum + comp;
}

/** Sample variance (denominator n - 1); NaN for fewer than two values. */
export function variance(x: ArrayLike<number>): number {
  const n = x.length;
  if (n < 2) return NaN;
  return sumSquaredDeviations(x, mean(x)) / (n - 1);
}

/** Sample variance of all draws of all chains together (denominator S - 1). */
export function pooledVariance(chains: readonly ArrayLike<number>[]): number {
  let total = 0;
  const sums: number[] = [];
  for (const c of chains) {
    sums.push(accurateSum(c));
    total += c.length;
  }
  if (total < 2) return NaN;
  const m = accurateSum(sums) / total;
  const ss: number[] = chains.map((c) => sumSquaredDeviations(c, m));
  return accurateSum(ss) / (total - 1);
}

/**
 * One sort of a parameter's draws, shared by every statistic that needs an order: the bulk and the folded
 * rank normalisation, the quantiles, and the MCSE of quantiles. Diagnosing ~10^7 draws is dominated by
 * sorting, and this replaces three sorts per parameter by one.
 *
 * The folded order needs no sort of its own: |x - m| is non-increasing in x below the median m and
 * non-decreasing above it, also in floating point (rounding is monotone and x - m = -(m - x) exactly), so
 * merging the two sides of the sorted draws outward from m gives the folded values in order.
 *
 * The results are identical, value for value, to rankNormalize(chains) and rankNormalize(fold(chains)),
 * which stay the definitions (tests check the equality).
 */
import type { Chains } from './chains.js';
import { quantileSorted } from './quantile.js';
import { argsortWithValues } from './radixSort.js';
import { likeChains, normalScoresFromSorted } from './rankNormalize.js';

export class SortedPool {
  /** All draws, ascending. */
  readonly sorted: Float64Array;
  /** sorted[k] is draw order[k] of the pooled draws (chain after chain). */
  readonly order: Uint32Array;
  readonly median: number;
  private readonly chains: Chains;

  /** `chains` must hold no NaN. `sortedOut`, when given, receives the sorted draws (see argsortWithValues). */
  constructor(chains: Chains, sortedOut?: Float64Array) {
    this.chains = chains;
    const { order, sorted } = argsortWithValues(chains, sortedOut);
    this.order = order;
    this.sorted = sorted;
    this.median = quantileSorted(sorted, 0.5);
  }

  /** rankNormalize(chains), without a sort. */
  rankNormalized(): Float64Array[] {
    const z = new Float64Array(this.sorted.length);
    normalScoresFromSorted(this.order, this.sorted, z);
    return likeChains(z, this.chains);
  }

  /** All draws of chains [firstChain, endChain) (equal lengths), ascending, without a sort. */
  sortedSubset(firstChain: number, endChain: number): Float64Array {
    const n = this.chains[0].length;
    const lo = firstChain * n;
    const hi = endChain * n;
    const out = new Float64Array(hi - lo);
    let j = 0;
    for (let k = 0; k < this.order.length; k++) {
      const i = this.order[k];
      if (i >= lo && i < hi) out[j++] = this.sorted[k];
    }
    return out;
  }

  /**
   * sortedSubset of each of `nGroups` equal consecutive groups of chains, in one pass over the order
   * (the chain count must divide into the groups).
   */
  sortedGroups(nGroups: number): Float64Array[] {
    const n = this.chains[0].length;
    const perGroup = (this.chains.length / nGroups) * n;
    if (!Number.isInteger(perGroup)) throw new RangeError(`${this.chains.length} chains do not split into ${nGroups} equal groups`);
    const out = Array.from({ length: nGroups }, () => new Float64Array(perGroup));
    const fill = new Uint32Array(nGroups);
    const { order, sorted } = this;
    for (let k = 0; k < order.length; k++) {
      const g = Math.floor(order[k] / perGroup);
      out[g][fill[g]++] = sorted[k];
    }
    return out;
  }

  /** rankNormalize(fold(chains)), without a sort. */
  foldedRankNormalized(): Float64Array[] {
    const { sorted, order, median } = this;
    const s = sorted.length;
    const foldedOrder = new Uint32Array(s);
    const foldedSorted = new Float64Array(s);
    let right = 0;
    while (right < s && sorted[right] < median) right++;
    let left = right - 1;
    for (let k = 0; k < s; k++) {
      const fl = left >= 0 ? Math.abs(sorted[left] - median) : Infinity;
      const fr = right < s ? Math.abs(sorted[right] - median) : Infinity;
      if (right >= s || (left >= 0 && fl <= fr)) {
        foldedOrder[k] = order[left--];
        foldedSorted[k] = fl;
      } else {
        foldedOrder[k] = order[right++];
        foldedSorted[k] = fr;
      }
    }
    const z = new Float64Array(s);
    normalScoresFromSorted(foldedOrder, foldedSorted, z);
    return likeChains(z, this.chains);
  }
}

/**
 * Potential scale reduction factor R-hat: the classic split form (GELMAN_RUBIN_1992, as rewritten in
 * VEHTARI_2021), and the rank-normalised, folded version that VEHTARI_2021 recommends and posterior's
 * `rhat` computes. See citations.ts.
 */
import type { Chains } from './chains.js';
import { drawsPerChain, hasNaN, isDegenerate } from './chains.js';
import { fold } from './fold.js';
import { mean, sumSquaredDeviations, variance } from './moments.js';
import { rankNormalize } from './rankNormalize.js';
import { splitChains } from './splitChains.js';

/**
 * R-hat of chains as given (no splitting, no normalisation): sqrt((B/W + n - 1) / n) with B/n the
 * variance of the chain means and W the mean within-chain variance. NaN when undefined (non-finite or
 * constant draws), as posterior returns NA.
 */
export function rhatBasic(chains: Chains): number {
  if (isDegenerate(chains)) return NaN;
  const n = drawsPerChain(chains);
  const means = new Float64Array(chains.length);
  const vars = new Float64Array(chains.length);
  chains.forEach((c, i) => {
    means[i] = mean(c);
    vars[i] = sumSquaredDeviations(c, means[i]) / (n - 1);
  });
  const between = n * variance(means);
  const within = mean(vars);
  return Math.sqrt((between / within + n - 1) / n);
}

/** Rank-normalised split-R-hat of the draws (the "bulk" R-hat). */
export function rhatBulk(chains: Chains): number {
  // Like posterior, only NaN makes the rank-normalised forms undefined: infinite draws still have ranks.
  if (hasNaN(chains)) return NaN;
  return rhatBasic(rankNormalize(splitChains(chains)));
}

/** Rank-normalised split-R-hat of the folded draws (sensitive to differences in scale and in the tails). */
export function rhatFolded(chains: Chains): number {
  if (hasNaN(chains)) return NaN;
  return rhatBasic(rankNormalize(splitChains(fold(chains))));
}

/** R-hat as VEHTARI_2021 recommends: the larger of the bulk and folded values; NaN if either is undefined. */
export function rhat(chains: Chains): number {
  const bulk = rhatBulk(chains);
  const folded = rhatFolded(chains);
  return Number.isNaN(bulk) || Number.isNaN(folded) ? NaN : Math.max(bulk, folded);
}

/**
 * Monte Carlo standard errors (VEHTARI_2021; computed as posterior's mcse_mean and mcse_quantile do).
 * See citations.ts.
 */
import betaQuantile from '@stdlib/stats-base-dists-beta-quantile';
import type { Chains } from './chains.js';
import { isDegenerate } from './chains.js';
import { essMean, essQuantile } from './ess.js';
import { pooledVariance } from './moments.js';
import { sortedDraws } from './quantile.js';

/** MCSE of the posterior mean: sd of all draws over sqrt(ESS of the mean). */
export function mcseMean(chains: Chains): number {
  return Math.sqrt(pooledVariance(chains)) / Math.sqrt(essMean(chains));
}

/**
 * The probabilities of the +-1 sd interval of a normal, as posterior writes them (rounded pnorm(-1),
 * pnorm(1)); kept identical so that the order statistics picked below match the reference.
 */
const ONE_SIGMA_LOWER = 0.1586553;
const ONE_SIGMA_UPPER = 0.8413447;

/**
 * MCSE of quantile p. The quantile's sampling distribution is taken from the Beta(ESS p + 1, ESS (1 - p) + 1)
 * distribution of the fraction of draws below it (VEHTARI_2021): its +-1 sd interval is mapped to order
 * statistics of all draws, and half their distance is the MCSE. `sorted` (all draws, ascending) may be
 * passed to save a sort when several quantiles are needed.
 */
export function mcseQuantile(chains: Chains, p: number, sorted?: Float64Array): number {
  if (isDegenerate(chains)) return NaN;
  const all = sorted ?? sortedDraws(chains);
  return mcseQuantileFromEss(all, p, essQuantile(chains, p, all));
}

/** The MCSE of quantile p from all draws sorted and the ESS of that quantile (see `mcseQuantile`). */
export function mcseQuantileFromEss(sorted: Float64Array, p: number, ess: number): number {
  if (Number.isNaN(ess)) return NaN;
  const a = ess * p + 1;
  const b = ess * (1 - p) + 1;
  const lower = betaQuantile(ONE_SIGMA_LOWER, a, b);
  const upper = betaQuantile(ONE_SIGMA_UPPER, a, b);
  const s = sorted.length;
  // 1-based order statistics as posterior indexes them: max(floor(a1 S), 1) and min(ceiling(a2 S), S).
  const th1 = sorted[Math.max(Math.floor(lower * s), 1) - 1];
  const th2 = sorted[Math.min(Math.ceil(upper * s), s) - 1];
  return (th2 - th1) / 2;
}

/** MCSE of several quantiles, sharing one sort of the draws. */
export function mcseQuantiles(chains: Chains, probs: readonly number[]): number[] {
  if (isDegenerate(chains)) return probs.map(() => NaN);
  const sorted = sortedDraws(chains);
  return probs.map((p) => mcseQuantile(chains, p, sorted));
}

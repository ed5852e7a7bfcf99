/**
 * Effective sample size of multiple chains (VEHTARI_2021): the autocorrelations of all chains combined
 * through the between- and within-chain variances, summed with Geyer's initial monotone sequence
 * (GEYER_1992), as posterior computes it. Bulk-ESS uses rank-normalised split chains; tail-ESS the
 * indicators of the 5% and 95% quantiles. See citations.ts.
 */
import type { Chains } from './chains.js';
import { drawsPerChain, hasNaN, isDegenerate } from './chains.js';
import { meanAutocovariance, withGrowingLags } from './autocovariance.js';
import { mean, variance } from './moments.js';
import { quantileSorted, sortedDraws } from './quantile.js';
import { rankNormalize } from './rankNormalize.js';
import { splitChains } from './splitChains.js';

/**
 * The ESS from the chains' mean autocovariance `acov` (lags 0..acov.length-1), or undefined when the
 * truncation rule needs a lag beyond those given. n draws per chain, m chains.
 */
function essFromAutocovariance(acov: Float64Array, n: number, m: number, chainMeansVariance: number): number | undefined {
  const maxLag = acov.length - 1;
  const meanVar = (acov[0] * n) / (n - 1);
  let varPlus = (meanVar * (n - 1)) / n;
  if (m > 1) varPlus += chainMeansVariance;
  const rhoAt = (lag: number): number => 1 - (meanVar - acov[lag]) / varPlus;
  if (maxLag < 1) return undefined;

  // Sum autocorrelations in pairs (even lag, odd lag) while a pair's sum stays positive (Geyer's initial
  // positive sequence), never beyond lag n - 4 (posterior's bound).
  const rho = new Float64Array(Math.min(n, maxLag + 1));
  let t = 0;
  let rhoEven = 1;
  let rhoOdd = rhoAt(1);
  rho[0] = rhoEven;
  rho[1] = rhoOdd;
  while (t < n - 5 && !Number.isNaN(rhoEven + rhoOdd) && rhoEven + rhoOdd > 0) {
    t += 2;
    if (t + 1 > maxLag) return undefined;
    rhoEven = rhoAt(t);
    rhoOdd = rhoAt(t + 1);
    if (rhoEven + rhoOdd >= 0) {
      rho[t] = rhoEven;
      rho[t + 1] = rhoOdd;
    }
  }
  const maxT = t;
  if (rhoEven > 0) rho[maxT] = rhoEven;

  // Geyer's initial monotone sequence: pair sums may not increase.
  for (let k = 2; k <= maxT - 2; k += 2) {
    if (rho[k] + rho[k + 1] > rho[k - 2] + rho[k - 1]) {
      rho[k] = (rho[k - 2] + rho[k - 1]) / 2;
      rho[k + 1] = rho[k];
    }
  }

  const total = m * n;
  // tau = -1 + 2 sum_{t < maxT} rho_t + rho_maxT; posterior's R indexing makes the sum just rho_0 when maxT = 0.
  let sum = 0;
  for (let k = 0; k < Math.max(maxT, 1); k++) sum += rho[k];
  let tau = -1 + 2 * sum + rho[maxT];
  // Cap the ESS at S log10(S), as posterior does, against unstable estimates for antithetic chains.
  tau = Math.max(tau, 1 / Math.log10(total));
  return total / tau;
}

/** essBasic without the checks, for callers that have made them (n >= 3, finite, not constant). */
function essUnchecked(chains: Chains): number {
  const n = chains[0].length;
  const m = chains.length;
  const chainMeansVariance = m > 1 ? variance(Float64Array.from(chains, (c) => mean(c))) : 0;
  return withGrowingLags(n, (maxLag) => essFromAutocovariance(meanAutocovariance(chains, maxLag), n, m, chainMeansVariance));
}

/**
 * ESS of the chains as given (no splitting, no normalisation); posterior's `.ess`. NaN for fewer than three
 * draws per chain, or for non-finite or constant draws.
 */
export function essBasic(chains: Chains): number {
  const n = drawsPerChain(chains);
  if (n < 3 || isDegenerate(chains)) return NaN;
  return essUnchecked(chains);
}

/** Bulk-ESS: ESS of the rank-normalised split chains. */
export function essBulk(chains: Chains): number {
  if (hasNaN(chains)) return NaN;
  return essBasic(rankNormalize(splitChains(chains)));
}

/** ESS of the mean: ESS of the split chains. */
export function essMean(chains: Chains): number {
  return essBasic(splitChains(chains));
}

/**
 * ESS of quantile p: ESS of the split chains of the indicator x <= q_p, q_p the quantile of all draws.
 * `sorted` (all draws sorted) may be passed to save a sort when several quantiles are needed.
 */
export function essQuantile(chains: Chains, p: number, sorted?: Float64Array): number {
  if (isDegenerate(chains)) return NaN;
  return essQuantileOfValid(chains, p, sorted ?? sortedDraws(chains));
}

/**
 * essQuantile for draws already known to be finite and not constant, with `sorted` given; `scratch` (one
 * value per draw) is used for the indicators when given, to spare allocations when many quantiles are done.
 */
export function essQuantileOfValid(chains: Chains, p: number, sorted: Float64Array, scratch?: Float64Array): number {
  // posterior moves p = 1 just inside, so that the indicator is not constant.
  const prob = p === 1 ? (sorted.length - 0.5) / sorted.length : p;
  const q = quantileSorted(sorted, prob);
  const n = drawsPerChain(chains);
  const buf = scratch && scratch.length >= n * chains.length ? scratch : new Float64Array(n * chains.length);
  let ones = 0;
  const indicators = chains.map((c, k) => {
    const out = buf.subarray(k * n, (k + 1) * n);
    // A local count: a captured variable updated in the loop would be a memory write per draw.
    let count = 0;
    for (let i = 0; i < n; i++) {
      const v = c[i] <= q ? 1 : 0;
      out[i] = v;
      count += v;
    }
    ones += count;
    return out;
  });
  const split = splitChains(indicators);
  if (n < 6 || ones === 0 || ones === n * chains.length) return essBasic(split);
  // The split drops the middle draw of odd-length chains; if that leaves the indicator constant, essBasic says NaN.
  return n % 2 === 1 ? essBasic(split) : essUnchecked(split);
}

/** Tail-ESS: the smaller of the ESS of the 5% and 95% quantiles. */
export function essTail(chains: Chains, sorted?: Float64Array): number {
  if (isDegenerate(chains)) return NaN;
  const all = sorted ?? sortedDraws(chains);
  const lower = essQuantileOfValid(chains, 0.05, all);
  const upper = essQuantileOfValid(chains, 0.95, all);
  return Number.isNaN(lower) || Number.isNaN(upper) ? NaN : Math.min(lower, upper);
}

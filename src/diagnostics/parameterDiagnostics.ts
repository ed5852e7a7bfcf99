/**
 * Every convergence statistic of one parameter, composed from the helpers (rankNormalize, fold via
 * SortedPool, splitChains, rhatBasic, essBasic, essQuantile, mcseQuantile, autocorrTime). Each walker of
 * each ensemble is one chain; see diagnose.ts for why.
 */
import type { AutocorrTime } from './autocorrTime.js';
import { autocorrTime } from './autocorrTime.js';
import type { Chains } from './chains.js';
import { drawsPerChain } from './chains.js';
import { essBasic, essMean, essQuantileOfValid } from './ess.js';
import { mcseQuantileFromEss } from './mcse.js';
import { mean, pooledVariance } from './moments.js';
import { quantileSorted } from './quantile.js';
import { rhatBasic } from './rhat.js';
import { SortedPool } from './sortedPool.js';
import { splitChains } from './splitChains.js';

/** The quantiles whose MCSE is reported (VEHTARI_2021 recommends reporting MCSE of the quantiles used). */
export const REPORTED_QUANTILES = [0.05, 0.16, 0.5, 0.84, 0.95] as const;

export interface QuantileDiagnostics {
  p: number;
  value: number;
  ess: number;
  mcse: number;
}

export interface ParameterDiagnostics {
  /** Draws per chain used (even: see `parameterDiagnostics`). */
  nDraws: number;
  nChains: number;
  /** Draws that are NaN or infinite; when > 0 every statistic below is NaN. */
  nonFinite: number;
  mean: number;
  sd: number;
  rhat: number;
  rhatBulk: number;
  rhatFolded: number;
  essBulk: number;
  essTail: number;
  essMean: number;
  mcseMean: number;
  quantiles: QuantileDiagnostics[];
  tau: AutocorrTime;
  /** Median and its MCSE within each group of chains (each ensemble), for the agreement test. */
  groups: { median: number; mcse: number }[];
  /** The sorted draws, for the summary's percentiles (not serialised). */
  sorted: Float64Array;
}

function countNonFinite(chains: Chains): number {
  let bad = 0;
  for (const c of chains) for (let i = 0; i < c.length; i++) if (!Number.isFinite(c[i])) bad++;
  return bad;
}

/**
 * Diagnostics of one parameter from its chains; `nGroups` consecutive equal groups of chains (the
 * ensembles) also get their own median and its MCSE. With an odd number of draws per chain the first draw of
 * each chain is left out, so that split chains keep every draw and one sort serves the bulk and folded
 * ranks and all quantiles (SortedPool); posterior would instead drop the middle draw, a difference of one
 * draw per chain. `sortedOut` (e.g. shared memory) receives the sorted draws, and `sorted` is a view of it.
 */
export function parameterDiagnostics(input: Chains, nGroups = 1, options: { sortedOut?: Float64Array } = {}): ParameterDiagnostics {
  const n0 = drawsPerChain(input);
  const chains = n0 % 2 === 1 ? input.map((c) => c.subarray(1)) : [...input];
  const n = drawsPerChain(chains);
  const nonFinite = countNonFinite(chains);
  const tau = autocorrTime(chains, { skipConstant: true });
  if (nonFinite > 0 || n < 4) {
    return {
      nDraws: n,
      nChains: chains.length,
      nonFinite,
      mean: NaN,
      sd: NaN,
      rhat: NaN,
      rhatBulk: NaN,
      rhatFolded: NaN,
      essBulk: NaN,
      essTail: NaN,
      essMean: NaN,
      mcseMean: NaN,
      quantiles: REPORTED_QUANTILES.map((p) => ({ p, value: NaN, ess: NaN, mcse: NaN })),
      tau,
      groups: Array.from({ length: nGroups }, () => ({ median: NaN, mcse: NaN })),
      sorted: new Float64Array(0),
    };
  }
  const pool = new SortedPool(chains, options.sortedOut);
  // One set of normalised draws alive at a time (each is as large as the draws).
  const zBulk = splitChains(pool.rankNormalized());
  const rhatBulk = rhatBasic(zBulk);
  const essBulk = essBasic(zBulk);
  const rhatFolded = rhatBasic(splitChains(pool.foldedRankNormalized()));
  const scratch = new Float64Array(n * chains.length);
  const quantiles = REPORTED_QUANTILES.map((p) => {
    const ess = essQuantileOfValid(chains, p, pool.sorted, scratch);
    return { p, value: quantileSorted(pool.sorted, p), ess, mcse: mcseQuantileFromEss(pool.sorted, p, ess) };
  });
  const ess05 = quantiles[0].ess;
  const ess95 = quantiles[quantiles.length - 1].ess;
  const essM = essMean(chains);
  const variance = pooledVariance(chains);
  const perGroup = chains.length / nGroups;
  if (!Number.isInteger(perGroup)) throw new RangeError(`${chains.length} chains do not split into ${nGroups} equal groups`);
  const groupSorted = pool.sortedGroups(nGroups);
  const groups = Array.from({ length: nGroups }, (_, g) => {
    const sub = chains.slice(g * perGroup, (g + 1) * perGroup);
    const sorted = groupSorted[g];
    return { median: quantileSorted(sorted, 0.5), mcse: sorted[0] === sorted[sorted.length - 1] ? NaN : mcseQuantileFromEss(sorted, 0.5, essQuantileOfValid(sub, 0.5, sorted, scratch)) };
  });
  return {
    nDraws: n,
    nChains: chains.length,
    nonFinite,
    mean: mean(pool.sorted),
    sd: Math.sqrt(variance),
    rhat: Number.isNaN(rhatBulk) || Number.isNaN(rhatFolded) ? NaN : Math.max(rhatBulk, rhatFolded),
    rhatBulk,
    rhatFolded,
    essBulk,
    essTail: Number.isNaN(ess05) || Number.isNaN(ess95) ? NaN : Math.min(ess05, ess95),
    essMean: essM,
    mcseMean: Math.sqrt(variance) / Math.sqrt(essM),
    quantiles,
    tau,
    groups,
    sorted: pool.sorted,
  };
}

/**
 * Integrated autocorrelation time tau, as emcee's `emcee.autocorr.integrated_time` estimates it (EMCEE):
 * each walker's normalised autocorrelation function, averaged over walkers; the running estimate
 * tau(M) = 2 sum_{t <= M} rho_t - 1; and Sokal's automatic window, the smallest M with M >= c tau(M)
 * (SOKAL_1997, c = 5). See citations.ts.
 */
import type { Chains } from './chains.js';
import { drawsPerChain } from './chains.js';
import { meanAutocorrelation, withGrowingLags } from './autocovariance.js';
import { THRESHOLDS } from './citations.js';

export interface AutocorrTime {
  /** The estimate of tau, in steps. */
  tau: number;
  /** The window M at which it was read. */
  window: number;
  /** Draws per chain. */
  n: number;
  /** Whether the chains are longer than 50 tau (emcee's `tol`); below that, do not trust tau. */
  reliable: boolean;
  /** Constant chains left out (with `skipConstant`); emcee has no such option and returns NaN. */
  skippedChains: number;
}

export interface AutocorrTimeOptions {
  /** Sokal's window constant; 5 as in emcee. */
  c?: number;
  /** Minimum chain length in units of tau for a reliable estimate; 50 as in emcee. */
  tol?: number;
  /**
   * Leave out chains that never change (a stuck walker), instead of returning NaN as emcee does; the
   * diagnosis reports stuck walkers on their own and still wants tau from the others.
   */
  skipConstant?: boolean;
}

/**
 * tau from the walkers' averaged autocorrelation (lags 0..acf.length-1); undefined when the window may lie
 * beyond the lags given.
 */
function windowedTau(acf: Float64Array, n: number, c: number): { tau: number; window: number } | undefined {
  let cumulative = 0;
  for (let m = 0; m < acf.length; m++) {
    cumulative += acf[m];
    const tau = 2 * cumulative - 1;
    // emcee's auto_window: the first lag that is not below c tau(lag). NaN compares false, so a NaN tau
    // ends the search at once with tau NaN, as in emcee.
    if (!(m < c * tau)) return { tau, window: m };
  }
  if (acf.length < n) return undefined;
  // Unreachable for n >= 2: mean-centred lag sums add up to zero over all lags, so tau(n - 1) = 0 and the
  // last lag always qualifies. For n = 1 emcee's argmin returns lag 0, and so do we.
  return { tau: 2 * acf[0] - 1, window: 0 };
}

/** tau of one quantity, from its chains (one per walker). NaN for constant chains, as in emcee. */
export function autocorrTime(chains: Chains, options: AutocorrTimeOptions = {}): AutocorrTime {
  const c = options.c ?? 5;
  const tol = options.tol ?? THRESHOLDS.tauMultiple;
  const n = drawsPerChain(chains);
  const used = options.skipConstant ? chains.filter((ch) => ch.some((v) => v !== ch[0])) : chains;
  if (used.length === 0) return { tau: NaN, window: 0, n, reliable: false, skippedChains: chains.length };
  const { tau, window } = withGrowingLags(n, (maxLag) => windowedTau(meanAutocorrelation(used, maxLag), n, c));
  return { tau, window, n, reliable: tol * tau <= n, skippedChains: chains.length - used.length };
}

export interface AutocorrTimePoint {
  /** Draws per chain used (the first n). */
  n: number;
  tau: number;
}

/**
 * tau estimated on growing prefixes of the chains, for plots of tau against chain length (a converged
 * estimate flattens out, and stays below n / 50). `points` lengths are spaced evenly in log n from
 * `minDraws` to the full length.
 */
export function autocorrTimeSeries(chains: Chains, options: AutocorrTimeOptions & { points?: number; minDraws?: number } = {}): AutocorrTimePoint[] {
  const n = drawsPerChain(chains);
  const points = options.points ?? 10;
  const minDraws = Math.min(n, Math.max(options.minDraws ?? 100, 3));
  const lengths = new Set<number>();
  for (let i = 0; i < points; i++) {
    const f = points === 1 ? 1 : i / (points - 1);
    lengths.add(Math.round(Math.exp(Math.log(minDraws) + f * (Math.log(n) - Math.log(minDraws)))));
  }
  return [...lengths]
    .sort((a, b) => a - b)
    .map((len) => ({ n: len, tau: autocorrTime(chains.map((ch) => ch.subarray(0, len)), options).tau }));
}

/**
 * The posterior summary of a run: per parameter the median, the 16/84 and 2.5/97.5 percentiles, mean, sd,
 * the MAP sample (the draw with the highest log posterior), ESS and R-hat, with the decimals the Monte
 * Carlo error allows (significantDigits.ts).
 */
import type { ParameterInfo } from '../core/parameters.js';
import type { Chains, Diagnosis } from '../diagnostics/index.js';
import { quantileSorted } from '../diagnostics/index.js';
import { decimalsFor } from './significantDigits.js';

export interface ParameterSummary {
  info: ParameterInfo;
  median: number;
  p16: number;
  p84: number;
  p2_5: number;
  p97_5: number;
  mean: number;
  sd: number;
  /** Parameter value of the draw with the highest log posterior among the kept draws. */
  map: number;
  essBulk: number;
  essTail: number;
  rhat: number;
  mcseMedian: number;
  mcseMean: number;
  /** Decimals for the human-readable forms (text, LaTeX). */
  decimals: number;
}

export interface Summary {
  parameters: ParameterSummary[];
  /** Log posterior of the MAP draw, and where it is. */
  map: { logPosterior: number; ensemble: number; walker: number; draw: number };
  nDraws: number;
  /** Stellar model and calibration that produced the posterior, as the run's manifest states them. */
  provenance: string;
}

/** Index of the largest finite value over all chains (chain, draw). */
function argmax(chains: Chains): { chain: number; draw: number; value: number } {
  let best = { chain: -1, draw: -1, value: -Infinity };
  chains.forEach((c, ci) => {
    for (let i = 0; i < c.length; i++) if (c[i] > best.value) best = { chain: ci, draw: i, value: c[i] };
  });
  return best;
}

/**
 * `draws` and `logPosterior` are the same kept draws the diagnosis was computed from (ensemble-major
 * chains); `nWalkers` splits chain indices into ensemble and walker.
 */
export function summarize(diagnosis: Diagnosis, draws: readonly Chains[], logPosterior: Chains, provenance: string): Summary {
  const best = argmax(logPosterior);
  const parameters = diagnosis.parameters.map((p, i): ParameterSummary => {
    const s = p.sorted;
    const q = (prob: number): number => (s.length ? quantileSorted(s, prob) : NaN);
    const median = q(0.5);
    const p16 = q(0.16);
    const p84 = q(0.84);
    const mcseMedian = p.quantiles.find((x) => x.p === 0.5)?.mcse ?? NaN;
    const mcseBars = Math.max(mcseMedian, ...p.quantiles.filter((x) => x.p === 0.16 || x.p === 0.84).map((x) => x.mcse));
    return {
      info: p.info,
      median,
      p16,
      p84,
      p2_5: q(0.025),
      p97_5: q(0.975),
      mean: p.mean,
      sd: p.sd,
      map: best.chain >= 0 ? draws[i][best.chain][best.draw] : NaN,
      essBulk: p.essBulk,
      essTail: p.essTail,
      rhat: p.rhat,
      mcseMedian,
      mcseMean: p.mcseMean,
      decimals: decimalsFor(mcseBars, median - p16, p84 - median),
    };
  });
  // The diagnosis drops the first draw of each chain when the count is odd; the MAP search sees all kept draws.
  return {
    parameters,
    map: {
      logPosterior: best.value,
      ensemble: Math.floor(best.chain / diagnosis.nWalkers),
      walker: best.chain % diagnosis.nWalkers,
      draw: best.draw,
    },
    nDraws: diagnosis.parameters[0]?.nDraws ?? 0,
    provenance,
  };
}

/**
 * Whether a run's recent history already meets the verdict's thresholds, for the sampler's automatic stop
 * (injected like tauOfRows, with the signature of `ConvergenceCheck` in src/sampler/stopRule.ts). Without
 * it the automatic stop ends at 50 tau, where split R-hat over per-walker chains is still about
 * 1 + 1 / (2 x 25): each half-chain holds some 25 independent draws. Such a run then gets the verdict "run
 * longer", which is not what an automatic stop should hand over.
 */
import { chainsFromBuffer } from './chains.js';
import { THRESHOLDS } from './citations.js';
import { essBulk, essTail } from './ess.js';
import { rhat } from './rhat.js';

/**
 * true when, after leaving out the first `discardRows` rows, every parameter has R-hat below
 * THRESHOLDS.rhat and bulk and tail ESS above THRESHOLDS.ess, with every walker of every ensemble as one
 * chain, as diagnose.ts counts them. `histories` holds one array per ensemble, laid out step-major, then
 * walker, then parameter, with `nRows` rows each.
 */
export function meetsThresholdsOfRows(histories: readonly Float64Array[], nRows: number, nWalkers: number, ndim: number, discardRows: number): boolean {
  const kept = nRows - Math.max(0, Math.ceil(discardRows));
  if (kept < 8) return false;
  const nChains = histories.length * nWalkers;
  const buf = new Float64Array(nChains * kept);
  for (let j = 0; j < ndim; j++) {
    histories.forEach((h, e) => {
      for (let w = 0; w < nWalkers; w++) {
        const o = (e * nWalkers + w) * kept;
        for (let t = 0; t < kept; t++) buf[o + t] = h[((nRows - kept + t) * nWalkers + w) * ndim + j];
      }
    });
    const chains = chainsFromBuffer(buf, kept, nChains);
    if (!(rhat(chains) < THRESHOLDS.rhat)) return false;
    if (!(essBulk(chains) > THRESHOLDS.ess) || !(essTail(chains) > THRESHOLDS.ess)) return false;
  }
  return true;
}

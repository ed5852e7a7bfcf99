/**
 * tau for the sampler's automatic stop rule. The sampler injects its estimator (it may not import the
 * diagnostics), with the signature of `TauEstimator` in src/sampler/stopRule.ts; this is the one to inject.
 */
import { autocorrTime } from './autocorrTime.js';
import { chainsFromBuffer } from './chains.js';

/** Rows below which tau is not estimated (NaN): too short for even the first lags. */
const MIN_ROWS = 8;

/**
 * tau of each parameter, in rows, of one ensemble's chain laid out step-major, then walker, then
 * parameter (value j of walker w at row t at [(t nWalkers + w) ndim + j]): emcee's estimator over the
 * walkers (autocorrTime), with walkers that never moved left out. NaN when the chain is shorter than
 * MIN_ROWS rows or every walker is constant.
 */
export function tauOfRows(chain: Float64Array, nRows: number, nWalkers: number, ndim: number): Float64Array {
  const out = new Float64Array(ndim).fill(NaN);
  if (nRows < MIN_ROWS) return out;
  const buf = new Float64Array(nWalkers * nRows);
  for (let j = 0; j < ndim; j++) {
    for (let t = 0; t < nRows; t++) {
      for (let w = 0; w < nWalkers; w++) buf[w * nRows + t] = chain[(t * nWalkers + w) * ndim + j];
    }
    out[j] = autocorrTime(chainsFromBuffer(buf, nRows, nWalkers), { skipConstant: true }).tau;
  }
  return out;
}

/**
 * The automatic stop's logic with an injected convergence check (src/sampler/stopRule.ts): the tau
 * criteria (50 tau, tau steady; the practice documented with emcee) are necessary, and when a check is
 * injected it must pass too, on the history after a burn-in of 2 tau_max. The estimator and checks here
 * are stand-ins that make each case explicit; the real ones are tested in tests/diagnostics.
 */
import { describe, expect, it } from 'vitest';
import { AutoStop, type ConvergenceCheck, type EnsembleState } from '../../src/sampler/index.js';

const nWalkers = 4;
const ndim = 2;

function state(ensemble: number, step: number): EnsembleState {
  return {
    ensemble,
    step,
    nWalkers,
    ndim,
    positions: new Float64Array(nWalkers * ndim).fill(step),
    logProb: new Float64Array(nWalkers),
    nBlobs: 0,
    blobs: new Float64Array(0),
    accepted: new Uint8Array(nWalkers),
  };
}

/** Run the rule to `steps` with a constant tau of 2 steps; returns the check results at the check steps. */
function run(steps: number, convergence?: ConvergenceCheck): boolean[] {
  const rule = new AutoStop({ kind: 'auto', maxSteps: 10000, estimator: () => new Float64Array(ndim).fill(2), checkEvery: 50, convergence }, 2, nWalkers, ndim);
  const out: boolean[] = [];
  for (let step = 1; step <= steps; step++) {
    rule.record([state(0, step), state(1, step)]);
    if (rule.due(step)) out.push(rule.check(step).converged);
  }
  return out;
}

describe('automatic stop with a convergence check', () => {
  it('without a check: stops at the first check past 50 tau with tau unchanged (step 150)', () => {
    expect(run(200)).toEqual([false, false, true, true]);
  });

  it('a check that fails keeps the run going; one that passes lets it stop', () => {
    expect(run(200, () => false)).toEqual([false, false, false, false]);
    expect(run(200, () => true)).toEqual([false, false, true, true]);
  });

  it('the check is asked only once the tau criteria hold, with both ensembles, every row so far and a burn-in of 2 tau_max', () => {
    const calls: { nHist: number; nRows: number; discard: number; first: number }[] = [];
    run(150, (h, nRows, nW, nd, discard) => {
      calls.push({ nHist: h.length, nRows, discard, first: h[1][0] });
      expect(nW).toBe(nWalkers);
      expect(nd).toBe(ndim);
      return true;
    });
    expect(calls).toEqual([{ nHist: 2, nRows: 150, discard: 4, first: 1 }]);
  });
});

/**
 * The automatic stop's convergence check (src/diagnostics/thresholdsOfRows.ts) on AR(1) walkers, whose
 * effective sample size is known in closed form: N (1 - rho) / (1 + rho) draws per chain for
 * autocorrelation rho (common practice; e.g. Sokal 1997). With rho = 0.8 that is N / 9.
 */
import { describe, expect, it } from 'vitest';
import { chainsFromBuffer, essBulk, essTail, meetsThresholdsOfRows, rhat, THRESHOLDS } from '../../src/diagnostics/index.js';
import type { ConvergenceCheck } from '../../src/sampler/index.js';
import { ar1States } from '../../scripts/ar1Run.js';

const parameters = ['a', 'b'].map((name) => ({ name, label: name, unit: '' }));

/** Two ensembles of AR(1) walkers in the stop rule's layout; the second ensemble's mean of `a` moved by `shift`. */
function histories(nWalkers: number, nRows: number, shift: number, seed: number): Float64Array[] {
  return [0, 1].map((e) => {
    const rows = new Float64Array(nRows * nWalkers * 2);
    for (const s of ar1States({ parameters, mean: [e === 1 ? shift : 0, 5], sd: [1, 2], rho: 0.8, nWalkers, nSteps: nRows, seed: seed + e })) {
      rows.set(s.positions, (s.step - 1) * nWalkers * 2);
    }
    return rows;
  });
}

/** Parameter j's per-walker chains (every walker of every ensemble one chain) after `discard` rows. */
function walkerChains(h: Float64Array[], nWalkers: number, nRows: number, discard: number, j: number): Float64Array[] {
  const kept = nRows - discard;
  const buf = new Float64Array(h.length * nWalkers * kept);
  h.forEach((rows, e) => {
    for (let w = 0; w < nWalkers; w++) for (let t = 0; t < kept; t++) buf[(e * nWalkers + w) * kept + t] = rows[((discard + t) * nWalkers + w) * 2 + j];
  });
  return chainsFromBuffer(buf, kept, h.length * nWalkers);
}

/** The verdict's tests computed directly on per-walker chains after `discard` rows. */
function direct(h: Float64Array[], nWalkers: number, nRows: number, discard: number): boolean {
  for (let j = 0; j < 2; j++) {
    const c = walkerChains(h, nWalkers, nRows, discard, j);
    if (!(rhat(c) < THRESHOLDS.rhat && essBulk(c) > THRESHOLDS.ess && essTail(c) > THRESHOLDS.ess)) return false;
  }
  return true;
}

describe('meetsThresholdsOfRows', () => {
  const check: ConvergenceCheck = meetsThresholdsOfRows; // the stop rule's injected signature

  it('long AR(1) chains pass: 2 x 12 walkers x 3,000 rows, ESS about 24 x 3,000 / 9 = 8,000', () => {
    const h = histories(12, 3000, 0, 11);
    expect(direct(h, 12, 3000, 20)).toBe(true);
    expect(check(h, 3000, 12, 2, 20)).toBe(true);
  });

  it('short AR(1) chains fail on ESS: 2 x 6 walkers x 200 rows, ESS about 12 x 200 / 9 = 270 < 400', () => {
    const h = histories(6, 200, 0, 12);
    expect(direct(h, 6, 200, 0)).toBe(false);
    expect(check(h, 200, 6, 2, 0)).toBe(false);
  });

  it('ensembles that disagree fail on R-hat: one ensemble shifted by 0.5 sd', () => {
    const h = histories(12, 3000, 0.5, 13);
    expect(rhat(walkerChains(h, 12, 3000, 0, 0))).toBeGreaterThan(THRESHOLDS.rhat);
    expect(essBulk(walkerChains(h, 12, 3000, 0, 0))).toBeGreaterThan(THRESHOLDS.ess);
    expect(check(h, 3000, 12, 2, 0)).toBe(false);
  });

  it('reads the burn-in: the same answer as the direct computation after 500 rows', () => {
    const h = histories(8, 1200, 0, 14);
    expect(check(h, 1200, 8, 2, 500)).toBe(direct(h, 8, 1200, 500));
  });
});

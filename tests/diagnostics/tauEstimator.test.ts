import { expect, it } from 'vitest';
import { autocorrTime, chainsFromBuffer, tauOfRows } from '../../src/diagnostics/index.js';
import type { TauEstimator } from '../../src/sampler/index.js';
import { ar1States } from '../../scripts/ar1Run.js';

it("tauOfRows reads the stop rule's layout (rows x walkers x parameters) and gives autocorrTime's tau", () => {
  const estimator: TauEstimator = tauOfRows; // the sampler's injected-estimator signature
  const parameters = ['a', 'b'].map((name) => ({ name, label: name, unit: '' }));
  const nWalkers = 6;
  const nRows = 500;
  const rows = new Float64Array(nRows * nWalkers * 2);
  const byWalker = [new Float64Array(nRows * nWalkers), new Float64Array(nRows * nWalkers)];
  for (const s of ar1States({ parameters, mean: [0, 5], sd: [1, 2], rho: 0.8, nWalkers, nSteps: nRows, seed: 4 })) {
    rows.set(s.positions, (s.step - 1) * nWalkers * 2);
    for (let w = 0; w < nWalkers; w++) for (let j = 0; j < 2; j++) byWalker[j][w * nRows + s.step - 1] = s.positions[w * 2 + j];
  }
  const tau = estimator(rows, nRows, nWalkers, 2);
  for (let j = 0; j < 2; j++) expect(tau[j]).toBe(autocorrTime(chainsFromBuffer(byWalker[j], nRows, nWalkers)).tau);
  expect([...estimator(rows.subarray(0, 4 * nWalkers * 2), 4, nWalkers, 2)].every(Number.isNaN)).toBe(true);
});

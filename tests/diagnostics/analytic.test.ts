/**
 * Checks against analytic values and against the documented special cases of the references.
 */
import { describe, expect, it } from 'vitest';
import * as d from '../../src/diagnostics/index.js';
import { ar1States } from '../../scripts/ar1Run.js';

/** One parameter's chains (one per walker) of an AR(1) process with correlation rho. */
function ar1Chains(rho: number, nWalkers: number, nSteps: number, seed: number): Float64Array[] {
  const chains = Array.from({ length: nWalkers }, () => new Float64Array(nSteps));
  const parameters = [{ name: 'x', label: 'x', unit: '' }];
  for (const s of ar1States({ parameters, mean: [0], sd: [1], rho, nWalkers, nSteps, seed })) {
    for (let w = 0; w < nWalkers; w++) chains[w][s.step - 1] = s.positions[w];
  }
  return chains;
}

describe('tau of AR(1) processes against (1 + rho) / (1 - rho)', () => {
  // The integrated autocorrelation time of x_t = rho x_{t-1} + e_t is sum_t rho^|t| = (1 + rho) / (1 - rho).
  // Tolerance, for W walkers of N steps and the window M the estimator chose (SOKAL_1997):
  //   statistical: sd(tau) ~ tau sqrt(2 (2M + 1) / (W N)) (Sokal's variance of the windowed estimate, with
  //     the W independent walkers averaged); we allow 4 sd, so a correct estimator fails ~1 time in 16000;
  //   bias: the window drops 2 rho^(M+1) / (1 - rho); the 1/N-normalised estimate with the sample mean
  //     removed loses about (2M + 1) tau / N + 2 rho / ((1 - rho)^2 N).
  for (const rho of [0.3, 0.7, 0.9, 0.97]) {
    it(`rho = ${rho}`, () => {
      const W = 32;
      const N = 50_000;
      const est = d.autocorrTime(ar1Chains(rho, W, N, 1000 + Math.round(rho * 100)));
      const exact = (1 + rho) / (1 - rho);
      const M = est.window;
      const sd = exact * Math.sqrt((2 * (2 * M + 1)) / (W * N));
      const bias = (2 * rho ** (M + 1)) / (1 - rho) + ((2 * M + 1) * exact) / N + (2 * rho) / ((1 - rho) ** 2 * N);
      const tolerance = 4 * sd + bias;
      expect(Math.abs(est.tau - exact), `tau ${est.tau} vs ${exact}, window ${M}, tolerance ${tolerance}`).toBeLessThan(tolerance);
      expect(est.reliable).toBe(true);
    });
  }
});

describe('special cases, as posterior documents them (NA becomes NaN)', () => {
  const normal = ar1Chains(0.5, 4, 200, 5);

  it('constant draws give NaN R-hat and ESS (posterior: "if all draws ... are the same, NA")', () => {
    const constant = [new Float64Array(100).fill(2), new Float64Array(100).fill(2)];
    expect(d.rhat(constant)).toBeNaN();
    expect(d.essBulk(constant)).toBeNaN();
    expect(d.essTail(constant)).toBeNaN();
    expect(d.mcseQuantile(constant, 0.5)).toBeNaN();
  });

  it('any NaN draw gives NaN ("if any of the draws is non-finite ... NA")', () => {
    const bad = normal.map((c) => c.slice());
    bad[1][17] = NaN;
    expect(d.rhat(bad)).toBeNaN();
    expect(d.essBulk(bad)).toBeNaN();
    expect(d.essTail(bad)).toBeNaN();
    expect(d.essMean(bad)).toBeNaN();
  });

  it('fewer than 3 draws per chain give NaN ESS (posterior .ess: "niterations < 3")', () => {
    expect(d.essBasic([Float64Array.of(1, 2), Float64Array.of(3, 5)])).toBeNaN();
  });

  it('a chain that has not mixed is caught by R-hat, a chain with another scale by the folded R-hat', () => {
    const shifted = normal.map((c, i) => (i === 0 ? c.map((v) => v + 3) : c));
    expect(d.rhat(shifted)).toBeGreaterThan(1.1);
    const scaled = normal.map((c, i) => (i === 0 ? c.map((v) => v * 4) : c));
    expect(d.rhatBulk(scaled)).toBeLessThan(d.rhatFolded(scaled));
    expect(d.rhat(scaled)).toBeGreaterThan(1.05);
  });

  it('ranks average ties as R does', () => {
    expect([...d.averageRanks(Float64Array.of(3, 1, 3, 2, -0, 0))]).toEqual([5.5, 3, 5.5, 4, 1.5, 1.5]);
  });

  it('the radix sort agrees with the engine sort, also for negative, tied, infinite and subnormal values', () => {
    const x = Float64Array.of(0.5, -0.5, Infinity, -Infinity, 5e-324, -5e-324, 1e300, -1e300, 0.5, -0, 0, 3);
    expect([...d.sortedCopy(x)]).toEqual([...x.slice().sort()].map((v) => (Object.is(v, -0) ? 0 : v)));
    const order = d.argsort(x);
    for (let k = 1; k < x.length; k++) expect(x[order[k - 1]] <= x[order[k]]).toBe(true);
  });
});

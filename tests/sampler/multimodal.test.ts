/**
 * Targets that are not Gaussian: a bimodal mixture, whose modes only a jumping move connects, and the
 * Rosenbrock banana of Goodman & Weare (2010), whose marginal of x1 is exactly N(1, 10).
 */
import { describe, expect, it } from 'vitest';
import { deMove } from '../../src/sampler/moves/deMove.js';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import { bimodalDensity } from '../../src/sampler/targets/bimodal.js';
import { rosenbrockDensity } from '../../src/sampler/targets/rosenbrock.js';
import { runTarget, walkerMeanSeries } from './helpers/run.js';
import { meanAndSe } from './helpers/checks.js';
import { meanWithMcse, normalCdf } from './helpers/stats.js';

/** Seconds-long on an idle machine; the limit allows for a CPU shared with other jobs. */
const HEAVY_MS = 300_000;

/** χ² with 1 degree of freedom exceeds 10.83 with probability 0.001 (standard tables, e.g. Abramowitz & Stegun 1964, table 26.8). */
const CHI2_1DOF_999 = 10.83;

const uniformBox = (lo: number, hi: number, ndim: number) => (rng: { uniform(): number }, out: Float64Array) => {
  for (let d = 0; d < ndim; d++) out[d] = lo + (hi - lo) * rng.uniform();
};

describe('non-Gaussian targets, with DE in the move mixture', () => {
  it('bimodal mixture: both modes visited in the right proportions (chi-square test)', async () => {
    // Weight 0.3 at x1 = -4, 0.7 at x1 = +4, unit variances: 8 standard deviations apart.
    const ndim = 2;
    const weight = 0.3;
    const r = await runTarget({
      density: bimodalDensity({ ndim, separation: 8, weight }),
      nWalkers: 32,
      nEnsembles: 4,
      steps: 12000,
      burn: 2000,
      seed: 71,
      moves: [
        { move: stretchMove(), weight: 0.7 },
        { move: deMove(), weight: 0.3 },
      ],
      // Prior draws over a box holding both modes: the walkers start split about evenly, not 30/70.
      init: { kind: 'prior', draw: uniformBox(-10, 10, ndim) },
    });
    // The mass with x1 < 0: the first component's, less its tail beyond 0, plus the second's tail below 0.
    const expected = weight * normalCdf(0, -4, 1) + (1 - weight) * normalCdf(0, 4, 1);
    // Fraction of walkers in the x1 < 0 mode at each step (blob "mode" = 0 there); each ensemble's series.
    const series = r.blobs.map((b) => {
      const y = new Float64Array(r.nRows);
      for (let t = 0; t < r.nRows; t++) {
        let n = 0;
        for (let w = 0; w < r.nWalkers; w++) if (b[t * r.nWalkers + w] === 0) n++;
        y[t] = n / r.nWalkers;
      }
      return y;
    });
    const m = meanWithMcse(series);
    // The counts in the two modes are autocorrelated; the Pearson statistic on effective counts,
    // (observed - expected)^2 / expected summed over both modes with n_eff = p(1-p)/MCSE^2, reduces to
    // ((p̂ - p) / MCSE)^2 and follows χ² with 1 degree of freedom.
    const chi2 = ((m.mean - expected) / m.mcse) ** 2;
    console.log(`bimodal: fraction in the weight-0.3 mode ${m.mean.toFixed(4)} ± ${m.mcse.toFixed(4)} (expected ${expected.toFixed(5)}), τ of the occupancy ${m.tau.toFixed(0)} steps, χ² = ${chi2.toFixed(2)}`);
    expect(chi2).toBeLessThan(CHI2_1DOF_999);
    // Walkers did cross: every ensemble holds both modes at the end, in about the right shares.
    for (const y of series) expect(y[r.nRows - 1]).toBeGreaterThan(0.05);
  }, HEAVY_MS);

  it('Rosenbrock banana: E[x1] = 1, Var[x1] = 10, E[x2] = 11, from 8 independent ensembles', async () => {
    // The banana is slow for every affine-invariant move: in trial runs of 200 000 steps, τ of these
    // moments came out at 4000-7500 steps, so a run of a test's length is only a few τ and the usual MCSE
    // (which needs τ) would be unreliable. Instead the walkers start in the stationary distribution (exact
    // draws: x1 ~ N(1, 10), x2 | x1 ~ N(x1^2, 0.1)), so each ensemble's estimate is unbiased whatever the
    // run length, and the 8 ensembles are independent: the standard error comes from their spread, and
    // the error must stay below t_7 = 5.41 standard errors (two-sided 0.001 point of Student's t with
    // 7 degrees of freedom; standard tables, e.g. Abramowitz & Stegun 1964, table 26.10).
    const exact = (rng: { normal(): number }, out: Float64Array) => {
      out[0] = 1 + Math.sqrt(10) * rng.normal();
      out[1] = out[0] * out[0] + Math.sqrt(0.1) * rng.normal();
    };
    const r = await runTarget({
      density: rosenbrockDensity(),
      nWalkers: 32,
      nEnsembles: 8,
      steps: 15000,
      burn: 0,
      seed: 81,
      moves: [
        { move: stretchMove(), weight: 0.8 },
        { move: deMove(), weight: 0.2 },
      ],
      init: { kind: 'prior', draw: exact },
    });
    // Exact moments (rosenbrock.ts): E[x1] = 1, Var[x1] = 10, E[x2] = E[x1^2] = 11.
    const checks: [string, (c: Float64Array, o: number) => number, number][] = [
      ['E[x1]', (c, o) => c[o], 1],
      ['Var[x1]', (c, o) => (c[o] - 1) ** 2, 10],
      ['E[x2]', (c, o) => c[o + 1], 11],
    ];
    for (const [name, g, truth] of checks) {
      const perEnsemble = walkerMeanSeries(r, g).map((y) => y.reduce((a, b) => a + b, 0) / y.length);
      const { mean, se } = meanAndSe(perEnsemble);
      const t = Math.abs(mean - truth) / se;
      console.log(`banana ${name}: ${mean.toFixed(3)} ± ${se.toFixed(3)} (exact ${truth}), |t| = ${t.toFixed(2)}, acceptance ${r.acceptance.map((a) => a.toFixed(3)).join(' ')}`);
      expect(t).toBeLessThan(5.41);
    }
    // Starting in the stationary distribution, a chain that never moved would pass the moment checks too;
    // it must have moved (and a wrong kernel drifts away from the target within a few τ of moving).
    for (const a of r.acceptance) expect(a).toBeGreaterThan(0.1);
  }, HEAVY_MS);
});

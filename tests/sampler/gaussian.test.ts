/**
 * The stretch move on Gaussian targets, whose answers are exact: a 1-D Gaussian, a 10-D isotropic one, and a
 * 10-D one strongly correlated and badly scaled (condition number 1e4). Walkers start in the stationary
 * distribution (exact draws through the "prior" initialisation), so no burn-in is needed.
 */
import { describe, expect, it } from 'vitest';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import { choleskyLower, gaussianDensity, identity } from '../../src/sampler/targets/gaussian.js';
import { EnsembleSampler } from '../../src/sampler/ensembleSampler.js';
import { inThreadEvaluator } from '../../src/sampler/evaluator.js';
import { SamplerRng } from '../../src/sampler/rng.js';
import type { LogDensity } from '../../src/sampler/types.js';
import { checkGaussian, meanAndSe } from './helpers/checks.js';
import { runTarget } from './helpers/run.js';
import { gaussianPrior, illConditionedCov } from './helpers/targets.js';

/** Seconds-long on an idle machine; the limit allows for a CPU shared with other jobs. */
const HEAVY_MS = 300_000;

const NDIM = 10;
const ZERO = new Array(NDIM).fill(0);

async function stretchRun(mean: number[], cov: Float64Array, o: { nWalkers: number; steps: number; seed: number; nEnsembles: number }) {
  return runTarget({
    density: gaussianDensity({ mean, cov }),
    nWalkers: o.nWalkers,
    nEnsembles: o.nEnsembles,
    steps: o.steps,
    burn: 0,
    seed: o.seed,
    moves: stretchMove({ a: 2 }),
    init: { kind: 'prior', draw: gaussianPrior(mean, cov) },
  });
}

describe('stretch move on Gaussians', () => {
  it('is exactly affine-equivariant: from A x0 + b with the same seed, the chain is A x_t + b', async () => {
    // Goodman & Weare (2010, section 2): an affine-invariant move commutes with y = A x + b. With the same
    // random stream, the chain started at A x0 + b on the transformed target is the transform of the chain
    // started at x0, step for step, up to rounding; an accept decision would flip only if a log ratio fell
    // within rounding (~1e-12) of the log uniform, which does not happen in these few thousand decisions.
    const ill = illConditionedCov(NDIM);
    const L = choleskyLower(ill, NDIM);
    const b = Array.from({ length: NDIM }, (_, i) => 3 * i - 7);
    const nWalkers = 24;
    const init = SamplerRng.fromSeed(5);
    const x0 = Float64Array.from({ length: nWalkers * NDIM }, () => init.normal());
    const y0 = new Float64Array(nWalkers * NDIM);
    const affine = (x: Float64Array, out: Float64Array) => {
      for (let w = 0; w < nWalkers; w++)
        for (let i = 0; i < NDIM; i++) {
          let s = b[i];
          for (let k = 0; k <= i; k++) s += L[i * NDIM + k] * x[w * NDIM + k];
          out[w * NDIM + i] = s;
        }
    };
    affine(x0, y0);
    const run = async (density: LogDensity, start: Float64Array) => {
      const ev = inThreadEvaluator(density);
      const lp = new Float64Array(nWalkers);
      await ev.evaluate(start, nWalkers, lp, new Float64Array(0));
      const s = new EnsembleSampler({ evaluator: ev }, SamplerRng.fromSeed(77), { positions: start, logProb: lp, blobs: new Float64Array(0) });
      const states = [];
      for await (const st of s.sample({ steps: 300 })) states.push(st);
      return states;
    };
    const xs = await run(gaussianDensity({ mean: ZERO }), x0);
    const ys = await run(gaussianDensity({ mean: b, cov: ill }), y0);
    const mapped = new Float64Array(nWalkers * NDIM);
    let worst = 0;
    for (let t = 0; t < xs.length; t++) {
      expect(Array.from(ys[t].accepted)).toEqual(Array.from(xs[t].accepted));
      affine(xs[t].positions, mapped);
      for (let k = 0; k < mapped.length; k++) worst = Math.max(worst, Math.abs(mapped[k] - ys[t].positions[k]) / (1 + Math.abs(mapped[k])));
    }
    // Rounding: each step adds errors of order eps x |A| x |x| (|A| up to 100 here); 1e-9 leaves room for
    // their accumulation over 300 steps while catching any real departure (which would be of order 1).
    expect(worst).toBeLessThan(1e-9);
  }, HEAVY_MS);

  it('1-D Gaussian N(2, 3^2): mean, variance and KS', async () => {
    const cov = Float64Array.of(9);
    const r = await stretchRun([2], cov, { nWalkers: 8, steps: 4000, seed: 11, nEnsembles: 4 });
    const rep = checkGaussian(r, [2], cov, '1-D');
    console.log(`1-D: worst |error| ${rep.worstZ.toFixed(2)} MCSE, worst KS p ${rep.worstKsP.toFixed(3)}, acceptance ${r.acceptance.map((a) => a.toFixed(3)).join(' ')}`);
  }, HEAVY_MS);

  // Shared by the moments checks and the affine-invariance check: 8 ensembles of 32 walkers, 6000 steps
  // (about 50 τ for τ ≈ 115, the value emcee gives for this target; see emcee.test.ts).
  let isoTau: number[] = [];
  let illTau: number[] = [];

  it('10-D isotropic Gaussian: means, covariances, KS, acceptance in 0.2-0.5', async () => {
    const cov = identity(NDIM);
    const r = await stretchRun(ZERO, cov, { nWalkers: 32, steps: 6000, seed: 21, nEnsembles: 8 });
    const rep = checkGaussian(r, ZERO, cov, '10-D isotropic');
    isoTau = rep.tauByEnsemble;
    console.log(`10-D isotropic: worst |error| ${rep.worstZ.toFixed(2)} MCSE, worst KS p ${rep.worstKsP.toFixed(3)}, acceptance ${r.acceptance.map((a) => a.toFixed(3)).join(' ')}`);
    // Healthy range for the stretch move: 0.2-0.5 (references.md, common practice).
    for (const a of r.acceptance) {
      expect(a).toBeGreaterThan(0.2);
      expect(a).toBeLessThan(0.5);
    }
  }, HEAVY_MS);

  it('10-D Gaussian with condition number 1e4: means, covariances, KS, acceptance in 0.2-0.5', async () => {
    const cov = illConditionedCov(NDIM);
    const mean = Array.from({ length: NDIM }, (_, i) => 10 * (i - 4.5));
    const r = await stretchRun(mean, cov, { nWalkers: 32, steps: 6000, seed: 31, nEnsembles: 8 });
    const rep = checkGaussian(r, mean, cov, '10-D ill-conditioned');
    illTau = rep.tauByEnsemble;
    console.log(`10-D ill-conditioned: worst |error| ${rep.worstZ.toFixed(2)} MCSE, worst KS p ${rep.worstKsP.toFixed(3)}, acceptance ${r.acceptance.map((a) => a.toFixed(3)).join(' ')}`);
    for (const a of r.acceptance) {
      expect(a).toBeGreaterThan(0.2);
      expect(a).toBeLessThan(0.5);
    }
  }, HEAVY_MS);

  it('affine invariance: τ on the ill-conditioned Gaussian is statistically the same as on the isotropic one', () => {
    // Each ensemble gives one τ (averaged over parameters); the 8 ensembles of each run are independent,
    // so the standard error of each run's mean τ comes from their spread. Welch's difference must lie
    // within 4 combined standard errors (|t| > 4 has probability 0.1% with 14 degrees of freedom, and
    // under 0.5% with the fewer that Welch–Satterthwaite gives when the two spreads differ).
    expect(isoTau.length).toBe(8);
    expect(illTau.length).toBe(8);
    const a = meanAndSe(isoTau);
    const b = meanAndSe(illTau);
    const t = Math.abs(a.mean - b.mean) / Math.hypot(a.se, b.se);
    console.log(`τ isotropic ${a.mean.toFixed(1)} ± ${a.se.toFixed(1)}, ill-conditioned ${b.mean.toFixed(1)} ± ${b.se.toFixed(1)}, |t| = ${t.toFixed(2)}`);
    expect(t).toBeLessThan(4);
  }, HEAVY_MS);
});

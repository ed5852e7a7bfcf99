/**
 * Nelder–Mead against functions with known minima, and the "optimum" initialisation that uses it.
 */
import { describe, expect, it } from 'vitest';
import { inThreadEvaluator } from '../../src/sampler/evaluator.js';
import { initializeEnsemble } from '../../src/sampler/initialize.js';
import { nelderMead } from '../../src/sampler/nelderMead.js';
import { SamplerRng } from '../../src/sampler/rng.js';
import { gaussianDensity } from '../../src/sampler/targets/gaussian.js';

describe('Nelder–Mead', () => {
  it('finds the minimum of Rosenbrock\'s function at (1, 1) from the classic start (-1.2, 1)', async () => {
    // f(x, y) = 100 (y - x^2)^2 + (1 - x)^2, minimum 0 at (1, 1) (Rosenbrock 1960, Comput. J. 3, 175);
    // (-1.2, 1) is the standard starting point of that paper.
    const f = (x: Float64Array) => 100 * (x[1] - x[0] ** 2) ** 2 + (1 - x[0]) ** 2;
    const r = await nelderMead(f, [-1.2, 1], { fTolerance: 1e-14, xTolerance: 1e-10, maxIterations: 2000 });
    expect(r.converged).toBe(true);
    expect(r.x[0]).toBeCloseTo(1, 6);
    expect(r.x[1]).toBeCloseTo(1, 6);
    expect(r.f).toBeLessThan(1e-12);
  });

  it('finds the centre of a badly scaled 6-D quadratic (the adaptive coefficients of Gao & Han 2012)', async () => {
    const centre = [3, -2, 0.5, 10, -7, 1];
    const scale = [1, 10, 100, 0.1, 1000, 3];
    const f = (x: Float64Array) => x.reduce((s, v, i) => s + ((v - centre[i]) / scale[i]) ** 2, 0);
    const r = await nelderMead(f, [0, 0, 0, 0, 0, 0], { step: scale, fTolerance: 1e-16, xTolerance: 1e-9, maxIterations: 20000 });
    expect(r.f).toBeLessThan(1e-12);
    centre.forEach((c, i) => expect(Math.abs(r.x[i] - c)).toBeLessThan(1e-5 * scale[i]));
  });

  it('treats +Infinity (outside the support) as the worst vertex and rejects NaN', async () => {
    const f = (x: Float64Array) => (x[0] < 0 ? Number.POSITIVE_INFINITY : (x[0] - 2) ** 2 + (x[1] + 1) ** 2);
    const r = await nelderMead(f, [0.5, 0.5], { fTolerance: 1e-14, xTolerance: 1e-9 });
    expect(r.x[0]).toBeCloseTo(2, 5);
    expect(r.x[1]).toBeCloseTo(-1, 5);
    await expect(nelderMead(() => Number.NaN, [1, 1])).rejects.toThrow(/objective is NaN/);
  });
});

describe('optimum initialisation', () => {
  it('starts the walkers in a small full-rank ball around the mode found from prior draws', async () => {
    const mean = [5, -3, 12, 0.25];
    const cov = Float64Array.from([4, 1.5, 0, 0, 1.5, 1, 0, 0, 0, 0, 9, -2, 0, 0, -2, 1]);
    const evaluator = inThreadEvaluator(gaussianDensity({ mean, cov }));
    const prior = (rng: { uniform(): number }, out: Float64Array) => {
      for (let d = 0; d < 4; d++) out[d] = -20 + 40 * rng.uniform();
    };
    const start = await initializeEnsemble({ kind: 'optimum', draw: prior, starts: 4 }, { nWalkers: 16, evaluator, rng: SamplerRng.fromSeed(8) });
    // The mode of a Gaussian is its mean; the log-density there is 0.
    expect(start.optimum).toBeDefined();
    mean.forEach((m, d) => expect(Math.abs(start.optimum!.x[d] - m)).toBeLessThan(1e-3));
    expect(start.optimum!.logProb).toBeGreaterThan(-1e-6);
    // The ball is 1e-3 of the prior spread (about 11.5 for a uniform over 40): walkers within ~0.1.
    for (let w = 0; w < 16; w++) for (let d = 0; d < 4; d++) expect(Math.abs(start.positions[w * 4 + d] - mean[d])).toBeLessThan(0.1);
  });
});

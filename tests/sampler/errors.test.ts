/**
 * Bad set-ups stop with a specific message: too few walkers, an unknown move, weights that do not sum to a
 * positive number, a log-probability that returns NaN (at the start and mid-run), walkers that never find
 * finite support, and a degenerate initial ensemble.
 */
import { describe, expect, it } from 'vitest';
import { SamplingError } from '../../src/core/errors.js';
import { checkNotDegenerate } from '../../src/sampler/checkEnsemble.js';
import { EnsembleSampler } from '../../src/sampler/ensembleSampler.js';
import { inThreadEvaluator } from '../../src/sampler/evaluator.js';
import { initializeEnsemble } from '../../src/sampler/initialize.js';
import { MoveMixture } from '../../src/sampler/moves/moveMixture.js';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import { movesFromConfig } from '../../src/sampler/movesFromConfig.js';
import { createEnsembles } from '../../src/sampler/runEnsembles.js';
import { SamplerRng } from '../../src/sampler/rng.js';
import { faultyDensity } from '../../src/sampler/targets/faulty.js';
import { gaussianDensity } from '../../src/sampler/targets/gaussian.js';

async function caught(p: Promise<unknown> | (() => unknown)): Promise<SamplingError> {
  try {
    if (typeof p === 'function') p();
    else await p;
  } catch (e) {
    if (e instanceof SamplingError) return e;
    throw e;
  }
  throw new Error('expected a SamplingError');
}

const gauss3 = () => inThreadEvaluator(gaussianDensity({ mean: [0, 0, 0] }));

describe('configuration errors', () => {
  it('refuses fewer than 2 x ndim walkers, and says why', async () => {
    const e = await caught(createEnsembles({ evaluator: gauss3(), seed: 1, nWalkers: 5, init: { kind: 'ball', center: [0, 0, 0], scale: 1 } }));
    expect(e.message).toBe('need at least 2 x ndim = 6 walkers for 3 parameters, got 5');
    expect(e.hint).toMatch(/span/);
    expect(e.exitCode).toBe(6);
  });

  it('names an unknown move and suggests the nearest', async () => {
    const e = await caught(() => movesFromConfig([{ move: 'strech', weight: 1 }]));
    expect(e.message).toBe('unknown move "strech"');
    expect(e.where?.key).toBe('sampler.moves.0.move');
    expect(e.hint).toBe('did you mean "stretch"?');
  });

  it('refuses weights that do not sum to a positive number', async () => {
    const e = await caught(() => movesFromConfig([{ move: 'stretch', weight: 0 }, { move: 'de', weight: 0 }]));
    expect(e.message).toMatch(/sum to a positive number; they sum to 0/);
    expect(() => new MoveMixture([{ move: stretchMove(), weight: -1 }])).toThrow(/must be a finite number >= 0, got -1/);
    expect(() => new MoveMixture([{ move: stretchMove(), weight: 0 }])).toThrow(/sum to 0/);
  });

  it('refuses a stretch scale a <= 1', () => {
    expect(() => stretchMove({ a: 1 })).toThrow(/above 1, got 1/);
  });
});

describe('log-probabilities that are NaN or never finite', () => {
  it('"the initial log-probability of walker 2 is NaN", with its parameter values', async () => {
    const ev = inThreadEvaluator(faultyDensity({ ndim: 2, nanAbove: 10 }));
    const positions = Float64Array.of(0, 0, 1, 1, 11, 0, 0.5, -1);
    const logProb = new Float64Array(4);
    await ev.evaluate(positions, 4, logProb, new Float64Array(0));
    const e = await caught(() => new EnsembleSampler({ evaluator: ev }, SamplerRng.fromSeed(1), { positions, logProb, blobs: new Float64Array(0) }));
    expect(e.message).toBe('the initial log-probability of walker 2 is NaN');
    expect(e.found).toEqual([11, 0]);
  });

  it('stops mid-run at a NaN proposal, naming the walker, the step and the values', async () => {
    const ev = inThreadEvaluator(faultyDensity({ ndim: 2, nanAbove: 1.5 }));
    const rng = SamplerRng.fromSeed(3);
    const start = await initializeEnsemble({ kind: 'ball', center: [-1, 0], scale: 0.3 }, { nWalkers: 8, evaluator: ev, rng });
    const s = new EnsembleSampler({ evaluator: ev }, rng, start);
    const e = await caught(
      (async () => {
        for await (const _ of s.sample({ steps: 10000 })) void _;
      })(),
    );
    expect(e.message).toMatch(/^the log-probability of walker \d+'s proposal is NaN \(ensemble 0, step \d+, stretch move\)$/);
    const at = e.found as number[];
    expect(at).toHaveLength(2);
    expect(at[0]).toBeGreaterThan(1.5);
    // The ensemble refuses to continue from a half-applied step.
    const again = await caught(s.sample({ steps: 1 }).next());
    expect(again.message).toMatch(/stopped after an error/);
  });

  it('gives up on a walker after N draws, saying which walker and what its last draw gave', async () => {
    // Every draw has x1 > 10, where the density is NaN.
    const ev = inThreadEvaluator(faultyDensity({ ndim: 2, nanAbove: 10 }));
    const e = await caught(initializeEnsemble({ kind: 'ball', center: [20, 0], scale: 1 }, { nWalkers: 4, evaluator: ev, rng: SamplerRng.fromSeed(9), maxAttempts: 5 }));
    expect(e.message).toMatch(/^could not start walker 0: after 5 draws its log-probability is still not finite \(the last draw gave NaN\); 3 other walker\(s\) failed too$/);
    expect((e.found as number[])[0]).toBeGreaterThan(10);
  });

  it('redraws walkers outside the support until they are inside it', async () => {
    // A ball centred on the NaN boundary: about half the first draws fail and are redrawn.
    const ev = inThreadEvaluator(faultyDensity({ ndim: 2, nanAbove: 0 }));
    const start = await initializeEnsemble({ kind: 'ball', center: [0, 0], scale: 1 }, { nWalkers: 16, evaluator: ev, rng: SamplerRng.fromSeed(2) });
    for (let w = 0; w < 16; w++) {
      expect(start.positions[2 * w]).toBeLessThanOrEqual(0);
      expect(Number.isFinite(start.logProb[w])).toBe(true);
    }
  });
});

describe('degenerate initial ensembles', () => {
  it('detects walkers on a line (collinear)', async () => {
    // 8 walkers on the line x2 = 2 x1 + 1, x3 free: parameter 1 is a linear function of parameter 0.
    const pts = new Float64Array(8 * 3);
    for (let w = 0; w < 8; w++) {
      pts[3 * w] = w;
      pts[3 * w + 1] = 2 * w + 1;
      pts[3 * w + 2] = (w * w) % 5;
    }
    const e = await caught(() => checkNotDegenerate(pts, 8, 3));
    expect(e.message).toMatch(/degenerate: the walkers lie in a lower-dimensional subspace \(parameter 1 is a linear combination of parameter 0/);
  });

  it('detects a parameter with no spread', async () => {
    const pts = Float64Array.from({ length: 8 * 2 }, (_, i) => (i % 2 === 0 ? i : 5));
    const e = await caught(() => checkNotDegenerate(pts, 8, 2));
    expect(e.message).toMatch(/every walker has the same value of parameter 1 \(5\)/);
  });

  it('refuses to start from a degenerate ensemble', async () => {
    const ev = gauss3();
    const pts = new Float64Array(6 * 3);
    for (let w = 0; w < 6; w++) pts.set([w, -w, 2 * w], 3 * w);
    const lp = new Float64Array(6);
    await ev.evaluate(pts, 6, lp, new Float64Array(0));
    const e = await caught(() => new EnsembleSampler({ evaluator: ev }, SamplerRng.fromSeed(1), { positions: pts, logProb: lp, blobs: new Float64Array(0) }));
    expect(e.message).toMatch(/degenerate/);
  });

  it('accepts a full-rank ball', () => {
    const rng = SamplerRng.fromSeed(1);
    const pts = Float64Array.from({ length: 6 * 3 }, () => rng.normal());
    expect(() => checkNotDegenerate(pts, 6, 3)).not.toThrow();
  });
});

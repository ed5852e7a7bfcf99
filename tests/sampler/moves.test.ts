/**
 * Every move, and a mixture, through the shared Gaussian checks (helpers/checks.ts) on the 10-D
 * ill-conditioned target: the DE and walk moves are affine-invariant too, so they must handle a
 * condition number of 1e4 as the stretch move does.
 */
import { describe, expect, it } from 'vitest';
import { deMove } from '../../src/sampler/moves/deMove.js';
import { walkMove } from '../../src/sampler/moves/walkMove.js';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import type { Move, WeightedMove } from '../../src/sampler/moves/move.js';
import { gaussianDensity } from '../../src/sampler/targets/gaussian.js';
import { checkGaussian } from './helpers/checks.js';
import { runTarget } from './helpers/run.js';
import { gaussianPrior, illConditionedCov } from './helpers/targets.js';

/** Seconds-long on an idle machine; the limit allows for a CPU shared with other jobs. */
const HEAVY_MS = 300_000;

const NDIM = 10;
const COV = illConditionedCov(NDIM);
const MEAN = Array.from({ length: NDIM }, (_, i) => i * i - 20);

async function check(moves: Move | WeightedMove[], seed: number, steps: number) {
  const r = await runTarget({
    density: gaussianDensity({ mean: MEAN, cov: COV }),
    nWalkers: 32,
    nEnsembles: 4,
    steps,
    burn: 0,
    seed,
    moves,
    init: { kind: 'prior', draw: gaussianPrior(MEAN, COV) },
  });
  const rep = checkGaussian(r, MEAN, COV, Array.isArray(moves) ? 'mixture' : moves.name);
  console.log(
    `${Array.isArray(moves) ? 'mixture' : moves.name}: acceptance ${r.acceptance.map((a) => a.toFixed(3)).join(' ')}, τ ${rep.tauByEnsemble.map((t) => t.toFixed(0)).join(' ')}, worst ${rep.worstZ.toFixed(2)} MCSE, worst KS p ${rep.worstKsP.toFixed(3)}`,
  );
  return { r, rep };
}

describe('moves on a 10-D Gaussian with condition number 1e4', () => {
  it('differential evolution', async () => {
    await check(deMove(), 41, 5000);
  }, HEAVY_MS);

  it('walk', async () => {
    await check(walkMove(), 51, 5000);
  }, HEAVY_MS);

  it('a weighted mixture of stretch, DE and walk records each move\'s use in proportion to its weight', async () => {
    const { r } = await check(
      [
        { move: stretchMove(), weight: 2 },
        { move: deMove(), weight: 1 },
        { move: walkMove(), weight: 1 },
      ],
      61,
      5000,
    );
    // Every move was used and accepted something.
    for (const acc of r.moveAcceptance) for (const a of acc) expect(a).toBeGreaterThan(0);
    // Each step's move is an independent draw with probabilities 1/2, 1/4, 1/4: the count of each is
    // binomial(5000, p), so it lies within 4 standard deviations of 5000 p.
    const probs = [0.5, 0.25, 0.25];
    for (const counts of r.moveSteps) {
      expect(counts.reduce((a, b) => a + b, 0)).toBe(5000);
      counts.forEach((c, i) => expect(Math.abs(c - 5000 * probs[i])).toBeLessThan(4 * Math.sqrt(5000 * probs[i] * (1 - probs[i]))));
    }
  }, HEAVY_MS);
});

/**
 * One step of the ensemble, shared by every move: split the walkers into two halves (at random, each
 * step), and move each half in turn using the other as the complementary sample (Goodman & Weare 2010;
 * the parallel red/blue update of Foreman-Mackey et al. 2013, PASP 125, 306, section 2.1). The move
 * proposes; this step evaluates the proposals (all of a half at once, which is what the worker pool
 * parallelises) and accepts each with probability min(1, exp(logFactor + logp(Y) - logp(X))).
 *
 * Random numbers are drawn in a fixed order: the split permutation, then per half the move's draws, then one
 * uniform per walker of the half for the accept step. The evaluation sits between draws, so its timing
 * cannot change the stream.
 */
import { SamplingError } from '../../core/errors.js';
import type { Evaluator } from '../evaluator.js';
import type { SamplerRng } from '../rng.js';
import type { Move } from './move.js';

/** The ensemble being stepped, updated in place. Walker-major arrays, as in `EnsembleState`. */
export interface WalkerArrays {
  ndim: number;
  nWalkers: number;
  nBlobs: number;
  positions: Float64Array;
  logProb: Float64Array;
  blobs: Float64Array;
  /** Written: 1 where the walker's proposal was accepted in this step. */
  accepted: Uint8Array;
}

/** Scratch buffers sized for one half, reused across steps. */
export class StepScratch {
  readonly order: Int32Array;
  readonly moving: Float64Array;
  readonly complement: Float64Array;
  readonly proposals: Float64Array;
  readonly logFactors: Float64Array;
  readonly newLogProb: Float64Array;
  readonly newBlobs: Float64Array;

  constructor(nWalkers: number, ndim: number, nBlobs: number) {
    const half = Math.ceil(nWalkers / 2);
    this.order = new Int32Array(nWalkers);
    this.moving = new Float64Array(half * ndim);
    this.complement = new Float64Array(half * ndim);
    this.proposals = new Float64Array(half * ndim);
    this.logFactors = new Float64Array(half);
    this.newLogProb = new Float64Array(half);
    this.newBlobs = new Float64Array(half * nBlobs);
  }
}

export interface StepOptions {
  /** Shuffle the walkers before splitting them (as in emcee 3); false keeps the halves fixed by index. */
  randomizeSplit: boolean;
  /** Ensemble index and step number, for error messages. */
  ensemble: number;
  step: number;
}

/** Advance the ensemble by one step of `move`; returns the number of accepted proposals. */
export async function redBlueStep(
  w: WalkerArrays,
  move: Move,
  rng: SamplerRng,
  evaluator: Evaluator,
  scratch: StepScratch,
  options: StepOptions,
): Promise<number> {
  const { ndim, nWalkers, nBlobs, positions, logProb, blobs, accepted } = w;
  const order = scratch.order;
  for (let i = 0; i < nWalkers; i++) order[i] = i;
  if (options.randomizeSplit) {
    for (let i = nWalkers - 1; i > 0; i--) {
      const j = rng.integer(i + 1);
      const t = order[i];
      order[i] = order[j];
      order[j] = t;
    }
  }
  const nFirst = nWalkers >> 1;
  let nAccepted = 0;
  for (let half = 0; half < 2; half++) {
    const moveStart = half === 0 ? 0 : nFirst;
    const nUpdate = half === 0 ? nFirst : nWalkers - nFirst;
    const compStart = half === 0 ? nFirst : 0;
    const nComplement = nWalkers - nUpdate;
    for (let i = 0; i < nUpdate; i++) scratch.moving.set(positions.subarray(order[moveStart + i] * ndim, (order[moveStart + i] + 1) * ndim), i * ndim);
    for (let i = 0; i < nComplement; i++) scratch.complement.set(positions.subarray(order[compStart + i] * ndim, (order[compStart + i] + 1) * ndim), i * ndim);
    move.propose(
      { ndim, walkers: scratch.moving, nUpdate, complement: scratch.complement, nComplement },
      rng,
      scratch.proposals,
      scratch.logFactors,
    );
    await evaluator.evaluate(scratch.proposals, nUpdate, scratch.newLogProb, scratch.newBlobs);
    for (let i = 0; i < nUpdate; i++) {
      const walker = order[moveStart + i];
      const lp = scratch.newLogProb[i];
      if (Number.isNaN(lp) || lp === Number.POSITIVE_INFINITY) {
        throw nonFiniteProposal(lp, walker, scratch.proposals.subarray(i * ndim, (i + 1) * ndim), move.name, options);
      }
      const logRatio = scratch.logFactors[i] + lp - logProb[walker];
      // Draw for every walker, accepted or not, so the stream does not depend on the density's values.
      const u = rng.uniform();
      if (Math.log(u) < logRatio) {
        positions.set(scratch.proposals.subarray(i * ndim, (i + 1) * ndim), walker * ndim);
        logProb[walker] = lp;
        if (nBlobs > 0) blobs.set(scratch.newBlobs.subarray(i * nBlobs, (i + 1) * nBlobs), walker * nBlobs);
        accepted[walker] = 1;
        nAccepted++;
      } else {
        accepted[walker] = 0;
      }
    }
  }
  return nAccepted;
}

function nonFiniteProposal(lp: number, walker: number, theta: Float64Array, moveName: string, options: StepOptions): SamplingError {
  return new SamplingError(
    `the log-probability of walker ${walker}'s proposal is ${lp} (ensemble ${options.ensemble}, step ${options.step + 1}, ${moveName} move)`,
    {
      found: Array.from(theta),
      expected: 'a finite number, or -Infinity outside the support',
      hint: 'the log-density must return -Infinity (not NaN) where the parameters are impossible; check it at the values shown',
    },
  );
}

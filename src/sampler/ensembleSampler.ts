/**
 * One ensemble of walkers and its generator of states. The sampler holds the walkers, its random stream
 * and its move mixture; `sample()` advances them and yields a copy of the state after each (thinned) step.
 * Everything else (storage, progress, checkpoints, convergence) consumes those states from outside.
 */
import { SamplingError } from '../core/errors.js';
import { checkInitialLogProb, checkNotDegenerate, checkWalkerCount } from './checkEnsemble.js';
import type { Evaluator } from './evaluator.js';
import type { Move, WeightedMove } from './moves/move.js';
import { MoveMixture, type MoveMixtureState } from './moves/moveMixture.js';
import { redBlueStep, StepScratch, type WalkerArrays } from './moves/redBlueStep.js';
import { stretchMove } from './moves/stretchMove.js';
import { SamplerRng } from './rng.js';
import type { EnsembleState } from './types.js';

/** Walkers to start from: positions (walker-major) with their log-probabilities and blobs. */
export interface EnsembleStart {
  positions: Float64Array;
  logProb: Float64Array;
  blobs: Float64Array;
}

/** Everything needed to continue an ensemble exactly where it stopped. */
export interface EnsembleSnapshot extends EnsembleState {
  rngState: Uint32Array;
  moves: MoveMixtureState;
  /** Accepted proposals of each walker since step 0. */
  acceptedCount: Float64Array;
}

export interface EnsembleSamplerOptions {
  evaluator: Evaluator;
  /** One move, or a weighted mixture; default the stretch move with a = 2. */
  moves?: Move | readonly WeightedMove[];
  /** Shuffle walkers before each split (default true, as emcee 3 does); false keeps the halves fixed. */
  randomizeSplit?: boolean;
  /** Index of this ensemble in the run (for states and messages); default 0. */
  ensemble?: number;
}

export interface SampleOptions {
  /** Steps to take (default: until the consumer stops iterating). */
  steps?: number;
  /** Yield the state only at steps that are multiples of `thin` (counted from step 0); default 1. */
  thin?: number;
  /** Checked after every step; when it returns true the generator finishes after that step. */
  shouldStop?: () => boolean;
}

export class EnsembleSampler {
  readonly ensemble: number;
  readonly ndim: number;
  readonly nWalkers: number;
  readonly nBlobs: number;
  readonly mixture: MoveMixture;
  private readonly evaluator: Evaluator;
  private readonly randomizeSplit: boolean;
  private readonly walkers: WalkerArrays;
  private readonly scratch: StepScratch;
  private readonly acceptedCount: Float64Array;
  private rng: SamplerRng;
  private stepCount: number;
  private busy = false;
  private broken: Error | undefined;

  constructor(options: EnsembleSamplerOptions, rng: SamplerRng, start: EnsembleStart) {
    const { evaluator } = options;
    this.ensemble = options.ensemble ?? 0;
    this.ndim = evaluator.ndim;
    this.nBlobs = evaluator.blobNames.length;
    this.evaluator = evaluator;
    this.randomizeSplit = options.randomizeSplit ?? true;
    const moves = options.moves ?? stretchMove();
    this.mixture = new MoveMixture('propose' in moves ? [{ move: moves, weight: 1 }] : moves);
    const nWalkers = start.logProb.length;
    checkWalkerCount(nWalkers, this.ndim);
    if (start.positions.length !== nWalkers * this.ndim) {
      throw new RangeError(`the start positions hold ${start.positions.length} values, expected nWalkers x ndim = ${nWalkers} x ${this.ndim}`);
    }
    if (start.blobs.length !== nWalkers * this.nBlobs) {
      throw new RangeError(`the start blobs hold ${start.blobs.length} values, expected nWalkers x nBlobs = ${nWalkers} x ${this.nBlobs}`);
    }
    checkInitialLogProb(start.logProb, start.positions, this.ndim, this.ensemble);
    checkNotDegenerate(start.positions, nWalkers, this.ndim, this.ensemble);
    this.nWalkers = nWalkers;
    this.walkers = {
      ndim: this.ndim,
      nWalkers,
      nBlobs: this.nBlobs,
      positions: new Float64Array(start.positions),
      logProb: new Float64Array(start.logProb),
      blobs: new Float64Array(start.blobs),
      accepted: new Uint8Array(nWalkers),
    };
    this.scratch = new StepScratch(nWalkers, this.ndim, this.nBlobs);
    this.acceptedCount = new Float64Array(nWalkers);
    this.rng = rng;
    this.stepCount = 0;
  }

  /** Rebuild a sampler from a snapshot; the moves must be those it was saved with. */
  static fromSnapshot(options: EnsembleSamplerOptions, snapshot: EnsembleSnapshot): EnsembleSampler {
    if (snapshot.ndim !== options.evaluator.ndim || snapshot.nBlobs !== options.evaluator.blobNames.length) {
      throw new SamplingError(
        `the saved ensemble has ${snapshot.ndim} parameters and ${snapshot.nBlobs} blobs, but the log-density now has ${options.evaluator.ndim} and ${options.evaluator.blobNames.length}`,
        { hint: 'resume with the same model and parameters as the original run' },
      );
    }
    const s = new EnsembleSampler({ ...options, ensemble: snapshot.ensemble }, SamplerRng.fromState(snapshot.rngState), snapshot);
    s.stepCount = snapshot.step;
    s.walkers.accepted.set(snapshot.accepted);
    s.acceptedCount.set(snapshot.acceptedCount);
    try {
      s.mixture.restore(snapshot.moves);
    } catch (err) {
      throw new SamplingError((err as Error).message, { hint: 'resume with the moves and weights of the original run' });
    }
    return s;
  }

  get step(): number {
    return this.stepCount;
  }

  /** A copy of the current state. */
  get state(): EnsembleState {
    const w = this.walkers;
    return {
      ensemble: this.ensemble,
      step: this.stepCount,
      nWalkers: this.nWalkers,
      ndim: this.ndim,
      positions: new Float64Array(w.positions),
      logProb: new Float64Array(w.logProb),
      nBlobs: this.nBlobs,
      blobs: new Float64Array(w.blobs),
      accepted: new Uint8Array(w.accepted),
    };
  }

  /** A copy of everything needed to resume. Take it between steps (e.g. when `sample()` has yielded). */
  snapshot(): EnsembleSnapshot {
    return { ...this.state, rngState: this.rng.state, moves: this.mixture.state, acceptedCount: new Float64Array(this.acceptedCount) };
  }

  /** Fraction of each walker's proposals accepted since step 0. */
  acceptanceFraction(): Float64Array {
    return this.acceptedCount.map((a) => (this.stepCount > 0 ? a / this.stepCount : Number.NaN));
  }

  /** Advance the ensemble, yielding a copy of the state at every `thin`-th step. */
  async *sample(options: SampleOptions = {}): AsyncGenerator<EnsembleState, void, undefined> {
    const steps = options.steps ?? Number.POSITIVE_INFINITY;
    const thin = options.thin ?? 1;
    if (!(steps >= 0) || (Number.isFinite(steps) && !Number.isInteger(steps))) throw new RangeError(`steps must be a non-negative integer, got ${steps}`);
    if (!Number.isInteger(thin) || thin < 1) throw new RangeError(`thin must be a positive integer, got ${thin}`);
    if (this.broken) throw new SamplingError(`ensemble ${this.ensemble} stopped after an error and cannot continue: ${this.broken.message}`);
    if (this.busy) throw new Error(`ensemble ${this.ensemble} is already being sampled`);
    this.busy = true;
    try {
      const end = this.stepCount + steps;
      while (this.stepCount < end) {
        const index = this.mixture.pick(this.rng);
        let nAccepted: number;
        try {
          nAccepted = await redBlueStep(this.walkers, this.mixture.moves[index], this.rng, this.evaluator, this.scratch, {
            randomizeSplit: this.randomizeSplit,
            ensemble: this.ensemble,
            step: this.stepCount,
          });
        } catch (err) {
          // Half a step may have been applied: the state is no longer one the chain could be resumed from.
          this.broken = err as Error;
          throw err;
        }
        this.mixture.record(index, this.nWalkers, nAccepted);
        for (let w = 0; w < this.nWalkers; w++) this.acceptedCount[w] += this.walkers.accepted[w];
        this.stepCount++;
        if (this.stepCount % thin === 0) yield this.state;
        if (options.shouldStop?.()) return;
      }
    } finally {
      this.busy = false;
    }
  }
}

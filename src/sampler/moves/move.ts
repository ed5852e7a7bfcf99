/**
 * What a move is. Following the red/blue scheme of Foreman-Mackey et al. (2013, PASP 125, 306), the
 * ensemble is split into two halves; the walkers of one half are moved using the positions of the other
 * (the complementary half) as a fixed sample of the target. The shared step (`redBlueStep.ts`) owns the
 * split, the evaluation and the accept/reject decision; a move only proposes.
 */
import type { SamplerRng } from '../rng.js';

/** The inputs of one proposal round: the walkers being moved and the complementary half. Walker-major. */
export interface ProposalInput {
  ndim: number;
  /** Positions of the walkers being moved, nUpdate x ndim. */
  walkers: Float64Array;
  nUpdate: number;
  /** Positions of the complementary half, nComplement x ndim. Read-only for the move. */
  complement: Float64Array;
  nComplement: number;
}

export interface Move {
  /** Short name, as in configs and checkpoints (`stretch`, `de`, `walk`). */
  readonly name: string;
  /**
   * Write one proposal per walker into `proposals` (nUpdate x ndim) and the log of its proposal factor
   * into `logFactors`: the term added to the log-density difference in the Metropolis–Hastings ratio
   * (0 for a symmetric proposal; (ndim - 1) log z for the stretch move). Draw random numbers from `rng`
   * only, in an order that depends on nothing but the inputs.
   */
  propose(input: ProposalInput, rng: SamplerRng, proposals: Float64Array, logFactors: Float64Array): void;
}

/** A move with its share of the steps in a mixture. */
export interface WeightedMove {
  move: Move;
  weight: number;
}

/**
 * The differential-evolution move (ter Braak 2006, Stat. Comput. 16, 239; in an affine-invariant ensemble,
 * Nelson, Ford & Payne 2014, ApJS 210, 11): Y = X_k + γ (X_r1 - X_r2), with r1 ≠ r2 drawn from the
 * complementary half. The step is symmetric (the swapped pair proposes the way back with the same
 * probability), so the log proposal factor is 0. ter Braak's optimum for a Gaussian target is
 * γ0 = 2.38 / sqrt(2 ndim).
 *
 * Two choices of ours, within what ter Braak describes:
 * - γ carries a small relative jitter, γ = γ0 (1 + s z) with z standard normal and s = 0.1 by default, so
 *   that the step lengths do not form a lattice. The jitter does not depend on the state, so the proposal
 *   stays symmetric.
 * - With probability `modeHop` (0.1 by default) per proposal, γ = 1: the step then carries a walker from
 *   one mode to the matching point of another, since X_r1 - X_r2 spans the gap between modes when r1 and r2
 *   sit in different ones. ter Braak (2006) suggests γ = 1 at every tenth generation for this purpose
 *   (frequency from memory); drawing it per proposal gives the same share without depending on the step
 *   number, which keeps the move a fixed kernel (and resume exact).
 */
import type { SamplerRng } from '../rng.js';
import type { Move, ProposalInput } from './move.js';

export interface DEOptions {
  /** γ0; default 2.38 / sqrt(2 ndim). */
  gamma0?: number;
  /** Relative standard deviation of γ around γ0; default 0.1. */
  jitter?: number;
  /** Probability that a proposal uses γ = 1 (mode hopping); default 0.1. */
  modeHop?: number;
}

export function deMove(options: DEOptions = {}): Move {
  const jitter = options.jitter ?? 0.1;
  const modeHop = options.modeHop ?? 0.1;
  if (options.gamma0 !== undefined && !(options.gamma0 > 0 && Number.isFinite(options.gamma0))) {
    throw new RangeError(`the DE move's gamma0 must be a positive number, got ${options.gamma0}`);
  }
  if (!(jitter >= 0 && jitter < 1)) throw new RangeError(`the DE move's jitter must be in [0, 1), got ${jitter}`);
  if (!(modeHop >= 0 && modeHop <= 1)) throw new RangeError(`the DE move's mode-hop probability must be in [0, 1], got ${modeHop}`);
  return {
    name: 'de',
    propose(input: ProposalInput, rng: SamplerRng, proposals: Float64Array, logFactors: Float64Array): void {
      const { ndim, walkers, nUpdate, complement, nComplement } = input;
      if (nComplement < 2) throw new RangeError('the DE move needs at least 2 walkers in each half of the ensemble');
      const gamma0 = options.gamma0 ?? 2.38 / Math.sqrt(2 * ndim);
      for (let i = 0; i < nUpdate; i++) {
        const r1 = rng.integer(nComplement);
        // r2 uniform over the other nComplement - 1 walkers.
        let r2 = rng.integer(nComplement - 1);
        if (r2 >= r1) r2 += 1;
        const hop = rng.uniform() < modeHop;
        const jitterDraw = rng.normal();
        const gamma = hop ? 1 : gamma0 * (1 + jitter * jitterDraw);
        for (let d = 0; d < ndim; d++) {
          proposals[i * ndim + d] = walkers[i * ndim + d] + gamma * (complement[r1 * ndim + d] - complement[r2 * ndim + d]);
        }
        logFactors[i] = 0;
      }
    },
  };
}

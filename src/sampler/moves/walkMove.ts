/**
 * The walk move of Goodman & Weare (2010, CAMCoS 5, 65, section 3): pick a random subset S of the
 * complementary half, with mean X̄_S, and propose Y = X_k + Σ_{j∈S} z_j (X_j - X̄_S) with z_j standard
 * normal. The step is a Gaussian with the covariance of the subset (times |S| - 1), symmetric, so the log
 * proposal factor is 0; it is affine-invariant like the stretch move.
 *
 * Subset size: 3 by default (our choice). The step then lies in a 2-D plane with about twice the target's
 * covariance there, close to the optimal random-walk scale 2.38^2 / 2 for two dimensions (Gelman,
 * Roberts & Gilks 1996); larger subsets take steps too long for the acceptance to stay useful.
 */
import type { SamplerRng } from '../rng.js';
import type { Move, ProposalInput } from './move.js';

export interface WalkOptions {
  /** Number of complementary walkers in each subset (>= 2); default 3, capped at the half size. */
  subset?: number;
}

export function walkMove(options: WalkOptions = {}): Move {
  const subset = options.subset ?? 3;
  if (!Number.isInteger(subset) || subset < 2) throw new RangeError(`the walk move's subset size must be an integer >= 2, got ${subset}`);
  let picked = new Int32Array(0);
  let pool = new Int32Array(0);
  let mean = new Float64Array(0);
  return {
    name: 'walk',
    propose(input: ProposalInput, rng: SamplerRng, proposals: Float64Array, logFactors: Float64Array): void {
      const { ndim, walkers, nUpdate, complement, nComplement } = input;
      const s = Math.min(subset, nComplement);
      if (s < 2) throw new RangeError('the walk move needs at least 2 walkers in each half of the ensemble');
      if (pool.length < nComplement) pool = new Int32Array(nComplement);
      if (picked.length < s) picked = new Int32Array(s);
      if (mean.length < ndim) mean = new Float64Array(ndim);
      for (let i = 0; i < nUpdate; i++) {
        // A uniform random subset: the first s entries of a partial Fisher–Yates shuffle.
        for (let j = 0; j < nComplement; j++) pool[j] = j;
        for (let j = 0; j < s; j++) {
          const r = j + rng.integer(nComplement - j);
          const t = pool[j];
          pool[j] = pool[r];
          pool[r] = t;
          picked[j] = pool[j];
        }
        mean.fill(0, 0, ndim);
        for (let j = 0; j < s; j++) for (let d = 0; d < ndim; d++) mean[d] += complement[picked[j] * ndim + d];
        for (let d = 0; d < ndim; d++) mean[d] /= s;
        for (let d = 0; d < ndim; d++) proposals[i * ndim + d] = walkers[i * ndim + d];
        for (let j = 0; j < s; j++) {
          const z = rng.normal();
          for (let d = 0; d < ndim; d++) proposals[i * ndim + d] += z * (complement[picked[j] * ndim + d] - mean[d]);
        }
        logFactors[i] = 0;
      }
    },
  };
}

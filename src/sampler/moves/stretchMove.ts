/**
 * The stretch move of Goodman & Weare (2010, CAMCoS 5, 65, eqs. 7-10). Walker X_k moves along the line
 * through a random walker X_j of the complementary half: Y = X_j + z (X_k - X_j), where z has density
 * g(z) ∝ 1/sqrt(z) on [1/a, a]. Drawing z by inverting its CDF gives z = ((a - 1) u + 1)^2 / a. The
 * proposal is accepted with probability min(1, z^(ndim-1) p(Y) / p(X_k)), so the log proposal factor is
 * (ndim - 1) log z. The move is affine-invariant: it commutes with any affine map of the parameters.
 */
import type { SamplerRng } from '../rng.js';
import type { Move, ProposalInput } from './move.js';

export interface StretchOptions {
  /** The scale a > 1 of the stretch distribution; Goodman & Weare use a = 2. */
  a?: number;
}

export function stretchMove(options: StretchOptions = {}): Move {
  const a = options.a ?? 2;
  if (!(a > 1) || !Number.isFinite(a)) {
    throw new RangeError(`the stretch move's scale a must be a finite number above 1, got ${a}`);
  }
  return {
    name: 'stretch',
    propose(input: ProposalInput, rng: SamplerRng, proposals: Float64Array, logFactors: Float64Array): void {
      const { ndim, walkers, nUpdate, complement, nComplement } = input;
      for (let i = 0; i < nUpdate; i++) {
        const t = (a - 1) * rng.uniform() + 1;
        const z = (t * t) / a;
        const j = rng.integer(nComplement);
        for (let d = 0; d < ndim; d++) {
          const xj = complement[j * ndim + d];
          proposals[i * ndim + d] = xj + z * (walkers[i * ndim + d] - xj);
        }
        logFactors[i] = (ndim - 1) * Math.log(z);
      }
    },
  };
}

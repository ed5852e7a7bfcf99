/**
 * Checks on an ensemble before it starts: enough walkers, finite log-probabilities, and walkers that span
 * the parameter space. A stretch or DE step moves a walker within the affine hull of the ensemble, so an
 * ensemble that starts on a line (or any lower-dimensional subspace) stays there forever (Goodman & Weare
 * 2010, section 3); the sampler would run, look converged, and be wrong.
 */
import { SamplingError } from '../core/errors.js';

/** Goodman & Weare's moves need at least 2 ndim walkers (each half must span the space). */
export function checkWalkerCount(nWalkers: number, ndim: number): void {
  if (!Number.isInteger(nWalkers) || nWalkers < 2 * ndim) {
    throw new SamplingError(`need at least 2 x ndim = ${2 * ndim} walkers for ${ndim} parameters, got ${nWalkers}`, {
      found: nWalkers,
      expected: `an integer >= ${2 * ndim}`,
      hint: `each half of the ensemble must span the ${ndim}-dimensional parameter space for the moves to reach all of it; raise the number of walkers (config key sampler.walkers) to ${2 * ndim} or more (4 x ndim is a comfortable choice)`,
    });
  }
}

/** Every walker's log-probability must be finite at the start. */
export function checkInitialLogProb(logProb: Float64Array, positions: Float64Array, ndim: number, ensemble = 0): void {
  for (let w = 0; w < logProb.length; w++) {
    const lp = logProb[w];
    if (!Number.isFinite(lp)) {
      throw new SamplingError(`the initial log-probability of walker ${w} is ${lp}${ensemble ? ` (ensemble ${ensemble})` : ''}`, {
        found: Array.from(positions.subarray(w * ndim, (w + 1) * ndim)),
        expected: 'a finite log-probability for every starting walker',
        hint: 'start the walkers inside the support of the posterior (check the initial point and the priors\' bounds)',
      });
    }
  }
}

/**
 * Refuse an ensemble whose walkers lie (to 1e-10 in relative variance) in a lower-dimensional subspace.
 * The test: a Cholesky factorisation of the walkers' correlation matrix. Its k-th squared pivot is the
 * fraction of parameter k's variance not explained linearly by parameters 0..k-1, i.e. 1 - R^2 of that
 * regression; a pivot near zero means parameter k is (nearly) a linear combination of the others.
 */
export function checkNotDegenerate(positions: Float64Array, nWalkers: number, ndim: number, ensemble = 0, tolerance = 1e-10): void {
  const where = ensemble ? ` of ensemble ${ensemble}` : '';
  const mean = new Float64Array(ndim);
  for (let w = 0; w < nWalkers; w++) for (let d = 0; d < ndim; d++) mean[d] += positions[w * ndim + d];
  for (let d = 0; d < ndim; d++) mean[d] /= nWalkers;
  const cov = new Float64Array(ndim * ndim);
  for (let w = 0; w < nWalkers; w++) {
    for (let i = 0; i < ndim; i++) {
      const di = positions[w * ndim + i] - mean[i];
      for (let j = 0; j <= i; j++) cov[i * ndim + j] += di * (positions[w * ndim + j] - mean[j]);
    }
  }
  for (let d = 0; d < ndim; d++) {
    const v = cov[d * ndim + d];
    if (!(v > 0) || v <= 1e-300 * nWalkers) {
      throw new SamplingError(`the initial ensemble${where} is degenerate: every walker has the same value of parameter ${d} (${mean[d]})`, {
        expected: 'walkers spread in every parameter',
        hint: 'give the initial ball a positive width in every parameter',
      });
    }
  }
  // Correlation matrix, then Cholesky; l holds the factor.
  const l = new Float64Array(ndim * ndim);
  for (let i = 0; i < ndim; i++) {
    for (let j = 0; j <= i; j++) {
      let s = cov[i * ndim + j] / Math.sqrt(cov[i * ndim + i] * cov[j * ndim + j]);
      for (let k = 0; k < j; k++) s -= l[i * ndim + k] * l[j * ndim + k];
      if (i === j) {
        if (!(s > tolerance)) {
          throw new SamplingError(
            `the initial ensemble${where} is degenerate: the walkers lie in a lower-dimensional subspace (parameter ${i} is a linear combination of ${i === 1 ? 'parameter 0' : `parameters 0-${i - 1}`}, unexplained variance ${s.toExponential(2)})`,
            {
              expected: `walkers that span all ${ndim} dimensions`,
              hint: 'an affine-invariant move never leaves the subspace the walkers start in: draw them from a full-dimensional ball or from the prior',
            },
          );
        }
        l[i * ndim + i] = Math.sqrt(s);
      } else {
        l[i * ndim + j] = s / l[j * ndim + j];
      }
    }
  }
}

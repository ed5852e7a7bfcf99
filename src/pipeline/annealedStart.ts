/**
 * Global start search for `coeval fit`: Nelder-Mead by continuation in the photometric error floor.
 *
 * With thousands of stars and errors of a few hundredths of a magnitude, the log-posterior is a ridge in
 * age, [Fe/H], distance and reddening a few 1e-4 dex wide and thousands of units high, with false local
 * modes beside it (an isochrone of another age matched to part of the sequence). A local optimiser started
 * from prior draws ends in whichever mode is nearest. Adding an error floor s in quadrature to every
 * star's errors (the likelihood's sigma_extra, held fixed at s) blurs the CMD: the ridge widens, the false
 * modes merge into the true basin, and Nelder-Mead finds it. Lowering s step by step and optimising again
 * from the previous answer follows the basin down to the real posterior. This is continuation (graduated
 * smoothing) in the sense of Blake & Zisserman (1987, Visual Reconstruction, MIT Press), applied through a
 * parameter that the model already has. The last stage, with sigma_extra as the priors say, is the fit's
 * own optimiser on the worker pool.
 *
 * Runs in the calling thread, on likelihoods of a subset of the stars (the caller chooses one per floor:
 * a blurred CMD shows its basin with few stars, and the cost of an evaluation grows with the floor), since
 * the pool's posterior cannot hold sigma_extra at a value its prior does not allow.
 */
import type { CmdLikelihood } from '../likelihood/cmdLikelihood.js';
import { CLUSTER_PARAMETER_NAMES } from '../core/parameters.js';
import type { ParameterSpace } from '../priors/index.js';
import { nelderMead } from '../sampler/index.js';

/** Error floors in magnitudes, largest first. 0.2 mag blurs a CMD beyond its turnoff-subgiant structure. */
export const ERROR_FLOOR_SCHEDULE = [0.2, 0.1, 0.05, 0.025, 0.012] as const;

const SIGMA = CLUSTER_PARAMETER_NAMES.indexOf('sigma_extra');
const F_FIELD = CLUSTER_PARAMETER_NAMES.indexOf('f_field');

/** The log-posterior at free parameters `x` with sigma_extra held at `floor` (-Infinity outside the prior). */
export function blurredLogPosterior(likelihood: CmdLikelihood, space: ParameterSpace, x: ArrayLike<number>, floor: number): number {
  const lp = space.logPrior(x);
  if (!(lp > -Infinity)) return -Infinity;
  const full = space.expand(x, new Float64Array(CLUSTER_PARAMETER_NAMES.length));
  full[SIGMA] = floor;
  if (Number.isNaN(full[F_FIELD])) full[F_FIELD] = 0;
  const ll = likelihood.evaluate(full);
  return Number.isNaN(ll) ? -Infinity : lp + ll;
}

export interface AnnealedStartResult {
  /** The answers, one per start, in the free parameters (sigma_extra, if free, as it started). */
  points: Float64Array[];
  /** Log-posterior of each answer at the smallest error floor. */
  logPosterior: number[];
  evaluations: number;
}

/**
 * Anneal `starts` (free-parameter vectors) through the error-floor schedule as a beam: every point is
 * optimised at a floor, then only the best `keep` go on to the next. Starting wider than the beam keeps is
 * what makes the search global: the first, most blurred, stage still has a few basins, and a search from
 * two points can end in the wrong one. `spread` is each free parameter's prior scale: Nelder-Mead works in
 * coordinates divided by it.
 */
export async function annealedStart(
  likelihoodAt: (floor: number) => CmdLikelihood,
  space: ParameterSpace,
  starts: readonly Float64Array[],
  spread: Float64Array,
  keep: number = starts.length,
  schedule: readonly number[] = ERROR_FLOOR_SCHEDULE,
): Promise<AnnealedStartResult> {
  const ndim = space.free.length;
  const sigmaFree = space.freeIndex[SIGMA];
  // The coordinates Nelder-Mead moves: every free parameter except sigma_extra, which each stage sets.
  const moved = Array.from({ length: ndim }, (_, j) => j).filter((j) => j !== sigmaFree);
  let evaluations = 0;
  const logPosteriorAt = (x: Float64Array, floor: number): number => {
    evaluations++;
    return blurredLogPosterior(likelihoodAt(floor), space, x, floor);
  };
  let beam = starts.map((s) => ({ x: Float64Array.from(s), lp: -Infinity }));
  for (const [stage, floor] of schedule.entries()) {
    for (const point of beam) {
      const x = point.x;
      const objective = (z: Float64Array): number => {
        moved.forEach((j, k) => (x[j] = z[k] * spread[j]));
        const v = logPosteriorAt(x, floor);
        return Number.isFinite(v) ? -v : Number.MAX_VALUE;
      };
      const z0 = Float64Array.from(moved, (j) => x[j] / spread[j]);
      // Wide first steps at the blurred stages, where the basin is wide; then steps near the basin's width.
      // A blurred stage only has to land in the right basin, not at its floor: a loose tolerance and an
      // iteration cap keep the search to about a thousand evaluations per start.
      const step = new Float64Array(moved.length).fill(stage === 0 ? 0.3 : stage < 2 ? 0.05 : 0.01);
      const last = stage === schedule.length - 1;
      const r = await nelderMead(objective, z0, { step, fTolerance: last ? 0.05 : 0.5, xTolerance: 1e-3, maxIterations: (last ? 100 : 40) * moved.length });
      moved.forEach((j, k) => (x[j] = r.x[k] * spread[j]));
      point.lp = -r.f;
    }
    beam = beam.sort((a, b) => b.lp - a.lp).slice(0, keep);
  }
  return { points: beam.map((p) => p.x), logPosterior: beam.map((p) => p.lp), evaluations };
}

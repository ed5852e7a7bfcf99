/**
 * The start search of `coeval fit` (init = "optimum"): from prior draws to the posterior's mode. The
 * global part, continuation in an error floor, is annealedStart.ts; this module chooses the draws, the
 * subsets of stars the blurred stages use, and polishes the answers on the worker pool.
 */
import { SamplingError } from '../core/errors.js';
import type { CmdLikelihood } from '../likelihood/cmdLikelihood.js';
import { selectStars } from '../likelihood/spec.js';
import type { ParameterSpace } from '../priors/index.js';
import { nelderMead, SamplerRng, type Evaluator } from '../sampler/index.js';
import { annealedStart, blurredLogPosterior, ERROR_FLOOR_SCHEDULE } from './annealedStart.js';

const now = (): number => performance.now();

/** The draws the optimiser starts from: the best of many prior draws with a finite posterior. */
async function priorDraws(evaluator: Evaluator, space: ParameterSpace, rng: SamplerRng, count: number): Promise<{ x: Float64Array[]; logProb: number[] }> {
  const ndim = space.free.length;
  const found: { x: Float64Array; lp: number }[] = [];
  const blobs = evaluator.blobNames.length;
  for (let round = 0; round < 5 && found.length < count; round++) {
    const batch = new Float64Array(count * ndim);
    const one = new Float64Array(ndim);
    for (let i = 0; i < count; i++) {
      space.drawFromPrior(() => rng.uniform(), one);
      batch.set(one, i * ndim);
    }
    const lp = new Float64Array(count);
    await evaluator.evaluate(batch, count, lp, new Float64Array(count * blobs));
    for (let i = 0; i < count; i++) {
      if (Number.isNaN(lp[i])) throw new SamplingError('the log-posterior is NaN at a prior draw', { found: Array.from(batch.subarray(i * ndim, (i + 1) * ndim)) });
      if (lp[i] > -Infinity) found.push({ x: batch.slice(i * ndim, (i + 1) * ndim), lp: lp[i] });
    }
  }
  if (found.length === 0) {
    throw new SamplingError(`none of ${5 * count} draws from the prior has a finite posterior`, {
      hint: 'check that the priors on age and [Fe/H] lie inside the stellar model, and that the distance and reddening priors put the cluster inside the selection window',
    });
  }
  found.sort((a, b) => b.lp - a.lp);
  return { x: found.map((f) => f.x), logProb: found.map((f) => f.lp) };
}

/**
 * The blurred stages only have to find the basin of the posterior, and a CMD blurred by a floor s shows it
 * with a few hundred stars as well as with all of them, at a fraction of the cost. An evaluation's cost
 * grows with the number of stars and with s (a star's Gaussian then covers more of the isochrone), so each
 * floor gets about SEARCH_STARS x 0.025 / s stars (between SEARCH_STARS / 4 and SEARCH_STARS), nested
 * subsets of one random draw from the catalogue. The polish that follows uses every star.
 */
export const SEARCH_STARS = 600;

/** Prior draws optimised on the most blurred CMD, of which the best `starts` go on down the floors. */
export function beamWidth(starts: number): number {
  return Math.max(8, starts);
}

async function searchLikelihoods(full: CmdLikelihood, rng: SamplerRng): Promise<(floor: number) => CmdLikelihood> {
  const n = full.nStars;
  // A random permutation (Fisher-Yates, stopped once SEARCH_STARS are placed); subsets are its prefixes.
  const idx = Int32Array.from({ length: n }, (_, i) => i);
  const m = Math.min(n, SEARCH_STARS);
  for (let k = 0; k < m; k++) {
    const j = k + rng.integer(n - k);
    const tmp = idx[k];
    idx[k] = idx[j];
    idx[j] = tmp;
  }
  const { CmdLikelihood: Likelihood } = await import('../likelihood/cmdLikelihood.js');
  const bySize = new Map<number, CmdLikelihood>();
  return (floor: number): CmdLikelihood => {
    const size = Math.min(n, Math.round(Math.min(SEARCH_STARS, Math.max(SEARCH_STARS / 4, (SEARCH_STARS * 0.025) / floor))));
    if (size === n) return full;
    let lik = bySize.get(size);
    if (!lik) {
      lik = new Likelihood(selectStars(full.data, idx.slice(0, size).sort()), full.source, full.extinction, full.options);
      bySize.set(size, lik);
    }
    return lik;
  };
}

/**
 * The mode the walkers start near: prior draws evaluated on the pool; the best beamWidth(starts) of them,
 * ranked on the most blurred CMD, followed down the error floors (annealedStart.ts) on subsets of the
 * stars; then Nelder-Mead on the pool with every star from the best `starts` of those and the best
 * `starts` prior draws (concurrently, so the pool evaluates them together). Tolerances suit a start: a
 * log-posterior within 0.05 of the mode is well inside its 1-sigma region, and the walkers then spread
 * out from the Laplace approximation there (laplaceStart.ts).
 */
export async function findStart(evaluator: Evaluator, space: ParameterSpace, seed: number, starts: number, likelihood: CmdLikelihood, log: (line: string) => void): Promise<{ best: Float64Array; spread: Float64Array; runs: { logPosterior: number; iterations: number; converged: boolean }[]; evaluations: number }> {
  const ndim = space.free.length;
  const rng = SamplerRng.fromSeed(seed, 0xfffffff0);
  const nDraws = Math.max(64 * ndim, 4 * starts);
  let t = now();
  const stageTime = (): string => {
    const s = ((now() - t) / 1000).toFixed(1);
    t = now();
    return s;
  };
  const draws = await priorDraws(evaluator, space, rng, nDraws);
  log(`  ${nDraws} prior draws on the posterior: ${stageTime()} s`);
  // Each parameter's scale: the spread of its prior (from quantiles; works for unbounded priors too).
  const spread = Float64Array.from(space.priors, (p) => {
    const s = p.fromUnit(0.84) - p.fromUnit(0.16);
    return s > 0 && Number.isFinite(s) ? s / 2 : 1;
  });
  let evaluations = nDraws;
  const blobs = evaluator.blobNames.length;
  // Nelder-Mead works in coordinates scaled by each prior's spread, so that one tolerance suits all.
  const negLogProb = async (z: Float64Array): Promise<number> => {
    const x = Float64Array.from(z, (v, j) => v * spread[j]);
    const out = new Float64Array(1);
    await evaluator.evaluate(x, 1, out, new Float64Array(blobs));
    evaluations++;
    if (Number.isNaN(out[0])) throw new SamplingError('the log-posterior is NaN at a point the optimiser tried', { found: Array.from(x) });
    return -out[0];
  };
  const step = new Float64Array(ndim).fill(0.1);
  const restartStep = new Float64Array(ndim).fill(0.02);
  // Nelder-Mead stalls on narrow curved ridges (the age-[Fe/H]-distance degeneracy of a CMD, thousands of
  // log-posterior units high for a large catalogue with small errors); restarting it from its own answer
  // with a fresh simplex until a restart gains less than 0.5 is the usual remedy (Press et al. 2007,
  // Numerical Recipes 3rd ed., section 10.5).
  const opts = { fTolerance: 0.05, xTolerance: 1e-3, maxIterations: 150 * ndim };
  type Polished = { x: Float64Array; f: number; iterations: number; converged: boolean };
  const climb = async (x0: Float64Array): Promise<Polished> => {
    const r = await nelderMead(negLogProb, Float64Array.from(x0, (v, j) => v / spread[j]), { ...opts, step });
    return { x: r.x, f: r.f, iterations: r.iterations, converged: r.converged };
  };
  const restartUntilFlat = async (start: Polished): Promise<Polished> => {
    let r = start;
    let iterations = r.iterations;
    for (let k = 0; k < 8; k++) {
      const again = await nelderMead(negLogProb, r.x, { ...opts, step: restartStep });
      iterations += again.iterations;
      const gain = r.f - again.f;
      if (again.f < r.f) r = { x: again.x, f: again.f, iterations, converged: again.converged };
      if (!(gain > 0.5)) break;
    }
    return { ...r, iterations };
  };
  // Global stage (annealedStart.ts): the prior draws ranked on the CMD blurred by the largest error floor,
  // the best few followed down the error-floor schedule in this thread; then the local polish on the pool.
  const searchAt = await searchLikelihoods(likelihood, rng);
  const blurred = draws.x.map((x) => blurredLogPosterior(searchAt(ERROR_FLOOR_SCHEDULE[0]), space, x, ERROR_FLOOR_SCHEDULE[0]));
  evaluations += draws.x.length;
  const ranked = draws.x.map((x, i) => ({ x, lp: blurred[i] })).sort((a, b) => b.lp - a.lp);
  log(`  the same ranked on the blurred CMD: ${stageTime()} s`);
  const annealed = await annealedStart(searchAt, space, ranked.slice(0, Math.min(beamWidth(starts), ranked.length)).map((r) => r.x), spread, starts);
  evaluations += annealed.evaluations;
  log(`  continuation down the error floors: ${annealed.evaluations} evaluations, ${stageTime()} s`);
  // The best prior draws on the real posterior are polished too, so the search never does worse than a
  // purely local start from them (on a small catalogue the blurred CMD can favour another basin).
  const candidates = [...annealed.points, ...draws.x.slice(0, Math.min(starts, draws.x.length))];
  const before = evaluations;
  // One climb from every candidate (concurrently, so the pool evaluates them together); the restarts,
  // which creep along the ridge and cost most, only from the candidates that ended within 50 of the best.
  // A climb stalled on the ridge ends a few units below its top (restarts gain less than that); a candidate
  // 50 below the best after a full climb sits in another basin (false modes in the injection clusters lie
  // 1,000-2,000 below the true one), and restarting it costs thousands of evaluations for nothing.
  const results = await Promise.all(candidates.map((x0) => climb(x0)));
  const fBest = Math.min(...results.map((r) => r.f));
  const finals = await Promise.all(results.map((r) => (r.f <= fBest + 50 ? restartUntilFlat(r) : r)));
  results.splice(0, results.length, ...finals);
  log(`  Nelder-Mead on the posterior: ${evaluations - before} evaluations, ${stageTime()} s`);
  for (const r of results) for (let j = 0; j < ndim; j++) r.x[j] *= spread[j];
  let best = 0;
  for (let i = 1; i < results.length; i++) if (results[i].f < results[best].f) best = i;
  return { best: Float64Array.from(results[best].x), spread, runs: results.map((r) => ({ logPosterior: -r.f, iterations: r.iterations, converged: r.converged })), evaluations };
}

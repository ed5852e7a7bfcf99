/**
 * Starting positions for an ensemble, three ways: a Gaussian ball around a given point; independent draws
 * from the prior; or a ball around the posterior mode that Nelder–Mead finds from several prior draws.
 * Walkers whose log-probability is not finite are redrawn; a walker that keeps failing stops the run with
 * the values it was tried at. All draws come from the ensemble's own random stream, so the start, like
 * the chain, depends on the seed alone.
 */
import { SamplingError } from '../core/errors.js';
import { checkNotDegenerate, checkWalkerCount } from './checkEnsemble.js';
import type { EnsembleStart } from './ensembleSampler.js';
import type { Evaluator } from './evaluator.js';
import { nelderMead } from './nelderMead.js';
import type { SamplerRng } from './rng.js';

/** Random numbers for a prior sampler: draw from these only, so that the start is reproducible. */
export interface RandomSource {
  uniform(): number;
  normal(): number;
}

/** Writes one draw from the prior into `out` (length ndim). */
export type PriorSampler = (rng: RandomSource, out: Float64Array) => void;

export type InitMethod =
  | {
      kind: 'ball';
      center: ArrayLike<number>;
      /** Standard deviation of the ball, one for all parameters or one per parameter. */
      scale: number | ArrayLike<number>;
    }
  | { kind: 'prior'; draw: PriorSampler }
  | {
      kind: 'optimum';
      draw: PriorSampler;
      /** Nelder–Mead runs, each from its own prior draw; the best optimum wins. Default 4. */
      starts?: number;
      /** Ball width as a fraction of each parameter's spread among the prior draws; default 1e-3. */
      relativeScale?: number;
      /** Iteration cap of each Nelder–Mead run; default 200 ndim. */
      maxIterations?: number;
    };

export interface InitOptions {
  nWalkers: number;
  evaluator: Evaluator;
  rng: SamplerRng;
  /** Draws tried per walker before giving up; default 100. */
  maxAttempts?: number;
  /** Ensemble index, for messages. */
  ensemble?: number;
}

/** What the optimum initialisation found, for the run's log. */
export interface OptimumReport {
  x: Float64Array;
  logProb: number;
  /** Each run's final log-probability, in start order. */
  runs: { logProb: number; iterations: number; converged: boolean }[];
}

export async function initializeEnsemble(method: InitMethod, options: InitOptions): Promise<EnsembleStart & { optimum?: OptimumReport }> {
  const { nWalkers, evaluator, rng } = options;
  const ndim = evaluator.ndim;
  checkWalkerCount(nWalkers, ndim);
  let draw: (out: Float64Array) => void;
  let optimum: OptimumReport | undefined;
  switch (method.kind) {
    case 'ball': {
      const center = checkVector(method.center, ndim, 'the centre of the initial ball');
      const scale = typeof method.scale === 'number' ? new Float64Array(ndim).fill(method.scale) : checkVector(method.scale, ndim, 'the scale of the initial ball');
      draw = ballSampler(center, scale, rng);
      break;
    }
    case 'prior':
      draw = (out) => method.draw(rng, out);
      break;
    case 'optimum': {
      const found = await findOptimum(method, options);
      optimum = { x: found.x, logProb: found.logProb, runs: found.runs };
      draw = ballSampler(found.x, found.scale, rng);
      break;
    }
  }
  const start = await drawFinite(draw, options);
  checkNotDegenerate(start.positions, nWalkers, ndim, options.ensemble ?? 0);
  return optimum ? { ...start, optimum } : start;
}

function ballSampler(center: Float64Array, scale: Float64Array, rng: SamplerRng): (out: Float64Array) => void {
  return (out) => {
    for (let d = 0; d < center.length; d++) out[d] = center[d] + scale[d] * rng.normal();
  };
}

function checkVector(v: ArrayLike<number>, ndim: number, what: string): Float64Array {
  if (v.length !== ndim) throw new SamplingError(`${what} has ${v.length} values, expected ${ndim} (one per parameter)`);
  const out = Float64Array.from(v);
  const bad = out.findIndex((x) => !Number.isFinite(x));
  if (bad >= 0) throw new SamplingError(`${what} has a non-finite value (${out[bad]}) for parameter ${bad}`);
  return out;
}

/**
 * Draw every walker, evaluate them all at once, and redraw those whose log-probability is not finite,
 * round after round, until all are finite or one walker has used its attempts.
 */
async function drawFinite(draw: (out: Float64Array) => void, options: InitOptions): Promise<EnsembleStart> {
  const { nWalkers, evaluator } = options;
  const ndim = evaluator.ndim;
  const nBlobs = evaluator.blobNames.length;
  const maxAttempts = options.maxAttempts ?? 100;
  const positions = new Float64Array(nWalkers * ndim);
  const logProb = new Float64Array(nWalkers);
  const blobs = new Float64Array(nWalkers * nBlobs);
  let pending = Array.from({ length: nWalkers }, (_, w) => w);
  const one = new Float64Array(ndim);
  for (let attempt = 1; pending.length > 0; attempt++) {
    const batch = new Float64Array(pending.length * ndim);
    for (let i = 0; i < pending.length; i++) {
      draw(one);
      batch.set(one, i * ndim);
    }
    const lp = new Float64Array(pending.length);
    const bl = new Float64Array(pending.length * nBlobs);
    await evaluator.evaluate(batch, pending.length, lp, bl);
    const failed: number[] = [];
    for (let i = 0; i < pending.length; i++) {
      const w = pending[i];
      positions.set(batch.subarray(i * ndim, (i + 1) * ndim), w * ndim);
      logProb[w] = lp[i];
      blobs.set(bl.subarray(i * nBlobs, (i + 1) * nBlobs), w * nBlobs);
      if (!Number.isFinite(lp[i])) failed.push(w);
    }
    if (failed.length > 0 && attempt >= maxAttempts) {
      const w = failed[0];
      const at = Array.from(positions.subarray(w * ndim, (w + 1) * ndim));
      throw new SamplingError(
        `could not start walker ${w}${options.ensemble ? ` of ensemble ${options.ensemble}` : ''}: after ${maxAttempts} draws its log-probability is still not finite (the last draw gave ${logProb[w]})${failed.length > 1 ? `; ${failed.length - 1} other walker(s) failed too` : ''}`,
        {
          found: at,
          expected: 'starting points where the log-probability is finite',
          hint: 'check that the initial point or the prior lies inside the support of the posterior, and that the log-density returns -Infinity (not NaN) outside it',
        },
      );
    }
    pending = failed;
  }
  return { positions, logProb, blobs };
}

async function findOptimum(method: Extract<InitMethod, { kind: 'optimum' }>, options: InitOptions): Promise<OptimumReport & { scale: Float64Array }> {
  const { evaluator, rng } = options;
  const ndim = evaluator.ndim;
  const starts = method.starts ?? 4;
  if (!Number.isInteger(starts) || starts < 1) throw new RangeError(`the number of optimiser starts must be a positive integer, got ${starts}`);
  // Prior draws with a finite log-probability: the optimiser starts, and a measure of each parameter's scale.
  const nDraws = Math.max(starts, 2 * ndim + 2);
  const draws = await drawFinite((out) => method.draw(rng, out), { ...options, nWalkers: nDraws });
  const spread = new Float64Array(ndim);
  for (let d = 0; d < ndim; d++) {
    let m = 0;
    for (let i = 0; i < nDraws; i++) m += draws.positions[i * ndim + d] / nDraws;
    let v = 0;
    for (let i = 0; i < nDraws; i++) v += (draws.positions[i * ndim + d] - m) ** 2 / (nDraws - 1);
    spread[d] = Math.sqrt(v) > 0 ? Math.sqrt(v) : Math.max(Math.abs(m), 1e-3);
  }
  const negLogProb = async (x: Float64Array): Promise<number> => {
    // Buffers per call: the runs evaluate concurrently.
    const lpOut = new Float64Array(1);
    await evaluator.evaluate(x, 1, lpOut, new Float64Array(evaluator.blobNames.length));
    const lp = lpOut[0];
    if (Number.isNaN(lp) || lp === Number.POSITIVE_INFINITY) {
      throw new SamplingError(`the log-probability is ${lp} at a point the optimiser tried`, {
        found: Array.from(x),
        expected: 'a finite number, or -Infinity outside the support',
      });
    }
    return -lp;
  };
  // Runs go concurrently, so a worker pool evaluates several at once; each is deterministic by itself.
  const step = Float64Array.from(spread, (s) => 0.1 * s);
  const results = await Promise.all(
    Array.from({ length: starts }, (_, i) =>
      nelderMead(negLogProb, draws.positions.subarray(i * ndim, (i + 1) * ndim), { step, maxIterations: method.maxIterations, fTolerance: 1e-9, xTolerance: 1e-7 * Math.max(...spread) }),
    ),
  );
  let best = 0;
  for (let i = 1; i < starts; i++) if (results[i].f < results[best].f) best = i;
  const relativeScale = method.relativeScale ?? 1e-3;
  return {
    x: Float64Array.from(results[best].x),
    logProb: -results[best].f,
    runs: results.map((r) => ({ logProb: -r.f, iterations: r.iterations, converged: r.converged })),
    scale: Float64Array.from(spread, (s) => relativeScale * s),
  };
}

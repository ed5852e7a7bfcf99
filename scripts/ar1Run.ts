/**
 * Analytic stand-in for the sampler: ensembles of walkers whose parameters follow independent AR(1)
 * processes around a Gaussian target, x_t = mu + sd (rho y_{t-1} + sqrt(1 - rho^2) e_t), started from the
 * stationary distribution. Their integrated autocorrelation time is known, (1 + rho) / (1 - rho), so
 * storage, diagnostics and summaries can be exercised on chains of any size without a sampler. Faults can
 * be injected: a stuck walker (frozen, never accepting) and a shifted ensemble (another "mode").
 */
import mt19937 from '@stdlib/random-base-mt19937';
import { coevalVersion } from '../src/core/version.js';
import type { ParameterInfo } from '../src/core/parameters.js';
import { createRunDirectory, newRunId, RUN_FORMAT, RUN_LAYOUT, RunChainWriter, type RunManifest } from '../src/io/index.js';
import type { EnsembleState } from '../src/sampler/types.js';

export interface Ar1Options {
  parameters: readonly ParameterInfo[];
  /** Target means and standard deviations, one per parameter. */
  mean: readonly number[];
  sd: readonly number[];
  rho: number;
  nWalkers: number;
  nSteps: number;
  seed: number;
  /** Index of the ensemble (for the states it yields). */
  ensemble?: number;
  /** Probability that a walker's proposal counts as accepted at a step (cosmetic: the value moves anyway). */
  acceptance?: number;
  /** Walkers that stop moving after the first step and never accept. */
  stuckWalkers?: readonly number[];
  /** Added to every parameter's mean, in units of its sd (an ensemble in another mode). */
  shiftSd?: number;
}

/** The states of one ensemble, step 1 .. nSteps. The yielded object is reused between steps. */
export function* ar1States(o: Ar1Options): Generator<EnsembleState> {
  const rand = mt19937.factory({ seed: o.seed });
  const uniform = (): number => (rand() + 0.5) / 4294967296;
  const normal = (): number => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
  const ndim = o.parameters.length;
  const nw = o.nWalkers;
  const y = new Float64Array(nw * ndim).map(normal);
  const innov = Math.sqrt(1 - o.rho * o.rho);
  const stuck = new Set(o.stuckWalkers ?? []);
  const acceptance = o.acceptance ?? 0.35;
  const shift = o.shiftSd ?? 0;
  const state: EnsembleState = {
    ensemble: o.ensemble ?? 0,
    step: 0,
    nWalkers: nw,
    ndim,
    positions: new Float64Array(nw * ndim),
    logProb: new Float64Array(nw),
    nBlobs: 2,
    blobs: new Float64Array(nw * 2),
    accepted: new Uint8Array(nw),
  };
  for (let step = 1; step <= o.nSteps; step++) {
    state.step = step;
    for (let w = 0; w < nw; w++) {
      const frozen = stuck.has(w) && step > 1;
      let logLike = 0;
      for (let j = 0; j < ndim; j++) {
        const i = w * ndim + j;
        if (!frozen) y[i] = o.rho * y[i] + innov * normal();
        state.positions[i] = o.mean[j] + o.sd[j] * (y[i] + shift);
        logLike -= 0.5 * (y[i] + shift) * (y[i] + shift);
      }
      state.accepted[w] = frozen ? 0 : uniform() < acceptance ? 1 : 0;
      state.logProb[w] = logLike;
      state.blobs[2 * w] = 0;
      state.blobs[2 * w + 1] = logLike;
    }
    yield state;
  }
}

/** Blob names of the states above: the chain writer fills log_prior and log_likelihood from them. */
export const AR1_BLOB_NAMES = ['log_prior', 'log_likelihood'] as const;

export interface Ar1RunOptions extends Omit<Ar1Options, 'ensemble' | 'seed' | 'stuckWalkers' | 'shiftSd'> {
  nEnsembles: number;
  /** Seed of ensemble k is seed + k. */
  seed: number;
  /** Steps between flushes (checkpoints). */
  flushEvery?: number;
  /** Leave the chain files open, as a run that is still going (or crashed) leaves them. */
  leaveOpen?: boolean;
  /** Faults: stuck walkers of an ensemble, and a shift (in sd) of one ensemble. */
  stuck?: { ensemble: number; walkers: number[] };
  shifted?: { ensemble: number; sd: number };
}

/** Write a run directory (manifest.json and chains/) of AR(1) ensembles, as a fit would; returns its path. */
export function writeAr1Run(dir: string, o: Ar1RunOptions): string {
  const manifest: RunManifest = {
    format: RUN_FORMAT,
    runId: newRunId(),
    createdAt: new Date().toISOString(),
    coevalVersion: coevalVersion(),
    parameters: o.parameters.map((p) => ({ ...p })),
    nEnsembles: o.nEnsembles,
    nWalkers: o.nWalkers,
    seeds: Array.from({ length: o.nEnsembles }, (_, k) => o.seed + k),
    chainFiles: Array.from({ length: o.nEnsembles }, (_, k) => RUN_LAYOUT.chainFile(k)),
    provenance: { model: `analytic test-bed: independent AR(1) walkers (rho = ${o.rho}) around a Gaussian target; no stellar model, no photometric calibration` },
    status: o.leaveOpen ? 'running' : 'finished',
  };
  const path = createRunDirectory(dir, manifest);
  const sink = RunChainWriter.create(path, manifest, { blobNames: AR1_BLOB_NAMES });
  const gens = Array.from({ length: o.nEnsembles }, (_, k) =>
    ar1States({
      ...o,
      ensemble: k,
      seed: o.seed + k,
      stuckWalkers: o.stuck?.ensemble === k ? o.stuck.walkers : undefined,
      shiftSd: o.shifted?.ensemble === k ? o.shifted.sd : undefined,
    }),
  );
  for (let step = 1; step <= o.nSteps; step++) {
    for (const g of gens) sink.append(g.next().value as EnsembleState);
    if (o.flushEvery && step % o.flushEvery === 0) sink.flush();
  }
  if (o.leaveOpen) sink.flush();
  else sink.close();
  return path;
}

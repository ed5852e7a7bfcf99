/**
 * A sampler test-bed: the real sampler and the real chain files on an analytic target, written into an
 * ordinary run directory, so that `coeval diagnose` and `coeval summary` (and resume) can be tried and
 * tested without a catalogue or a stellar model. The target is a d-dimensional normal with means 1..d and
 * standard deviations 0.5, 1, 1.5, ..., whose posterior summaries are known exactly.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { UsageError } from '../core/errors.js';
import { coevalVersion } from '../core/version.js';
import { meetsThresholdsOfRows, tauOfRows } from '../diagnostics/index.js';
import { createRunDirectory, newRunId, openRunDirectory, RUN_FORMAT, RUN_LAYOUT, RunChainWriter, writeManifest, type RunManifest } from '../io/index.js';
import { createEnsembles, inThreadEvaluator, resumeEnsembles, runEnsembles, type LogDensity, type RunObserver, type RunResult, type StopRule } from '../sampler/index.js';
import { gaussianDensity } from '../sampler/targets/index.js';

export interface TestbedOptions {
  runDir: string;
  /** Dimensions of the normal target. */
  ndim?: number;
  nWalkers?: number;
  nEnsembles?: number;
  /** Steps (fixed), or the step cap with `auto`. */
  steps?: number;
  /** Stop automatically at 50 tau (the emcee practice), with `steps` as the cap. */
  auto?: boolean;
  seed?: number;
  /** Steps between checkpoints. */
  checkpointEvery?: number;
  /** Continue the run in `runDir` from its checkpoint (to `steps` in all). */
  resume?: boolean;
  /** Replace an existing run directory. */
  overwrite?: boolean;
  observers?: readonly RunObserver[];
}

/** The analytic answer: target means and standard deviations. */
export function testbedTarget(ndim: number): { mean: number[]; sd: number[] } {
  return { mean: Array.from({ length: ndim }, (_, j) => j + 1), sd: Array.from({ length: ndim }, (_, j) => 0.5 * (j + 1)) };
}

const BLOBS = ['log_prior', 'log_likelihood'];

/** The normal target with its log density reported as the likelihood (flat prior), for the chain columns. */
function target(ndim: number): LogDensity {
  const { mean, sd } = testbedTarget(ndim);
  const cov = new Float64Array(ndim * ndim);
  for (let j = 0; j < ndim; j++) cov[j * ndim + j] = sd[j] * sd[j];
  const g = gaussianDensity({ mean, cov });
  const none = new Float64Array(0);
  return {
    ndim,
    blobNames: BLOBS,
    evaluate(theta, blobsOut) {
      const lp = g.evaluate(theta, none);
      blobsOut[0] = 0;
      blobsOut[1] = lp;
      return lp;
    },
  };
}

interface TestbedRecord {
  ndim: number;
  steps: number;
  auto: boolean;
  seed: number;
}

export async function runTestbed(o: TestbedOptions): Promise<{ runDir: string; result: RunResult; manifest: RunManifest }> {
  let manifest: RunManifest;
  let dir: string;
  let rec: TestbedRecord;
  if (o.resume) {
    ({ dir, manifest } = openRunDirectory(o.runDir));
    const saved = (manifest as { testbed?: TestbedRecord }).testbed;
    if (!saved) throw new UsageError('this run directory was not made by `coeval testbed`, so it cannot be resumed here', { where: { file: dir } });
    rec = { ...saved, steps: o.steps ?? saved.steps };
  } else {
    rec = { ndim: o.ndim ?? 3, steps: o.steps ?? 2000, auto: o.auto ?? false, seed: o.seed ?? 1 };
    const nEnsembles = o.nEnsembles ?? 3;
    manifest = {
      format: RUN_FORMAT,
      runId: newRunId(),
      createdAt: new Date().toISOString(),
      coevalVersion: coevalVersion(),
      parameters: Array.from({ length: rec.ndim }, (_, j) => ({ name: `x${j}`, label: `x${j}`, unit: '' })),
      nEnsembles,
      nWalkers: o.nWalkers ?? 16,
      seeds: Array.from({ length: nEnsembles }, (_, k) => `${rec.seed}/${k}`),
      chainFiles: Array.from({ length: nEnsembles }, (_, k) => RUN_LAYOUT.chainFile(k)),
      provenance: {
        model: `sampler test-bed: ${rec.ndim}-D normal target (means 1..${rec.ndim}, sd 0.5 (j + 1)); no stellar model, no photometric calibration`,
      },
      status: 'running',
      testbed: rec,
    };
    dir = createRunDirectory(o.runDir, manifest, o.overwrite ? 'overwrite' : 'new');
  }
  const density = target(rec.ndim);
  const evaluator = inThreadEvaluator(density);
  const checkpointPath = join(dir, RUN_LAYOUT.checkpoint);
  const stop: StopRule = rec.auto ? { kind: 'auto', maxSteps: rec.steps, estimator: tauOfRows, convergence: meetsThresholdsOfRows } : { kind: 'fixed', steps: rec.steps };
  let samplers;
  let resumedFrom;
  let sink: RunChainWriter;
  if (o.resume) {
    if (!existsSync(checkpointPath)) throw new UsageError('the run directory has no checkpoint to resume from', { where: { file: checkpointPath } });
    const r = resumeEnsembles(checkpointPath, { evaluator });
    samplers = r.samplers;
    resumedFrom = r.checkpoint;
    sink = RunChainWriter.reopen(dir, manifest, { blobNames: BLOBS });
  } else {
    const { mean } = testbedTarget(rec.ndim);
    ({ samplers } = await createEnsembles({ evaluator, seed: rec.seed, nEnsembles: manifest.nEnsembles, nWalkers: manifest.nWalkers, init: { kind: 'ball', center: mean, scale: 0.1 } }));
    sink = RunChainWriter.create(dir, manifest, { blobNames: BLOBS });
  }
  const result = await runEnsembles({
    samplers,
    stop,
    sink,
    resumedFrom,
    checkpoint: { path: checkpointPath, everySteps: o.checkpointEvery ?? 500, meta: { runId: manifest.runId } },
    observers: o.observers,
    resumeHint: `coeval testbed gaussian ${o.runDir} --resume`,
  });
  manifest = { ...manifest, status: 'finished' };
  writeManifest(dir, manifest);
  return { runDir: dir, result, manifest };
}

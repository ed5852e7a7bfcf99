/**
 * Diagnose and summarise a run directory: read every ensemble's chains, choose the burn-in (given, or
 * suggested from tau), diagnose, and summarise. Works on a finished run, a running one, or one that
 * crashed (only complete batches are read, and the ensembles are lined up to the steps they all have).
 */
import { UsageError } from '../core/errors.js';
import { autocorrTime, chainsFromBuffer, diagnose, diagnosisOf, dropFirst, THRESHOLDS, type Chains, type DiagnoseInput, type Diagnosis } from '../diagnostics/index.js';
import { openRunDirectory, readRunChains, type RunDraws, type RunManifest } from '../io/index.js';
import { summarize, type Summary } from '../report/summary.js';
import { parameterDiagnosticsOnThreads } from './parameterDiagnosticsThreads.js';

export interface DiagnoseRunOptions {
  /** Stored steps to drop as burn-in; default: suggested from tau (see below). */
  discard?: number;
  /** Keep every thin-th stored step (emcee's convention); default 1. */
  thin?: number;
}

export interface RunDiagnosis {
  runDir: string;
  manifest: RunManifest;
  diagnosis: Diagnosis;
  summary: Summary;
  /** Whether the burn-in was given or suggested. */
  discardSource: 'given' | 'suggested';
  /** One line: ensembles, walkers, steps, burn-in, draws. */
  drawsLine: string;
  provenance: string;
  /** Chain files that were still open (running or crashed), and torn bytes ignored. */
  files: { path: string; nSteps: number; closed: boolean; tornBytes: number }[];
}

/** The manifest's provenance in one line; analytic test-beds say so. */
export function provenanceLine(manifest: RunManifest): string {
  const p = manifest.provenance;
  if (!p) return 'not recorded in manifest.json';
  return [p.model, p.calibration, ...(p.notes ?? [])].filter(Boolean).join('; ');
}

/**
 * Burn-in suggested without one given: tau is estimated on the second half of the chains (past any
 * burn-in a sensible run has), and THRESHOLDS.burnInTauMultiple tau_max steps are dropped, at most half
 * the chain.
 */
function suggestDiscard(draws: readonly Chains[], thin: number): number {
  const n = draws[0][0].length;
  const taus = draws.map((chains) => autocorrTime(dropFirst(chains, Math.floor(n / 2)), { skipConstant: true }).tau * thin).filter(Number.isFinite);
  if (taus.length === 0) return 0;
  return Math.min(Math.ceil(THRESHOLDS.burnInTauMultiple * Math.max(...taus)), Math.floor((n * thin) / 2));
}

/** A run read and cut to its kept draws, ready to be diagnosed. */
interface PreparedRun {
  dir: string;
  manifest: RunManifest;
  run: RunDraws;
  input: DiagnoseInput;
  discardDraws: number;
  discardSource: 'given' | 'suggested';
  spacing: number;
  totalSteps: number;
}

function prepareRun(runDirArg: string, opts: DiagnoseRunOptions, shared: boolean): PreparedRun {
  const { dir, manifest } = openRunDirectory(runDirArg);
  const thin = opts.thin ?? 1;
  if (!(Number.isInteger(thin) && thin >= 1)) throw new UsageError(`--thin must be a whole number >= 1, got ${thin}`);
  if (opts.discard !== undefined && !(Number.isInteger(opts.discard) && opts.discard >= 0)) throw new UsageError(`--discard must be a whole number >= 0, got ${opts.discard}`);
  const names = manifest.parameters.map((p) => p.name);
  // Only the parameters go to worker threads.
  const run = readRunChains(dir, manifest, { parameters: [...names, 'log_posterior'], thin, accepted: true, shared: shared ? names : false });
  const nChains = run.nEnsembles * run.nWalkers;
  if (run.nDraws < 8) {
    throw new UsageError(`the run has only ${run.nSteps} complete steps${thin > 1 ? ` (${run.nDraws} after thinning)` : ''}; diagnostics need at least 8 draws per walker`, {
      where: { file: dir },
      hint: 'let the run go on, then try again',
    });
  }
  const all = names.map((n) => chainsFromBuffer(run.values[n], run.nDraws, nChains));
  // Steps between consecutive draws: the read's thin times the sampler's own storage stride (a run that
  // stored every k-th step). Burn-in, tau and chain lengths below are in sampler steps.
  const spacing = run.nDraws >= 2 ? run.steps[1] - run.steps[0] : thin;
  const totalSteps = run.nDraws > 0 ? run.steps[run.nDraws - 1] : 0;
  const discardSource = opts.discard === undefined ? 'suggested' : 'given';
  const discard = opts.discard ?? suggestDiscard(all, spacing);
  const discardDraws = Math.ceil(discard / spacing);
  if (run.nDraws - discardDraws < 8) {
    throw new UsageError(`a burn-in of ${discard} steps leaves fewer than 8 draws per walker (the run has ${totalSteps} steps)`, { hint: 'give a smaller --discard' });
  }
  const draws = all.map((chains) => dropFirst(chains, discardDraws));
  const accepted = new Uint32Array(nChains);
  const acc = run.accepted as Uint8Array;
  for (let c = 0; c < nChains; c++) {
    let a = 0;
    for (let d = discardDraws; d < run.nDraws; d++) a += acc[c * run.nDraws + d];
    accepted[c] = a;
  }
  const input: DiagnoseInput = {
    parameters: manifest.parameters,
    draws,
    nEnsembles: run.nEnsembles,
    nWalkers: run.nWalkers,
    accepted,
    acceptanceSteps: run.nDraws - discardDraws,
    totalSteps,
    discard: discardDraws * spacing,
    thin: spacing,
    discardSuggested: discardSource === 'suggested',
  };
  return { dir, manifest, run, input, discardDraws, discardSource, spacing, totalSteps };
}

function finishRun(p: PreparedRun, diagnosis: Diagnosis): RunDiagnosis {
  const { dir, manifest, run, discardDraws, discardSource, spacing, totalSteps } = p;
  const nChains = run.nEnsembles * run.nWalkers;
  const logPosterior = dropFirst(chainsFromBuffer(run.values.log_posterior, run.nDraws, nChains), discardDraws);
  const provenance = provenanceLine(manifest);
  const summary = summarize(diagnosis, p.input.draws, logPosterior, provenance);
  const keptDraws = (run.nDraws - discardDraws) * nChains;
  const running = run.files.filter((f) => !f.closed).length;
  const drawsLine = `${run.nEnsembles} ensemble(s) x ${run.nWalkers} walkers, ${totalSteps.toLocaleString('en-US')} steps, burn-in ${(discardDraws * spacing).toLocaleString('en-US')} (${discardSource}${spacing > 1 ? `, a draw every ${spacing} steps` : ''}), ${keptDraws.toLocaleString('en-US')} draws${running ? `; ${running} chain file(s) still open (running or stopped)` : ''}`;
  return { runDir: dir, manifest, diagnosis, summary, discardSource, drawsLine, provenance, files: run.files };
}

/** Diagnose and summarise a run directory, in this thread. */
export function diagnoseRun(runDirArg: string, opts: DiagnoseRunOptions = {}): RunDiagnosis {
  const p = prepareRun(runDirArg, opts, false);
  return finishRun(p, diagnose(p.input));
}

export interface DiagnoseRunAsyncOptions extends DiagnoseRunOptions {
  /** Worker threads for the parameters (default: the available parallelism); 1 diagnoses in this thread. */
  threads?: number;
}

/**
 * `diagnoseRun` with the parameters diagnosed on worker threads: the same result, value for value, in
 * about half the time on two cores.
 */
export async function diagnoseRunAsync(runDirArg: string, opts: DiagnoseRunAsyncOptions = {}): Promise<RunDiagnosis> {
  const p = prepareRun(runDirArg, opts, true);
  const nChains = p.run.nEnsembles * p.run.nWalkers;
  const columns = p.manifest.parameters.map((info) => ({ values: p.run.values[info.name], nDraws: p.run.nDraws, nChains, discardDraws: p.discardDraws }));
  const per = await parameterDiagnosticsOnThreads(columns, p.run.nEnsembles, opts.threads);
  return finishRun(p, diagnosisOf(p.input, per));
}

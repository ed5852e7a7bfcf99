/**
 * `coeval fit`: the whole job, from one config to a run directory (design.md section 6).
 *
 *  1. check: the config and its catalogue as `coeval check` reads them (and a user grid, when named);
 *  2. the posterior: priors (buildParameterSpace) and the likelihood, built once here (which checks the
 *     catalogue against the selection window) and once per worker thread (posterior.ts);
 *  3. the run directory: manifest.json with the `fit` section (fitManifest.ts), created before any heavy work
 *     so that a name clash is found at once;
 *  4. initialisation: prior draws, the best of them polished by Nelder–Mead (each start runs concurrently on
 *     the worker pool), then every ensemble starts in a small ball around the best optimum;
 *  5. sampling: K ensembles on the pool, chains streamed to Arrow files, checkpoints, a fixed number of
 *     steps or the automatic stop (`tau_multiple` tau, then R-hat and ESS past the verdict's thresholds); SIGINT / SIGTERM stop at a step boundary with a
 *     checkpoint (exit 130), and `resume` continues bit for bit;
 *  6. post-processing: diagnostics.json, summary.{txt,csv,json,tex}, and stars.arrow (starResults.ts).
 *
 * Every stage's wall time goes into the manifest (`fit.timings`).
 */
import { createHash, randomInt } from 'node:crypto';
import { createReadStream, existsSync, mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import type { Catalog } from '../catalog/types.js';
import { writeFileAtomic } from '../core/atomicWrite.js';
import type { BandId } from '../core/bands.js';
import { ConfigError, InputError, InterruptedError, OutputError, UsageError } from '../core/errors.js';
import type { ClusterParameterName } from '../core/parameters.js';
import { coevalVersion } from '../core/version.js';
import { applyOverrides } from '../config/overrides.js';
import { configSchema, loadConfig, resolveConfigPath, runDirectory, type CoevalConfig, type LoadedConfig } from '../config/index.js';
import { meetsThresholdsOfRows, tauOfRows } from '../diagnostics/index.js';
import { createRunDirectory, newRunId, openRunDirectory, RUN_FORMAT, RUN_LAYOUT, RunChainWriter, writeManifest } from '../io/index.js';
import { catalogArrays } from '../likelihood/spec.js';
import type { CmdLikelihood } from '../likelihood/cmdLikelihood.js';
import { ERROR_FLOOR_SCHEDULE } from './annealedStart.js';
import type { LikelihoodOptions } from '../likelihood/options.js';
import { LAW_CITATIONS } from '../stellar/extinction/laws.js';
import { buildParameterSpace, type ParameterSpace, type PriorSpecs } from '../priors/index.js';
import { createEnsembles, createEvaluator, EnsembleSampler, movesFromConfig, resumeEnsembles, runEnsembles, type Evaluator, type RunObserver, type RunResult, type StopRule } from '../sampler/index.js';
import { compiledSibling } from '../sampler/compiledPath.js';
import { CHECK_STEPS, type CheckContext, type CheckSection } from './check.js';
import { diagnoseRun, type RunDiagnosis } from './diagnoseRun.js';
import { beamWidth, findStart, SEARCH_STARS } from './startSearch.js';
import type { FitManifest, FitManifestSection } from './fitManifest.js';
import { likelihoodOptionsFromConfig } from './likelihoodOptions.js';
import { logPosterior, POSTERIOR_BLOBS, type PosteriorArgs } from './posterior.js';
import type { StellarSetup } from './stellarModel.js';

export interface FitOptions {
  /** The config file of a new run (or give `loaded`). */
  config?: string;
  loaded?: LoadedConfig;
  /** `--set` overrides for `config`; when resuming, only sampler.steps may be changed. */
  sets?: string[];
  /** Continue the run in this directory from its checkpoint (the config comes from its manifest). */
  resume?: string;
  /** Replace an existing run directory (a new run). */
  overwrite?: boolean;
  /** Worker threads: a count (0 = in the main thread) or 'auto'; default `[sampler] workers`. */
  workers?: number | 'auto';
  /** Run seed; default `[sampler] seed`, else drawn and recorded. */
  seed?: number;
  /** The run directory of a new run; default `[output] dir`, else runs/<config name>. */
  runDir?: string;
  /** Progress displays etc. */
  observers?: readonly RunObserver[];
  /** Stage messages (stderr in the CLI). */
  log?: (line: string) => void;
  warn?: (line: string) => void;
  /** Posterior draws for stars.arrow (default 200). */
  starDraws?: number;
  /** Write plots/ (SVG and PNG) and report.html after sampling (default true; `coeval report` can do it later). */
  report?: boolean;
}

export interface FitResult {
  runDir: string;
  manifest: FitManifest;
  run: RunResult;
  diagnosis: RunDiagnosis;
  warnings: string[];
  /** Evaluations of the log-posterior, and the mean wall time of one on one worker (ms). */
  evaluations: { initialisation: number; sampling: number; msPerEvaluation: number };
}

/** Extra fields the fit keeps in its manifest section, beyond FitManifestSection. */
interface FitRecord extends FitManifestSection {
  seed: number;
  workers: number;
  catalogue: FitManifestSection['catalogue'] & { sha256: string };
  truthFile?: string;
  initialisation?: { method: string; optima?: { logPosterior: number; iterations: number; converged: boolean }[]; start?: Record<string, number>; widths?: Record<string, number> };
  likelihoodNotes: string[];
  evaluations: { initialisation: number; sampling: number };
  stoppedBy?: RunResult['stoppedBy'];
  steps?: number;
}

type FitRunManifest = FitManifest & { fit: FitRecord };

const now = (): number => performance.now();

async function sha256(path: string): Promise<string> {
  const h = createHash('sha256');
  for await (const chunk of createReadStream(path)) h.update(chunk as Buffer);
  return h.digest('hex');
}

/** Read the config, the catalogue (and a grid), as `coeval check` does. */
async function checkInputs(loaded: LoadedConfig): Promise<{ catalog: Catalog; sections: CheckSection[] }> {
  const ctx: CheckContext = { loaded };
  const sections: CheckSection[] = [];
  for (const step of CHECK_STEPS) {
    const s = await step.run(ctx);
    if (s) sections.push(s);
  }
  if (!ctx.catalog) throw new Error('the check read no catalogue');
  return { catalog: ctx.catalog, sections };
}

/** The comparison-field catalogue of a KDE field model, as magnitudes in the fitted bands. */
async function comparisonMagnitudes(loaded: LoadedConfig, bands: readonly BandId[]): Promise<Float64Array[] | undefined> {
  const f = loaded.config.likelihood.field;
  if (f.model !== 'kde' || !f.comparison) return undefined;
  const { readCatalog } = await import('../catalog/index.js');
  const { catalogue, photometry } = loaded.config;
  const cmp = await readCatalog({ path: resolveConfigPath(loaded, f.comparison), catalogue: { ...catalogue, membership: undefined, parallax: undefined, parallax_error: undefined, cuts: [] }, photometry });
  return bands.map((b) => cmp.mag[cmp.bands.indexOf(b)]);
}

interface Prepared {
  loaded: LoadedConfig;
  catalog: Catalog;
  setup: StellarSetup;
  space: ParameterSpace;
  likelihood: CmdLikelihood;
  options: Partial<LikelihoodOptions>;
  args: PosteriorArgs;
  warnings: string[];
  checkSeconds: number;
  setupSeconds: number;
}

async function prepare(loaded: LoadedConfig, log: (s: string) => void): Promise<Prepared> {
  let t = now();
  const { catalog, sections } = await checkInputs(loaded);
  const warnings = sections.flatMap((s) => s.warnings);
  const checkSeconds = (now() - t) / 1000;
  log(`read ${catalog.nStars.toLocaleString('en-US')} stars in ${catalog.bands.join(', ')} from ${catalog.source.path} (${checkSeconds.toFixed(1)} s)`);
  t = now();
  const { stellarSetupFromConfig } = await import('./gridModel.js');
  const { CmdLikelihood } = await import('../likelihood/cmdLikelihood.js');
  const setup = await stellarSetupFromConfig(loaded);
  const space = buildParameterSpace(loaded.config.priors as PriorSpecs | undefined, { membershipGiven: catalog.membership !== undefined });
  const options = likelihoodOptionsFromConfig(loaded.config.likelihood, await comparisonMagnitudes(loaded, catalog.bands));
  const likelihood = new CmdLikelihood(catalogArrays(catalog), setup.source, setup.extinction, options);
  warnings.push(...priorDomainWarnings(space, setup));
  const c = loaded.config;
  const args: PosteriorArgs = {
    catalog: catalogArrays(catalog),
    likelihood: options,
    model: c.model,
    grid: c.grid,
    baseDir: loaded.baseDir,
    priors: c.priors as PriorSpecs,
    membershipGiven: catalog.membership !== undefined,
  };
  return { loaded, catalog, setup, space, likelihood, options, args, warnings, checkSeconds, setupSeconds: (now() - t) / 1000 };
}

/** Priors on age or [Fe/H] that reach beyond the stellar model: the posterior is zero there. */
function priorDomainWarnings(space: ParameterSpace, setup: StellarSetup): string[] {
  const out: string[] = [];
  const dom = setup.source.domain;
  const check = (name: ClusterParameterName, range: readonly [number, number]): void => {
    const j = space.free.findIndex((p) => p.name === name);
    if (j < 0) return;
    const [lo, hi] = space.priors[j].support;
    if (lo < range[0] || hi > range[1]) {
      out.push(`the ${name} prior (${space.priors[j].describe()}) reaches beyond the stellar model's range ${range[0]} to ${range[1]}; the posterior is zero outside it`);
    }
  };
  check('log_age', dom.logAgeYr);
  check('feh', dom.feh);
  return out;
}

function modelSection(setup: StellarSetup, bands: readonly BandId[]): FitManifestSection['model'] {
  const p = setup.source.provenance;
  return {
    name: p.model,
    evolution: p.evolution,
    solarZ: p.solarZ,
    alphaFe: p.alphaFe,
    bands: Object.fromEntries(bands.map((b) => [b, p.bands[b] ?? 'not stated by the model'])),
    extinction: setup.extinction.provenance,
    caveats: [...p.caveats],
  };
}

/** Author-year citations in a text ("Flower 1996", "Ramirez & Melendez 2005", "Casagrande et al. 2010"), in order. */
export function citationsIn(text: string): string[] {
  const re = /\b([A-Z][A-Za-z'-]+(?: et al\.| & [A-Z][A-Za-z'-]+)?) ((?:18|19|20)\d\d)\b/g;
  const seen = new Set<string>();
  for (const m of text.matchAll(re)) seen.add(`${m[1]} ${m[2]}`);
  return [...seen];
}

/**
 * The manifest's provenance, short enough for every summary's header: the stellar model by name (a grid
 * with its citation), the photometric calibration by its sources, the extinction law and R_V, and the two
 * cautions every result carries. The full texts and caveats are in `fit.model`.
 */
function runProvenance(setup: StellarSetup, model: FitManifestSection['model']): NonNullable<FitManifest['provenance']> {
  const builtin = model.name.startsWith('coeval built-in');
  const sources = citationsIn(Object.values(model.bands).join(' '));
  const ext = setup.extinction;
  return {
    model: builtin ? model.name : `${model.name} (${model.evolution})`,
    calibration: `photometry: ${sources.length > 0 ? sources.join(', ') : Object.values(model.bands)[0] ?? 'not stated'} (per band in manifest.json fit.model.bands); extinction: ${LAW_CITATIONS[ext.law]}, R_V = ${ext.rv}`,
    notes: [
      ...(builtin ? ['the built-in model is approximate and meant for exploration (caveats in manifest.json fit.model.caveats); for publication fit an established isochrone grid ([grid])'] : []),
      'the systematic error from the choice of stellar model usually exceeds the statistical error quoted',
    ],
  };
}

function stopRule(s: CoevalConfig['sampler']): StopRule {
  return s.stop === 'auto'
    ? { kind: 'auto', maxSteps: s.steps, estimator: tauOfRows, tauMultiple: s.tau_multiple, tauChange: s.tau_change, checkEvery: s.check_every, convergence: meetsThresholdsOfRows }
    : { kind: 'fixed', steps: s.steps };
}

/** Overrides allowed on resume: only the step count (or cap) may change. */
function resumeConfig(stored: CoevalConfig, sets: readonly string[]): CoevalConfig {
  if (sets.length === 0) return stored;
  for (const s of sets) {
    const key = s.slice(0, s.indexOf('=')).trim();
    if (key !== 'sampler.steps') {
      throw new UsageError(`a resumed run keeps its config; only sampler.steps may be changed, not ${key}`, { hint: 'start a new run for other settings' });
    }
  }
  const raw = JSON.parse(JSON.stringify(stored)) as Record<string, unknown>;
  applyOverrides(raw, sets);
  const parsed = configSchema.safeParse(raw);
  if (!parsed.success) throw new UsageError(`--set: ${parsed.error.issues[0].message}`, { where: { key: 'sampler.steps' } });
  return parsed.data;
}

export async function fit(options: FitOptions): Promise<FitResult> {
  const log = options.log ?? (() => {});
  const warn = options.warn ?? (() => {});
  const tStart = now();
  const resuming = options.resume !== undefined;
  let loaded: LoadedConfig;
  let manifest: FitRunManifest | undefined;
  let dir: string;
  if (resuming) {
    const opened = openRunDirectory(options.resume as string);
    dir = opened.dir;
    const m = opened.manifest as Partial<FitRunManifest>;
    if (!m.fit) throw new UsageError('this run directory was not written by `coeval fit`, so it cannot be resumed as a fit', { where: { file: dir } });
    manifest = m as FitRunManifest;
    if (!existsSync(join(dir, RUN_LAYOUT.checkpoint))) {
      throw new UsageError('the run directory has no checkpoint yet (the run stopped before sampling began)', { where: { file: join(dir, RUN_LAYOUT.checkpoint) }, hint: 'start the fit again with --overwrite' });
    }
    loaded = { config: resumeConfig(manifest.fit.config, options.sets ?? []), file: manifest.fit.configFile, baseDir: manifest.fit.baseDir, overrides: [...manifest.fit.overrides, ...(options.sets ?? [])] };
    log(`resuming ${dir} (run ${manifest.runId})`);
  } else {
    loaded = options.loaded ?? loadConfig(requireConfig(options.config), { sets: options.sets });
    dir = resolve(options.runDir ?? runDirectory(loaded));
    // The default place (runs/ beside the config) is ours to create; a folder the user named must exist.
    if (options.runDir === undefined && loaded.config.output.dir === undefined) mkdirSync(dirname(dir), { recursive: true });
  }
  const c = loaded.config;
  const prep = await prepare(loaded, log);
  const warnings = [...prep.warnings];
  for (const w of prep.warnings) warn(w);
  const catalogPath = resolveConfigPath(loaded, c.catalogue.path);
  const catalogHash = await sha256(catalogPath);
  const ndim = prep.space.free.length;
  const nWalkers = c.sampler.walkers ?? Math.max(32, 4 * ndim);
  const workersSetting = options.workers ?? c.sampler.workers;

  if (resuming) {
    const m = manifest as FitRunManifest;
    if (m.fit.catalogue.sha256 && m.fit.catalogue.sha256 !== catalogHash) {
      throw new InputError('the catalogue has changed since the run started, so the run cannot be resumed', { where: { file: catalogPath }, hint: 'restore the original catalogue, or start a new run' });
    }
  } else {
    const seed = options.seed ?? c.sampler.seed ?? randomInt(1, 0xffffffff);
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new UsageError(`the seed must be an integer in [0, 4294967295], got ${seed}`);
    const truthFile = c.catalogue.truth ? resolveConfigPath(loaded, c.catalogue.truth) : undefined;
    let truth: FitManifestSection['truth'];
    if (truthFile) {
      const { readTruthParameters } = await import('./simulate.js');
      truth = readTruthParameters(truthFile);
    }
    const nEnsembles = c.sampler.ensembles;
    const runId = newRunId();
    const model = modelSection(prep.setup, prep.catalog.bands);
    const fitRecord: FitRecord = {
      config: c,
      configFile: loaded.file ? resolve(loaded.file) : '',
      baseDir: loaded.baseDir,
      overrides: loaded.overrides,
      bands: [...prep.catalog.bands],
      catalogue: { path: catalogPath, format: prep.catalog.source.format, nStars: prep.catalog.nStars, sha256: catalogHash },
      fixed: { ...prep.space.fixed },
      priors: prep.space.describe(),
      model,
      truth,
      truthFile,
      timings: {},
      seed,
      workers: 0,
      likelihoodNotes: [...prep.likelihood.notes],
      evaluations: { initialisation: 0, sampling: 0 },
    };
    manifest = {
      format: RUN_FORMAT,
      runId,
      createdAt: new Date().toISOString(),
      coevalVersion: coevalVersion(),
      parameters: prep.space.free.map((p) => ({ ...p })),
      nEnsembles,
      nWalkers,
      seeds: Array.from({ length: nEnsembles }, (_, k) => `${seed}/${k}`),
      chainFiles: Array.from({ length: nEnsembles }, (_, k) => RUN_LAYOUT.chainFile(k)),
      provenance: runProvenance(prep.setup, model),
      status: 'running',
      fit: fitRecord,
    };
    try {
      dir = createRunDirectory(dir, manifest, options.overwrite || c.output.overwrite ? 'overwrite' : 'new');
    } catch (err) {
      if (err instanceof OutputError && existsSync(dir)) {
        throw new OutputError('the run directory already exists', { where: { file: dir }, hint: `continue it with coeval fit --resume ${dir}, write elsewhere with --out DIR, or replace it with --overwrite` });
      }
      throw err;
    }
    log(`run directory ${dir} (run ${runId}, seed ${seed})`);
  }
  const m = manifest as FitRunManifest;
  const rec = m.fit;
  rec.timings.check = (rec.timings.check ?? 0) + prep.checkSeconds;
  rec.timings.setup = (rec.timings.setup ?? 0) + prep.setupSeconds;

  const spec = { modulePath: compiledSibling(import.meta.url, 'posterior.js'), exportName: 'createLogPosterior', args: prep.args };
  let t = now();
  const evaluator: Evaluator = workersSetting === 0 ? (await import('../sampler/index.js')).inThreadEvaluator(logPosterior(prep.likelihood, prep.space)) : await createEvaluator(spec, workersSetting);
  rec.workers = evaluator.workers;
  rec.timings.workers = (rec.timings.workers ?? 0) + (now() - t) / 1000;
  const moves = movesFromConfig(c.sampler.moves);
  const checkpointPath = join(dir, RUN_LAYOUT.checkpoint);
  let runResult: RunResult;
  let evalInit = 0;
  let samplingSeconds = 0;
  try {
    let samplers: EnsembleSampler[];
    let resumedFrom;
    let sink: RunChainWriter;
    if (resuming) {
      const r = resumeEnsembles(checkpointPath, { evaluator, moves, randomizeSplit: c.sampler.random_split });
      samplers = r.samplers;
      resumedFrom = r.checkpoint;
      sink = RunChainWriter.reopen(dir, m, { blobNames: POSTERIOR_BLOBS });
      log(`continuing from step ${r.checkpoint.step}`);
    } else {
      t = now();
      const init = await initialise(evaluator, prep.space, rec.seed, m.nEnsembles, nWalkers, c.sampler, moves, log, prep.likelihood);
      samplers = init.samplers;
      evalInit = init.evaluations;
      rec.initialisation = init.record;
      rec.evaluations.initialisation = evalInit;
      rec.timings.initialisation = (now() - t) / 1000;
      writeManifest(dir, m);
      sink = RunChainWriter.create(dir, m, { blobNames: POSTERIOR_BLOBS });
    }
    const stepsBefore = samplers[0].step;
    log(`sampling: ${m.nEnsembles} ensembles x ${nWalkers} walkers, ${ndim} parameters, ${c.sampler.stop === 'auto' ? `automatic stop at ${c.sampler.tau_multiple} tau with R-hat and ESS past the verdict's thresholds (cap ${c.sampler.steps} steps)` : `${c.sampler.steps} steps`}, ${evaluator.workers} worker(s)`);
    t = now();
    try {
      runResult = await runEnsembles({
        samplers,
        stop: stopRule(c.sampler),
        thin: c.sampler.thin,
        sink,
        resumedFrom,
        checkpoint: { path: checkpointPath, everySteps: c.sampler.checkpoint_steps, everySeconds: c.sampler.checkpoint_seconds, meta: { runId: m.runId, seed: rec.seed } },
        observers: options.observers,
        resumeHint: `coeval fit --resume ${dir}`,
      });
    } finally {
      samplingSeconds = (now() - t) / 1000;
      rec.timings.sampling = (rec.timings.sampling ?? 0) + samplingSeconds;
      rec.evaluations.sampling += (samplers[0].step - stepsBefore) * nWalkers * m.nEnsembles;
    }
  } catch (err) {
    m.status = err instanceof InterruptedError ? 'interrupted' : 'failed';
    rec.timings.total = (rec.timings.total ?? 0) + (now() - tStart) / 1000;
    try {
      writeManifest(dir, m);
    } catch {
      // the original error matters more
    }
    throw err;
  } finally {
    await evaluator.close();
  }
  rec.stoppedBy = runResult.stoppedBy;
  rec.steps = runResult.steps;

  // Post-processing.
  t = now();
  log('diagnostics and summaries');
  const diagnosis = diagnoseRun(dir);
  await writeDiagnosisFiles(dir, diagnosis);
  rec.timings.diagnostics = (now() - t) / 1000;
  t = now();
  const starDraws = options.starDraws ?? 200;
  log(`per-star memberships and masses over ${starDraws} posterior draws`);
  await writeStars(dir, m, prep, diagnosis, starDraws);
  rec.timings.stars = (now() - t) / 1000;
  // The run is complete before the figures: the report reads the status from the manifest.
  m.status = 'finished';
  writeManifest(dir, m);
  if (options.report !== false) {
    t = now();
    log('plots and report.html');
    try {
      await writeFiguresAndReport(dir, rec.seed);
    } catch (err) {
      // The posterior is already safe on disk; a figure that fails must not lose the run.
      const msg = `the plots or the report could not be written (${(err as Error).message}); the run itself is complete: try coeval report ${dir}`;
      warnings.push(msg);
      warn(msg);
    }
    rec.timings.report = (now() - t) / 1000;
  }
  rec.timings.total = (rec.timings.total ?? 0) + (now() - tStart) / 1000;
  m.status = 'finished';
  writeManifest(dir, m);
  const msPerEvaluation = samplingSeconds > 0 && runResult.steps > 0 ? (1000 * samplingSeconds * Math.max(1, rec.workers)) / Math.max(1, rec.evaluations.sampling) : Number.NaN;
  return { runDir: dir, manifest: m, run: runResult, diagnosis, warnings, evaluations: { initialisation: rec.evaluations.initialisation, sampling: rec.evaluations.sampling, msPerEvaluation } };
}

function requireConfig(config: string | undefined): string {
  if (!config) throw new UsageError('name the config file of the fit', { hint: 'coeval fit CONFIG, or coeval fit --resume RUN_DIR' });
  return config;
}

async function initialise(
  evaluator: Evaluator,
  space: ParameterSpace,
  seed: number,
  nEnsembles: number,
  nWalkers: number,
  s: CoevalConfig['sampler'],
  moves: ReturnType<typeof movesFromConfig>,
  log: (line: string) => void,
  likelihood: CmdLikelihood,
): Promise<{ samplers: EnsembleSampler[]; evaluations: number; record: FitRecord['initialisation'] }> {
  const ndim = space.free.length;
  const names = space.free.map((p) => p.name);
  const base = { evaluator, seed, nEnsembles, nWalkers, moves, randomizeSplit: s.random_split };
  const asRecord = (x: ArrayLike<number>): Record<string, number> => Object.fromEntries(names.map((n, j) => [n, x[j]]));
  switch (s.init) {
    case 'prior': {
      log('initialisation: walkers drawn from the prior');
      const { samplers } = await createEnsembles({ ...base, init: { kind: 'prior', draw: (rng, out) => space.drawFromPrior(() => rng.uniform(), out) } });
      return { samplers, evaluations: nEnsembles * nWalkers, record: { method: 'prior draws' } };
    }
    case 'ball': {
      const point = s.init_point ?? {};
      const missing = names.filter((n) => point[n] === undefined);
      if (missing.length > 0) {
        throw new ConfigError(`init_point has no value for ${missing.join(', ')}`, { where: { key: 'sampler.init_point' }, expected: `a value for every sampled parameter: ${names.join(', ')}` });
      }
      const center = names.map((n) => point[n]);
      log(`initialisation: a ball of width ${s.init_scale} around init_point`);
      const { samplers } = await createEnsembles({ ...base, init: { kind: 'ball', center, scale: s.init_scale } });
      return { samplers, evaluations: nEnsembles * nWalkers, record: { method: `ball of width ${s.init_scale} around init_point`, start: asRecord(center) } };
    }
    case 'optimum': {
      log(`initialisation: Nelder-Mead from the best ${beamWidth(s.init_starts)} of ${Math.max(64 * ndim, 4 * s.init_starts)} prior draws on the CMD blurred by ${ERROR_FLOOR_SCHEDULE[0]} mag, the best ${s.init_starts} followed down the error floors ${ERROR_FLOOR_SCHEDULE.slice(1).join(', ')} mag (on ${SEARCH_STARS / 4}-${SEARCH_STARS} of the stars), then on the posterior with every star from those and from the best ${s.init_starts} prior draws`);
      const o = await findStart(evaluator, space, seed, s.init_starts, likelihood, log);
      log(`optimum: log-posterior ${o.runs.map((r) => r.logPosterior.toFixed(2)).join(', ')} (${o.evaluations} evaluations); start ${names.map((n, j) => `${n} ${Number(o.best[j].toPrecision(5))}`).join(', ')}`);
      // Walkers start from the Laplace approximation at the optimum (laplaceStart.ts), so that each
      // ensemble begins with about the posterior's spread; init_scale x the prior's spread is the first step.
      const { laplaceStart } = await import('./laplaceStart.js');
      const lap = await laplaceStart(evaluator, o.best, Float64Array.from(o.spread, (x) => s.init_scale * x));
      log(`start: ${lap.correlated ? 'Gaussian from the Hessian at the optimum' : 'independent normals (the Hessian was not positive definite)'}, conditional widths ${names.map((n, j) => `${n} ${Number(lap.sigma[j].toPrecision(2))}`).join(', ')} (${lap.evaluations} evaluations)`);
      const { samplers } = await createEnsembles({ ...base, init: { kind: 'prior', draw: lap.draw } });
      return {
        samplers,
        evaluations: o.evaluations + lap.evaluations + nEnsembles * nWalkers,
        record: {
          method: `continuation in the error floor (a beam: ${beamWidth(s.init_starts)} prior draws optimised on the most blurred CMD, the best ${s.init_starts} followed down, on subsets of ${SEARCH_STARS / 4}-${SEARCH_STARS} stars), and Nelder-Mead with every star from them and from the best ${s.init_starts} prior draws, then draws from the Laplace approximation at the optimum (${lap.correlated ? 'finite-difference Hessian' : 'independent normals with the conditional widths'})`,
          optima: o.runs,
          start: asRecord(o.best),
          widths: asRecord(lap.sigma),
        },
      };
    }
  }
}

async function writeDiagnosisFiles(dir: string, d: RunDiagnosis): Promise<void> {
  const { diagnosisJson } = await import('../report/diagnosisText.js');
  const { formatSummary } = await import('../report/summaryFormats.js');
  writeFileAtomic(join(dir, RUN_LAYOUT.diagnostics), `${JSON.stringify(diagnosisJson(d.diagnosis, { runId: d.manifest.runId, provenance: d.provenance }), null, 2)}\n`);
  const ctx = { runId: d.manifest.runId, drawsLine: d.drawsLine };
  const forms: [('txt' | 'csv' | 'json' | 'tex'), 'text' | 'csv' | 'json' | 'latex'][] = [
    ['txt', 'text'],
    ['csv', 'csv'],
    ['json', 'json'],
    ['tex', 'latex'],
  ];
  for (const [ext, format] of forms) writeFileAtomic(join(dir, RUN_LAYOUT.summary(ext)), `${formatSummary(d.summary, format, ctx)}\n`);
}

/** plots/<name>.svg and .png and report.html, from one build of the figures (the PPC is costly). */
async function writeFiguresAndReport(dir: string, seed: number): Promise<void> {
  const { buildRunFigures } = await import('./runPlots.js');
  const { reportContent } = await import('./runReport.js');
  const { renderReportHtml } = await import('../report/html.js');
  const { svgToPng } = await import('../report/render.js');
  // The figures' seed must be >= 1 (mt19937); the run seed may be 0.
  const figures = await buildRunFigures(dir, { seed: (seed % 0xfffffffe) + 1 });
  const plots = join(dir, RUN_LAYOUT.plotsDir);
  mkdirSync(plots, { recursive: true });
  for (const f of figures.figures) {
    writeFileAtomic(join(plots, `${f.name}.svg`), f.svg);
    writeFileAtomic(join(plots, `${f.name}.png`), await svgToPng(f.svg, 2));
  }
  writeFileAtomic(join(dir, RUN_LAYOUT.report), renderReportHtml(reportContent(figures)));
}

async function writeStars(dir: string, m: FitRunManifest, prep: Prepared, d: RunDiagnosis, maxDraws: number): Promise<void> {
  const { readRunChains } = await import('../io/index.js');
  const { computeStarResults, starsTable } = await import('./starResults.js');
  const { writeArrowTable } = await import('../catalog/writeArrowTable.js');
  const spacing = d.diagnosis.thin;
  const storedDiscard = Math.round(d.diagnosis.discard / spacing);
  const chains = readRunChains(dir, m, { parameters: m.parameters.map((p) => p.name), discard: storedDiscard });
  const nPooled = chains.nEnsembles * chains.nWalkers * chains.nDraws;
  const r = computeStarResults({ likelihood: prep.likelihood, space: prep.space, source: prep.setup.source, extinction: prep.setup.extinction, draws: chains.values, nPooled, maxDraws, seed: m.fit.seed });
  const table = starsTable(prep.catalog, r, { discardSteps: d.diagnosis.discard, runId: m.runId });
  await writeArrowTable(join(dir, RUN_LAYOUT.stars), table);
}

/**
 * A run directory opened for plots and the report: the diagnosis and summary (diagnoseRun, which also
 * chooses the burn-in), the kept posterior draws of every sampled parameter, and the fit's own section of
 * the manifest when a fit wrote the run (a sampler test-bed has none).
 */
import type { ClusterParameterName } from '../core/parameters.js';
import { InputError } from '../core/errors.js';
import { readRunChains, RUN_LAYOUT } from '../io/index.js';
import { diagnoseRun, type DiagnoseRunOptions, type RunDiagnosis } from './diagnoseRun.js';
import type { FitManifestSection } from './fitManifest.js';

export interface RunPosterior {
  run: RunDiagnosis;
  fit?: FitManifestSection;
  /** Kept draws (after the burn-in) per sampled parameter, chain-major: chain c's draws at [c * nDraws, (c + 1) * nDraws). */
  draws: Record<string, Float64Array>;
  /** Chains (every walker of every ensemble) and kept draws per chain. */
  nChains: number;
  nDraws: number;
  /** Stored steps dropped as burn-in, and sampler steps between stored steps. */
  storedDiscard: number;
  spacing: number;
}

/** Open a run; `discard` (sampler steps) overrides the suggested burn-in. Every stored step is read. */
export function openRunPosterior(runDir: string, opts: Pick<DiagnoseRunOptions, 'discard'> = {}): RunPosterior {
  const run = diagnoseRun(runDir, { discard: opts.discard });
  const { manifest } = run;
  const spacing = run.diagnosis.thin;
  const storedDiscard = Math.round(run.diagnosis.discard / spacing);
  const names = manifest.parameters.map((p) => p.name);
  const chains = readRunChains(run.runDir, manifest, { parameters: names, discard: storedDiscard });
  return {
    run,
    fit: fitSection(manifest, run.runDir),
    draws: chains.values,
    nChains: chains.nEnsembles * chains.nWalkers,
    nDraws: chains.nDraws,
    storedDiscard,
    spacing,
  };
}

/** The manifest's `fit` section, checked for the fields plots and the report use; undefined when absent. */
export function fitSection(manifest: Record<string, unknown>, runDir: string): FitManifestSection | undefined {
  const fit = manifest.fit as Partial<FitManifestSection> | undefined;
  if (fit === undefined) return undefined;
  const bad = (key: string, expected: string): never => {
    throw new InputError(`manifest.json: the fit section has no usable ${key}`, { where: { file: `${runDir}/${RUN_LAYOUT.manifest}`, key: `fit.${key}` }, expected, hint: 'the run directory was written by another version of coeval, or edited; run the fit again' });
  };
  if (typeof fit !== 'object' || fit === null) return bad('section', 'an object');
  if (!Array.isArray(fit.bands) || fit.bands.length === 0) bad('bands', 'the list of fitted bands');
  if (typeof fit.model !== 'object' || fit.model === null || typeof fit.model.name !== 'string') bad('model', 'the stellar model (name, evolution, bands, extinction, caveats)');
  if (typeof fit.config !== 'object' || fit.config === null) bad('config', 'the resolved config');
  if (typeof fit.baseDir !== 'string') bad('baseDir', 'the folder the config resolved paths from');
  return fit as FitManifestSection;
}

/**
 * The value of a cluster parameter in kept draw `i` (pooled index): its draw when sampled, its fixed
 * value when held fixed, undefined when the fit has neither.
 */
export function parameterAt(p: RunPosterior, name: ClusterParameterName, i: number): number | undefined {
  const d = p.draws[name];
  if (d) return d[i];
  return p.fit?.fixed?.[name];
}

/** The posterior median of a sampled parameter (the summary's), or its fixed value. */
export function parameterMedian(p: RunPosterior, name: ClusterParameterName): number | undefined {
  const s = p.run.summary.parameters.find((q) => q.info.name === name);
  return s ? s.median : p.fit?.fixed?.[name];
}

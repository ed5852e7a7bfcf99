/**
 * `coeval simulate`: a synthetic catalogue of a cluster with known parameters, drawn with the likelihood's own
 * forward model (likelihood/simulate.ts: IMF masses, binaries with q, the isochrone at (age, [Fe/H]), distance
 * and extinction, the error law sigma(m) = a + b 10^(0.4 (m - m_ref)), limits and completeness, field stars,
 * optional blue stragglers, parallaxes and membership probabilities), written as CSV, Arrow or FITS, with
 * the truth as JSON beside it. The same config and seed give the same files.
 */
import { readFileSync } from 'node:fs';
import { basename, dirname, extname, join, relative, resolve } from 'node:path';
import type { BandId } from '../core/bands.js';
import { writeFileAtomic } from '../core/atomicWrite.js';
import { ConfigError, InputError } from '../core/errors.js';
import { CLUSTER_PARAMETER_NAMES, type ClusterParameterName } from '../core/parameters.js';
import { coevalVersion } from '../core/version.js';
import type { LoadedSimulationConfig } from '../config/index.js';
import { outputFormatFor, writeOutputTable, type OutputColumn, type OutputFormat, type OutputTable } from '../catalog/outputTable.js';
import { simulateCatalog, type SimulatedCatalog } from '../likelihood/simulate.js';
import type { ClusterParameters } from '../likelihood/theta.js';
import { Phase } from '../stellar/types.js';
import { likelihoodOptionsFromConfig } from './likelihoodOptions.js';
import type { StellarSetup } from './stellarModel.js';

export const TRUTH_FORMAT = 'coeval-truth 1';

/** Codes of the per-star components in the truth file, one character per star. */
export const COMPONENT_CODES = { s: 'single', b: 'unresolved binary', f: 'field', x: 'blue straggler' } as const;
const CODE_OF = ['s', 'b', 'f', 'x'] as const;

/** The truth file: what `[catalogue] truth` points a fit at. */
export interface TruthFile {
  format: typeof TRUTH_FORMAT;
  coevalVersion: string;
  seed: number;
  /** The catalogue, relative to the truth file. */
  catalogue: string;
  nStars: number;
  /** The true cluster parameters under their config names (f_field only when no memberships were drawn). */
  parameters: Partial<Record<ClusterParameterName | 'age_gyr', number>>;
  model: { name: string; extinction: string };
  bands: BandId[];
  selection: {
    limits: Partial<Record<BandId, { bright: number; faint: number }>>;
    errors: Partial<Record<BandId, { a: number; b: number; m_ref: number }>>;
    completeness?: { band: BandId; magnitudes: number[]; fractions: number[] };
    /** Where a default was taken because the config gave none. */
    defaults: string[];
  };
  counts: { single: number; binary: number; field: number; blue_straggler: number };
  /** Fraction of drawn cluster systems that passed the selection. */
  acceptance: number;
  /** Per star, in catalogue order. */
  stars: {
    codes: typeof COMPONENT_CODES;
    /** One character per star: s, b, f or x. */
    component: string;
    /** Initial mass of the star (the primary of a binary), Msun; null for field stars and blue stragglers. */
    mass_primary: (number | null)[];
    /** Secondary / primary mass, null for single stars. */
    mass_ratio: (number | null)[];
  };
}

export interface SimulateOptions {
  /** Called with notes (defaults taken), for the user. */
  onNote?: (line: string) => void;
}

export interface SimulationResult {
  catalogPath: string;
  truthPath: string;
  format: OutputFormat;
  nStars: number;
  counts: TruthFile['counts'];
  acceptance: number;
  parameters: TruthFile['parameters'];
  defaults: string[];
  seconds: number;
}

function round(x: number, digits: number): number | null {
  return Number.isFinite(x) ? Number(x.toPrecision(digits)) : null;
}

/** The true parameters as the likelihood takes them. */
export function truthTheta(t: LoadedSimulationConfig['config']['simulate']['truth']): ClusterParameters {
  const logAgeYr = t.log_age ?? Math.log10(t.age_gyr as number) + 9;
  return { logAgeYr, feh: t.feh, dm: t.dm, ebv: t.ebv, fBinary: t.f_binary, fField: t.f_field, sigmaExtra: t.sigma_extra };
}

/**
 * Limits and error laws for bands the config leaves out: the window runs from 0.5 mag above the brightest
 * star of the isochrone to 4 mag below its turnoff (the hottest main-sequence star), and the errors follow
 * sigma = 0.005 + 0.02 10^(0.4 (m - faint)), 0.025 mag at the faint limit (common practice for deep
 * ground-based photometry, from memory).
 */
function fillDefaults(loaded: LoadedSimulationConfig, setup: StellarSetup, theta: ClusterParameters): string[] {
  const sim = loaded.config.simulate;
  const lik = loaded.config.likelihood;
  const notes: string[] = [];
  const needLimits = sim.bands.filter((b) => lik.limits[b]?.bright === undefined || lik.limits[b]?.faint === undefined);
  const needErrors = sim.bands.filter((b) => !lik.errors[b]);
  if (needLimits.length === 0 && needErrors.length === 0) return notes;
  const iso = setup.source.isochrone(theta.logAgeYr, theta.feh, { bands: sim.bands });
  if (!iso) throw new ConfigError(`the stellar model has no isochrone at log age ${theta.logAgeYr.toFixed(4)}, [Fe/H] ${theta.feh}`, { where: { key: 'simulate.truth' } });
  const n = iso.massInitial.length;
  const ratios = sim.bands.map(() => new Float64Array(n));
  setup.extinction.ratios(sim.bands, iso.logTeff, iso.logg, theta.feh, ratios, n);
  let kTo = 0;
  for (let k = 0; k < n; k++) if (iso.phase[k] === Phase.MainSequence && iso.logTeff[k] > iso.logTeff[kTo]) kTo = k;
  sim.bands.forEach((b, j) => {
    const col = iso.bands.indexOf(b);
    const app = (k: number): number => iso.absMag[col][k] + theta.dm + ratios[j][k] * theta.ebv;
    const lim = { ...(lik.limits[b] ?? {}) };
    if (lim.bright === undefined || lim.faint === undefined) {
      let brightest = Infinity;
      for (let k = 0; k < n; k++) brightest = Math.min(brightest, app(k));
      lim.bright ??= Math.floor((brightest - 0.5) * 10) / 10;
      lim.faint ??= Math.round((app(kTo) + 4) * 10) / 10;
      if (!(lim.bright < lim.faint)) throw new ConfigError(`the ${b} limits would be inverted (${lim.bright} to ${lim.faint})`, { where: { key: `likelihood.limits.${b}` }, hint: 'give both limits' });
      lik.limits[b] = lim;
      notes.push(`${b}: no limits configured; using ${lim.bright} to ${lim.faint} (0.5 mag above the brightest model star, 4 mag below the turnoff)`);
    }
    if (!lik.errors[b]) {
      lik.errors[b] = { a: 0.005, b: 0.02, m_ref: lim.faint };
      notes.push(`${b}: no error law configured; using sigma = 0.005 + 0.02 x 10^(0.4 (m - ${lim.faint}))`);
    }
  });
  return notes;
}

/** Draw the catalogue a simulation config describes (no files written). */
export async function drawSimulation(loaded: LoadedSimulationConfig, setup?: StellarSetup): Promise<{ sim: SimulatedCatalog; theta: ClusterParameters; setup: StellarSetup; defaults: string[] }> {
  const cfg = loaded.config;
  const s = cfg.simulate;
  const st = setup ?? (await simulationSetup(loaded));
  const theta = truthTheta(s.truth);
  const defaults = fillDefaults(loaded, st, theta);
  const options = likelihoodOptionsFromConfig(cfg.likelihood);
  const errorLaw: Partial<Record<BandId, { a: number; b: number; mRef: number }>> = {};
  for (const b of s.bands) {
    const e = cfg.likelihood.errors[b];
    if (e) errorLaw[b] = { a: e.a, b: e.b, mRef: e.m_ref };
  }
  for (const b of Object.keys(s.missing) as BandId[]) {
    if (!s.bands.includes(b)) throw new ConfigError(`simulate.missing names ${b}, which is not among the simulated bands`, { where: { key: `simulate.missing.${b}` }, expected: s.bands.join(', ') });
  }
  const sim = simulateCatalog(
    {
      seed: s.seed,
      nStars: s.stars,
      bands: s.bands,
      theta,
      errorLaw,
      likelihood: options,
      blueStragglerFraction: s.blue_straggler_fraction,
      membership: s.membership,
      parallax: s.parallax ? { errorMas: s.parallax.error_mas, fieldMeanMas: s.parallax.field_mean_mas, fieldSdMas: s.parallax.field_sd_mas } : undefined,
      missingFraction: s.missing,
    },
    st.source,
    st.extinction,
  );
  return { sim, theta, setup: st, defaults };
}

/** The stellar model of a simulation config: `[grid]` when given, else the built-in model with `[model]`. */
async function simulationSetup(loaded: LoadedSimulationConfig): Promise<StellarSetup> {
  const { stellarSetupFromConfig } = await import('./gridModel.js');
  return stellarSetupFromConfig({ config: loaded.config as never, baseDir: loaded.baseDir, overrides: loaded.overrides });
}

/** The catalogue's table: id, magnitude and error per band, and the optional columns. */
export function catalogueTable(sim: SimulatedCatalog, idPrefix: string, notes: [string, string][]): OutputTable {
  const c = sim.catalog;
  const n = c.nStars;
  const digits = Math.max(6, String(n).length);
  const columns: OutputColumn[] = [{ name: 'id', description: 'star identifier', values: Array.from({ length: n }, (_, i) => `${idPrefix}${String(i + 1).padStart(digits, '0')}`) }];
  c.bands.forEach((b, k) => {
    columns.push({ name: b, unit: 'mag', description: `apparent ${b} magnitude`, values: Float64Array.from(c.mag[k]), decimals: 5 });
    columns.push({ name: `${b}_err`, unit: 'mag', description: `1-sigma error of ${b}`, values: Float64Array.from(c.err[k]), decimals: 5 });
  });
  if (c.membership) columns.push({ name: 'p_member', description: 'prior membership probability', values: Float64Array.from(c.membership), decimals: 4 });
  if (c.parallaxMas && c.parallaxErrorMas) {
    columns.push({ name: 'parallax', unit: 'mas', description: 'parallax', values: Float64Array.from(c.parallaxMas), decimals: 5 });
    columns.push({ name: 'parallax_error', unit: 'mas', description: '1-sigma error of the parallax', values: Float64Array.from(c.parallaxErrorMas), decimals: 5 });
  }
  return { nRows: n, columns, notes };
}

function defaultTruthPath(catalogPath: string): string {
  const ext = extname(catalogPath);
  return join(dirname(catalogPath), `${basename(catalogPath, ext)}.truth.json`);
}

/** Simulate and write the catalogue and its truth file. */
export async function simulateCluster(loaded: LoadedSimulationConfig, options: SimulateOptions = {}): Promise<SimulationResult> {
  const t0 = performance.now();
  const s = loaded.config.simulate;
  const catalogPath = resolve(loaded.baseDir, s.output);
  const format = outputFormatFor(catalogPath, s.format);
  const truthPath = s.truth_file ? resolve(loaded.baseDir, s.truth_file) : defaultTruthPath(catalogPath);
  if (truthPath === catalogPath) throw new ConfigError('the truth file would overwrite the catalogue', { where: { key: 'simulate.truth_file' } });
  const { sim, theta, setup, defaults } = await drawSimulation(loaded);
  for (const d of defaults) options.onNote?.(d);
  const comp = sim.truth.component;
  const counts = { single: 0, binary: 0, field: 0, blue_straggler: 0 };
  for (const c of comp) {
    if (c === 0) counts.single++;
    else if (c === 1) counts.binary++;
    else if (c === 2) counts.field++;
    else counts.blue_straggler++;
  }
  const parameters: TruthFile['parameters'] = {};
  const full: Record<ClusterParameterName, number> = { log_age: theta.logAgeYr, feh: theta.feh, dm: theta.dm, ebv: theta.ebv, f_binary: theta.fBinary, f_field: theta.fField, sigma_extra: theta.sigmaExtra };
  for (const name of CLUSTER_PARAMETER_NAMES) if (!(name === 'f_field' && s.membership)) parameters[name] = full[name];
  parameters.age_gyr = 10 ** (theta.logAgeYr - 9);
  const lik = loaded.config.likelihood;
  const selection: TruthFile['selection'] = { limits: {}, errors: {}, defaults };
  for (const b of s.bands) {
    selection.limits[b] = { bright: lik.limits[b]?.bright as number, faint: lik.limits[b]?.faint as number };
    selection.errors[b] = lik.errors[b];
  }
  if (lik.completeness) selection.completeness = { ...lik.completeness };
  const prov = setup.source.provenance;
  const notes: [string, string][] = [
    ['generator', `coeval ${coevalVersion()} simulate, seed ${s.seed}`],
    ['truth', relative(dirname(catalogPath), truthPath)],
    ['model', `${prov.model}; extinction: ${setup.extinction.provenance}`],
    ['note', 'synthetic catalogue of an invented cluster; no real observation is behind it'],
  ];
  await writeOutputTable(catalogPath, catalogueTable(sim, s.id_prefix, notes), format);
  const truth: TruthFile = {
    format: TRUTH_FORMAT,
    coevalVersion: coevalVersion(),
    seed: s.seed,
    catalogue: relative(dirname(truthPath), catalogPath),
    nStars: s.stars,
    parameters,
    model: { name: prov.model, extinction: setup.extinction.provenance },
    bands: [...s.bands],
    selection,
    counts,
    acceptance: sim.truth.acceptance,
    stars: {
      codes: COMPONENT_CODES,
      component: Array.from(comp, (c) => CODE_OF[c]).join(''),
      mass_primary: Array.from(sim.truth.massPrimary, (m) => round(m, 6)),
      mass_ratio: Array.from(sim.truth.massRatio, (q) => round(q, 6)),
    },
  };
  // Pretty at the top, one line per per-star array (20,000 stars would otherwise take 60,000 lines).
  const text = JSON.stringify({ ...truth, stars: '__STARS__' }, null, 2).replace('"__STARS__"', () => JSON.stringify(truth.stars));
  writeFileAtomic(truthPath, `${text}\n`);
  return { catalogPath, truthPath, format, nStars: s.stars, counts, acceptance: sim.truth.acceptance, parameters, defaults, seconds: (performance.now() - t0) / 1000 };
}

/**
 * The true parameters from a truth file (`[catalogue] truth`), for a fit's manifest: the cluster
 * parameters under their config names. Errors name the file.
 */
export function readTruthParameters(path: string): Partial<Record<ClusterParameterName, number>> {
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(path, 'utf8'));
  } catch (cause) {
    throw new InputError(`could not read the truth file: ${(cause as Error).message}`, { where: { file: path }, cause, hint: 'point catalogue.truth at the .truth.json that `coeval simulate` wrote' });
  }
  const t = json as Partial<TruthFile>;
  if (t?.format !== TRUTH_FORMAT || typeof t.parameters !== 'object' || t.parameters === null) {
    throw new InputError('this is not a truth file written by `coeval simulate`', { where: { file: path }, expected: `a JSON object with format "${TRUTH_FORMAT}" and parameters` });
  }
  const out: Partial<Record<ClusterParameterName, number>> = {};
  for (const name of CLUSTER_PARAMETER_NAMES) {
    const v = (t.parameters as Record<string, unknown>)[name];
    if (typeof v === 'number' && Number.isFinite(v)) out[name] = v;
  }
  return out;
}

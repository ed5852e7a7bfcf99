/**
 * The user's isochrone grid as the config names it: the `[grid]` section turned into an import spec (paths
 * resolved against the config's folder, `*` and `?` in file names expanded), opened from a cache or imported
 * from the tables, and checked as a whole.
 */
import { readdirSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import type { BandId } from '../core/bands.js';
import { ConfigError } from '../core/errors.js';
import type { GridConfig, LoadedConfig } from '../config/index.js';
import type { StellarSetup } from './stellarModel.js';
import { GRID_PHASE_NAMES } from '../config/index.js';
import { Phase } from '../stellar/types.js';
import type { GridImportSpec, GridSource, GridTable } from '../stellar/grid/index.js';

const PHASE_OF: Record<(typeof GRID_PHASE_NAMES)[number], Phase> = {
  main_sequence: Phase.MainSequence,
  hertzsprung_gap: Phase.HertzsprungGap,
  giant_branch: Phase.GiantBranch,
  core_helium_burning: Phase.CoreHeliumBurning,
  early_agb: Phase.EarlyAGB,
  tp_agb: Phase.ThermallyPulsingAGB,
};

/** The import spec of a `[grid]` table whose files are given (paths against `baseDir`). */
export function gridImportSpec(g: GridConfig, baseDir: string, keyPrefix = 'grid', filesOverride?: string[]): GridImportSpec {
  const entries = filesOverride ? filesOverride.map((p) => ({ path: resolve(p) })) : (g.files ?? []).map((f) => (typeof f === 'string' ? { path: f } : f));
  const files = entries.flatMap((f) => expand(resolve(baseDir, f.path), `${keyPrefix}.files`).map((path) => ({ ...f, path })));
  const c = g.columns;
  if (!c || !g.bands) {
    throw new ConfigError('the grid tables need a column map', {
      where: { key: `${keyPrefix}.columns` },
      hint: 'add [grid.columns] (mass_initial, log_teff, log_l, and age / metallicity unless given per file) and [grid.bands] (band = column)',
    });
  }
  const stagePhases = g.stages ? Object.fromEntries(Object.entries(g.stages).map(([k, v]) => [k, PHASE_OF[v]])) : undefined;
  return {
    files,
    format: g.format,
    comment: g.comment,
    delimiter: g.delimiter,
    columns: {
      age: c.age,
      metallicity: c.metallicity,
      massInitial: c.mass_initial,
      massCurrent: c.mass_current,
      phase: c.phase,
      logTeff: c.log_teff,
      logg: c.log_g,
      logL: c.log_l,
    },
    bands: (Object.entries(g.bands) as [BandId, string | undefined][]).filter((e): e is [BandId, string] => e[1] !== undefined),
    ageUnit: g.age_unit,
    metallicityScale: g.metallicity_scale,
    solarZ: g.solar_z,
    alphaFe: g.alpha_fe,
    phaseKind: g.phase_kind,
    stagePhases,
    ageInHeader: g.age_in_header,
    metallicityInHeader: g.metallicity_in_header,
    name: g.name ?? basename(files[0]?.path ?? 'grid'),
    citation: g.citation,
    dropNanRows: g.drop_nan_rows,
    keyPrefix,
  };
}

/** Expand `*` and `?` in the last path component (sorted); other paths are returned as they are. */
function expand(path: string, key: string): string[] {
  const name = basename(path);
  if (!/[*?]/.test(name)) return [path];
  const dir = dirname(path);
  const re = new RegExp(`^${name.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '.*').replace(/\?/g, '.')}$`);
  let all: string[];
  try {
    all = readdirSync(dir);
  } catch {
    throw new ConfigError(`the folder of the pattern "${name}" does not exist`, { where: { key }, found: dir });
  }
  const hits = all.filter((f) => re.test(f)).sort().map((f) => join(dir, f));
  if (hits.length === 0) throw new ConfigError(`no file matches "${name}"`, { where: { key }, found: dir, hint: 'check the pattern and the folder' });
  return hits;
}

export interface LoadedGrid {
  grid: GridTable;
  /** Where it came from: the cache path, or the tables. */
  origin: string;
  warnings: string[];
}

/** Open the grid the config names (cache or tables), and check it; throws a located error on a problem. */
export async function loadConfiguredGrid(g: GridConfig, baseDir: string): Promise<LoadedGrid> {
  const { importGrid, readGridArrow, validateGrid, assertGridValid } = await import('../stellar/grid/index.js');
  let grid: GridTable;
  let origin: string;
  if (g.cache !== undefined) {
    origin = resolve(baseDir, g.cache);
    grid = readGridArrow(origin);
  } else {
    const spec = gridImportSpec(g, baseDir);
    grid = (await importGrid(spec)).grid;
    origin = spec.files.map((f) => f.path).join(', ');
  }
  const warnings = assertGridValid(validateGrid(grid), 'the isochrone grid has a problem').map((p) => p.message);
  return { grid, origin, warnings };
}

/**
 * The `[grid]` section as an IsochroneSource, from plain arguments (the parsed section and the config's
 * folder), so that a worker thread can build its own from a module reference:
 * { modulePath: <dist>/src/pipeline/gridModel.js, exportName: 'gridSourceFromConfig', args: [section, baseDir] }.
 * With `cache` this opens the Arrow file; with `files` every caller imports the tables again, so a fit
 * should import once (`coeval grid import`) and name the cache.
 */
export async function gridSourceFromConfig(g: GridConfig, baseDir: string): Promise<GridSource> {
  const { GridSource } = await import('../stellar/grid/index.js');
  const { grid } = await loadConfiguredGrid(g, baseDir);
  return new GridSource(grid);
}

/**
 * The stellar model a config asks for: the user's grid when there is a `[grid]` section (its isochrones
 * replace the built-in evolution and photometry), else the built-in model with the `[model]` settings. The
 * extinction law comes from `[model]` either way.
 */
export async function stellarSetupFromConfig(loaded: LoadedConfig): Promise<StellarSetup> {
  const { builtinSetup } = await import('./stellarModel.js');
  const setup = builtinSetup(loaded.config.model);
  const g = loaded.config.grid;
  return g ? { ...setup, source: await gridSourceFromConfig(g, loaded.baseDir) } : setup;
}

/**
 * An isochrone grid as imported: every row of every isochrone in flat columns, the isochrones as row ranges,
 * and where each row came from (file and line), so that problems found later (at `coeval check`, long after
 * the import) can still name the line of the original table.
 */
import type { BandId } from '../../core/bands.js';
import type { Location } from '../../core/errors.js';
import type { Phase } from '../types.js';

/** How the age column is written. */
export type AgeUnit = 'log_yr' | 'yr' | 'myr' | 'gyr';
/** How the metallicity column is written: [Fe/H], [M/H], or the mass fraction Z. */
export type MetallicityScale = 'fe_h' | 'm_h' | 'z';
/** What the phase column holds: an equivalent evolutionary point (numeric, rising) or a stage label. */
export type PhaseKind = 'eep' | 'stage';

/** One source table and its checksum, for provenance. */
export interface GridSourceFile {
  path: string;
  /** sha256 of the file's bytes, hex. */
  sha256: string;
  bytes: number;
  /** Text tables are located by line, Arrow tables by row. */
  kind: 'text' | 'arrow';
}

/** Everything about a grid that is not per row. Stored as JSON in the Arrow cache's schema metadata. */
export interface GridMeta {
  /** Short name for summaries, e.g. the family and version the user downloaded. */
  name: string;
  /** The citation the user gives for the model family; printed in every summary and report. */
  citation: string;
  ageUnit: AgeUnit;
  metallicityScale: MetallicityScale;
  /** Solar Z used to turn Z into [M/H]; recorded whenever given. */
  solarZ?: number;
  /** [alpha/Fe] of the grid's mixture, for [M/H] -> [Fe/H] (Salaris et al. 1993). */
  alphaFe: number;
  phaseKind?: PhaseKind;
  /** Stage labels in evolutionary order (phaseKind = stage); row phase values index this list. */
  stageLabels?: string[];
  /** Optional map from a stage label to coeval's Phase. */
  stagePhases?: Record<string, Phase>;
  /** The EEP column is coeval's own phase coordinate (Phase + fraction), as in grids that coeval builds. */
  eepEncodesPhase?: boolean;
  /** The column map as the user wrote it (role -> column name), for provenance. */
  columnMap: Record<string, string>;
  sources: GridSourceFile[];
  /** Conversions and choices made during the import, in words. */
  notes: string[];
  /** Program and version that wrote the grid. */
  createdBy: string;
}

export interface GridIsochroneInfo {
  logAgeYr: number;
  feh: number;
  /** The metallicity as the table gives it (in `metallicityScale`). */
  metallicityRaw: number;
  /** Rows start .. start + count - 1. */
  start: number;
  count: number;
  /** Index into meta.sources. */
  source: number;
}

export interface GridTable {
  meta: GridMeta;
  bands: BandId[];
  nRows: number;
  massInitial: Float64Array;
  /** NaN where the grid has no current-mass column. */
  massCurrent: Float64Array;
  hasMassCurrent: boolean;
  /** EEP values, or stage ordinals (indices into meta.stageLabels); undefined without a phase column. */
  phaseValue?: Float64Array;
  logTeff: Float64Array;
  logg: Float64Array;
  logL: Float64Array;
  /** mag[b][row]: absolute magnitude in bands[b]. */
  mag: Float64Array[];
  /** Row provenance: source index and line (text) or 1-based row (Arrow). */
  rowSource: Int32Array;
  rowLine: Int32Array;
  isochrones: GridIsochroneInfo[];
}

/** Where row `row` of a grid came from, for messages. */
export function locateRow(grid: GridTable, row: number, field?: string): Location {
  const src = grid.meta.sources[grid.rowSource[row]];
  if (!src) return { field };
  return src.kind === 'text' ? { file: src.path, line: grid.rowLine[row], field } : { file: src.path, row: grid.rowLine[row], field };
}

/** Where an isochrone starts in its source table. */
export function locateIsochrone(grid: GridTable, k: number): Location {
  return locateRow(grid, grid.isochrones[k].start);
}

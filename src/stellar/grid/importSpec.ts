import type { BandId } from '../../core/bands.js';
import type { Phase } from '../types.js';
import type { AgeUnit, MetallicityScale, PhaseKind } from './gridTable.js';

/** One source table, with values that hold for all of its rows when the table has no such column. */
export interface GridFileSpec {
  path: string;
  /** Age of every row, in the grid's age unit. */
  age?: number;
  /** Metallicity of every row, in the grid's metallicity scale. */
  metallicity?: number;
}

/**
 * How to import a grid: the source tables and the column map. The code knows no family's column names:
 * every name comes from here (the `[grid]` config section, or a map file given to `coeval grid import`).
 */
export interface GridImportSpec {
  files: GridFileSpec[];
  /** `auto` decides from the file name and the first bytes. */
  format: 'auto' | 'text' | 'csv' | 'arrow';
  comment: string;
  /** Text tables: one delimiter character; default runs of blanks (CSV: comma). */
  delimiter?: string;
  columns: {
    age?: string;
    metallicity?: string;
    massInitial: string;
    massCurrent?: string;
    phase?: string;
    logTeff: string;
    /** When absent, log g is computed from the mass, log Teff and log L. */
    logg?: string;
    logL: string;
  };
  /** Band -> magnitude column, in the order bands are listed. */
  bands: [BandId, string][];
  ageUnit: AgeUnit;
  metallicityScale: MetallicityScale;
  solarZ?: number;
  alphaFe: number;
  phaseKind?: PhaseKind;
  stagePhases?: Record<string, Phase>;
  /** A regular expression with one group: the age of each block, from the comment lines before it. */
  ageInHeader?: string;
  metallicityInHeader?: string;
  name: string;
  citation: string;
  /** Drop rows with a NaN in a mapped column (counted in the notes) instead of refusing them. */
  dropNanRows: boolean;
  /** Config key prefix for messages, e.g. `grid` (config) or the map file's section. */
  keyPrefix: string;
}

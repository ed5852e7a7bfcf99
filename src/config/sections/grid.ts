import { z } from 'zod';
import { BAND_IDS } from '../../core/bands.js';

/** A source table: a path (a `*` or `?` in the file name matches several), or a table with per-file values. */
const fileEntry = z.union([
  z.string().min(1),
  z.strictObject({
    path: z.string().min(1),
    /** Age of every row of this file, in age_unit (for one file per age without an age column). */
    age: z.number().optional(),
    /** Metallicity of every row, in metallicity_scale (for one file per metallicity). */
    metallicity: z.number().optional(),
  }),
]);

/** Which column holds what. Only mass_initial, log_teff and log_l are always needed. */
const columnsSchema = z.strictObject({
  age: z.string().min(1).optional(),
  metallicity: z.string().min(1).optional(),
  mass_initial: z.string().min(1),
  mass_current: z.string().min(1).optional(),
  /** An EEP column or a stage label; say which in phase_kind. */
  phase: z.string().min(1).optional(),
  log_teff: z.string().min(1),
  /** When absent, log g is computed from mass, log Teff and log L (IAU 2015 nominal solar values). */
  log_g: z.string().min(1).optional(),
  log_l: z.string().min(1),
});

export const GRID_PHASE_NAMES = ['main_sequence', 'hertzsprung_gap', 'giant_branch', 'core_helium_burning', 'early_agb', 'tp_agb'] as const;

/**
 * `[grid]`: use an isochrone grid that the user brings instead of the built-in model. Either `cache`, a
 * grid.arrow written by `coeval grid import` (fast to open), or `files` with a column map, imported when
 * the config is read. The same table, in a file of its own, is the column map for `coeval grid import`.
 */
export const gridSection = z
  .strictObject({
    cache: z.string().min(1).optional(),
    files: z.array(fileEntry).min(1).optional(),
    format: z.enum(['auto', 'text', 'csv', 'arrow']).default('auto'),
    comment: z.string().min(1).default('#'),
    /** Text tables: one delimiter character; default runs of blanks (CSV files: a comma). */
    delimiter: z.string().min(1).max(2).optional(),
    /** Short name of the grid for summaries. Default: the first file's name. */
    name: z.string().min(1).optional(),
    /** The model family's citation, printed in every summary and report. */
    citation: z.string().default(''),
    age_unit: z.enum(['log_yr', 'yr', 'myr', 'gyr']).default('log_yr'),
    metallicity_scale: z.enum(['fe_h', 'm_h', 'z']).default('fe_h'),
    /** The model family's solar Z: needed when metallicity_scale = "z" ([M/H] = log10(Z / solar_z)). */
    solar_z: z.number().gt(0).lt(0.1).optional(),
    /** [alpha/Fe] of the grid's mixture, for [M/H] -> [Fe/H] (Salaris et al. 1993). */
    alpha_fe: z.number().min(-0.5).max(1).default(0),
    phase_kind: z.enum(['eep', 'stage']).optional(),
    /** A regular expression with one group: each isochrone's age from the comment lines above it. */
    age_in_header: z.string().min(1).optional(),
    metallicity_in_header: z.string().min(1).optional(),
    /** Drop rows with a NaN in a mapped column instead of refusing the grid. */
    drop_nan_rows: z.boolean().default(false),
    columns: columnsSchema.optional(),
    /** Band -> magnitude column. */
    bands: z.partialRecord(z.enum(BAND_IDS), z.string().min(1)).optional(),
    /** Stage label -> coeval phase, for phase_kind = "stage" (optional). */
    stages: z.record(z.string(), z.enum(GRID_PHASE_NAMES)).optional(),
  })
  .refine((g) => (g.cache === undefined) !== (g.files === undefined), {
    message: 'give either cache (a grid.arrow from `coeval grid import`) or files with a column map, not both or neither',
  })
  .refine((g) => g.files === undefined || (g.columns !== undefined && g.bands !== undefined && Object.keys(g.bands).length > 0), {
    message: 'files need a column map: a [grid.columns] table (mass_initial, log_teff, log_l, ...) and a [grid.bands] table (band = column)',
  });
export type GridConfig = z.infer<typeof gridSection>;

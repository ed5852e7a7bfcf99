import { z } from 'zod';

/** Formats the readers understand; `auto` picks one from the file name and its first bytes. */
export const CATALOGUE_FORMATS = ['auto', 'csv', 'tsv', 'whitespace', 'ecsv', 'fits', 'votable', 'arrow', 'parquet'] as const;

/** A row filter on any catalogue column. Rows with NaN in the column are dropped by a min/max cut. */
export const cutSchema = z
  .strictObject({
    column: z.string().min(1),
    min: z.number().optional(),
    max: z.number().optional(),
    /** Keep rows whose value equals this (e.g. a quality flag). */
    equals: z.union([z.number(), z.string(), z.boolean()]).optional(),
  })
  .refine((c) => c.min === undefined || c.max === undefined || c.min < c.max, {
    message: 'min must be below max (the bounds are inverted)',
  })
  .refine((c) => c.min !== undefined || c.max !== undefined || c.equals !== undefined, {
    message: 'a cut needs at least one of min, max or equals',
  });

/** `[catalogue]`: where the stars come from and which columns hold what, besides the photometry. */
export const catalogueSection = z.strictObject({
  /** Path to the catalogue, relative to the config file. */
  path: z.string().min(1),
  format: z.enum(CATALOGUE_FORMATS).default('auto'),
  /** FITS: the HDU holding the BINTABLE (0 = primary). Default: the first BINTABLE. */
  hdu: z.number().int().min(0).optional(),
  /** VOTable: the 0-based index of the TABLE element, in document order. Default: the first. */
  table: z.number().int().min(0).optional(),
  /** Text tables: the field delimiter (" " for runs of blanks). Default: detected from the first lines. */
  delimiter: z.string().min(1).max(2).optional(),
  /** Text tables: lines starting with this are comments. */
  comment: z.string().min(1).default('#'),
  /** Text tables: whether the first non-comment line names the columns. Default: detected. */
  header: z.boolean().optional(),
  /** Optional columns. */
  id: z.string().min(1).optional(),
  membership: z.string().min(1).optional(),
  parallax: z.string().min(1).optional(),
  parallax_error: z.string().min(1).optional(),
  /** Values that mean "no measurement", e.g. 99.999 or -99. Applied to every mapped numeric column. */
  missing: z.array(z.number()).default([]),
  cuts: z.array(cutSchema).default([]),
  /**
   * For a simulated catalogue: the truth file `coeval simulate` wrote beside it (relative to the config
   * file). A fit then records the true parameter values in its manifest, and summaries and plots show them.
   */
  truth: z.string().min(1).optional(),
});
export type CatalogueConfig = z.infer<typeof catalogueSection>;
export type CutConfig = z.infer<typeof cutSchema>;

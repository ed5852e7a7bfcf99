import { z } from 'zod';
import { BAND_IDS } from '../../core/bands.js';
import { likelihoodSection } from './likelihood.js';
import { modelSection } from './model.js';

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
const fraction = finite.pipe(z.number().min(0).max(1));

/**
 * `[simulate.truth]`: the cluster's true parameters. The age is given once, as log_age (log10 yr) or as
 * age_gyr (Gyr), as in `[priors]`.
 */
const truthSchema = z
  .strictObject({
    log_age: finite.optional(),
    age_gyr: finite.pipe(z.number().positive()).optional(),
    feh: finite,
    dm: finite,
    ebv: finite.pipe(z.number().min(0)),
    f_binary: fraction.default(0),
    /** Fraction of catalogue stars that are field stars (ignored with `membership = true`). */
    f_field: fraction.default(0),
    sigma_extra: finite.pipe(z.number().min(0)).default(0),
  })
  .refine((t) => (t.log_age === undefined) !== (t.age_gyr === undefined), {
    message: 'give the age once: either log_age (log10 yr) or age_gyr (Gyr)',
  });

/** `[simulate.parallax]`: give every star a parallax with this error; field parallaxes are normal. */
const parallaxSchema = z.strictObject({
  error_mas: finite.pipe(z.number().positive()),
  field_mean_mas: finite.default(0.5),
  field_sd_mas: finite.pipe(z.number().positive()).default(0.5),
});

export const SIMULATION_FORMATS = ['auto', 'csv', 'arrow', 'fits'] as const;

/**
 * `[simulate]`: a synthetic catalogue drawn from the likelihood's own forward model. The selection window
 * (`[likelihood.limits]`, bright and faint in every band), the error law (`[likelihood.errors]`, every band),
 * the completeness, the IMF and the binaries' mass ratios come from `[likelihood]`, so that a fit config can
 * copy that section unchanged; `[model]` chooses the stellar model's settings and the extinction law.
 */
export const simulateSection = z.strictObject({
  /** Random seed, an integer in [1, 4294967295]: the same seed and settings give the same catalogue. */
  seed: z.number().int().min(1).max(0xffffffff),
  /** Catalogue stars (after the selection). */
  stars: z.number().int().min(1).max(10_000_000),
  /** Bands, in catalogue order; at least two. */
  bands: z.array(z.enum(BAND_IDS)).min(2).refine((b) => new Set(b).size === b.length, { message: 'a band is listed twice' }),
  /** The catalogue file to write, relative to the config file. */
  output: z.string().min(1),
  /** csv, arrow (Arrow IPC file) or fits (a binary table); auto: from the file name's extension. */
  format: z.enum(SIMULATION_FORMATS).default('auto'),
  /** The truth file (JSON); default: the catalogue's name with `.truth.json`. */
  truth_file: z.string().min(1).optional(),
  /** Prefix of the star identifiers (`<prefix>000001`, ...). */
  id_prefix: z.string().default('S'),
  truth: truthSchema,
  /** Fraction of cluster members that are blue stragglers (placed above the turnoff; outside the likelihood's model). */
  blue_straggler_fraction: fraction.default(0),
  /** Give every star a prior membership probability (and draw membership from it) instead of using f_field. */
  membership: z.boolean().default(false),
  parallax: parallaxSchema.optional(),
  /** Probability, per band, that a star's magnitude is missing. */
  missing: z.partialRecord(z.enum(BAND_IDS), fraction).default({}),
});
export type SimulateConfig = z.infer<typeof simulateSection>;

/** A simulation config file: `[simulate]`, with `[likelihood]` and `[model]` as in fit configs. */
export const simulationConfigSchema = z.strictObject({
  simulate: simulateSection,
  likelihood: likelihoodSection.prefault({}),
  model: modelSection.prefault({}),
});
export type SimulationConfig = z.infer<typeof simulationConfigSchema>;

import { z } from 'zod';
import { BAND_IDS, type BandId } from '../../core/bands.js';

/** `[likelihood.limits.<band>]`: the catalogue's selection window in one band. */
const bandLimits = z
  .strictObject({
    /** Brightest magnitude kept (the smaller number). */
    bright: z.number().optional(),
    /** Faintest magnitude kept. */
    faint: z.number().optional(),
  })
  .refine((l) => l.bright === undefined || l.faint === undefined || l.bright < l.faint, {
    message: 'bright must be a smaller magnitude than faint (the limits are inverted)',
  });

/** `[likelihood.errors.<band>]`: typical error against magnitude, sigma(m) = a + b 10^(0.4 (m - m_ref)). */
const errorLaw = z.strictObject({
  a: z.number().min(0),
  b: z.number().min(0),
  m_ref: z.number(),
});

const perBand = <T extends z.ZodType>(schema: T) =>
  z.strictObject(Object.fromEntries(BAND_IDS.map((b) => [b, schema.optional()])) as Record<BandId, z.ZodOptional<T>>);

/**
 * `[likelihood]`: hyper-settings of the mixture likelihood (not sampled). The sampled parameters and their
 * priors live in the fit's own section.
 */
export const likelihoodSection = z.strictObject({
  /** Initial mass function: Kroupa 2001 (default), Salpeter 1955, Chabrier 2003. */
  imf: z.enum(['kroupa2001', 'salpeter1955', 'chabrier2003']).default('kroupa2001'),
  /** What f_binary counts: `all` cluster systems, or the `catalogued` ones (after selection). */
  binary_fraction_of: z.enum(['all', 'catalogued']).default('all'),
  binaries: z
    .strictObject({
      /** Smallest mass ratio q = M2 / M1. */
      q_min: z.number().gt(0).lt(1).default(0.1),
      /** Power of q in the mass-ratio density (0 = uniform). */
      q_slope: z.number().min(-3).max(10).default(0),
    })
    .default({ q_min: 0.1, q_slope: 0 }),
  field: z
    .strictObject({
      /** `uniform` over the observed window, or `kde` of a comparison-field catalogue. */
      model: z.enum(['uniform', 'kde']).default('uniform'),
      /** The comparison-field catalogue (same columns as [catalogue]), relative to the config file. */
      comparison: z.string().min(1).optional(),
      /** Multiplies the Scott's-rule bandwidth of the KDE. */
      bandwidth_scale: z.number().gt(0).default(1),
    })
    .refine((f) => f.model !== 'kde' || f.comparison !== undefined, { message: 'the kde field model needs a comparison catalogue (key comparison)', path: ['comparison'] })
    .default({ model: 'uniform', bandwidth_scale: 1 }),
  /** Selection window per band. */
  limits: perBand(bandLimits).default({}),
  /** Completeness against magnitude in one band, linearly interpolated, constant beyond the ends. */
  completeness: z
    .strictObject({
      band: z.enum(BAND_IDS),
      magnitudes: z.array(z.number()).min(2),
      fractions: z.array(z.number().min(0).max(1)).min(2),
    })
    .refine((c) => c.magnitudes.length === c.fractions.length, { message: 'give one fraction per magnitude' })
    .refine((c) => c.magnitudes.every((m, i) => i === 0 || m > c.magnitudes[i - 1]), { message: 'magnitudes must increase' })
    .optional(),
  /** Typical errors for the selection normalisation; default: running medians of the catalogue's errors. */
  errors: perBand(errorLaw).default({}),
  parallax: z
    .strictObject({
      /** Use the catalogue's parallaxes when it has them. */
      use: z.boolean().default(true),
      /** Observed minus true parallax; Gaia EDR3 quasars give -0.017 mas (Lindegren et al. 2021, A&A 649, A4). */
      zero_point_mas: z.number().default(-0.017),
      /** Field parallax density (normal); default: mean and spread of the catalogue's parallaxes. */
      field_mean_mas: z.number().optional(),
      field_sd_mas: z.number().gt(0).optional(),
    })
    .default({ use: true, zero_point_mas: -0.017 }),
  numerics: z
    .strictObject({
      /** Largest deviation of the model polyline from the isochrone, mag. */
      polyline_tolerance_mag: z.number().gt(0).max(0.01).default(1e-4),
      /** Skip segments whose contribution bound is below e^-prune_log_ratio of the largest. */
      prune_log_ratio: z.number().min(8).max(50).default(14),
      /** Largest step of the mass-ratio quadrature, in units of each star's error. */
      q_step_sigma: z.number().gt(0).max(3).default(1.5),
    })
    .default({ polyline_tolerance_mag: 1e-4, prune_log_ratio: 14, q_step_sigma: 1.5 }),
});
export type LikelihoodConfig = z.infer<typeof likelihoodSection>;

import type { BandId } from '../core/bands.js';
import type { LikelihoodConfig } from '../config/sections/likelihood.js';
import type { LikelihoodOptions } from '../likelihood/options.js';

/**
 * The `[likelihood]` config section as likelihood options. A KDE field needs the comparison catalogue's
 * magnitudes in the fitted bands (read by the caller with the catalogue readers), one array per band.
 */
export function likelihoodOptionsFromConfig(c: LikelihoodConfig, comparisonMag?: Float64Array[]): Partial<LikelihoodOptions> {
  const limits: LikelihoodOptions['limits'] = {};
  for (const [band, l] of Object.entries(c.limits) as [BandId, { bright?: number; faint?: number } | undefined][]) if (l) limits[band] = { ...l };
  const errorLaw: NonNullable<LikelihoodOptions['errorLaw']> = {};
  for (const [band, e] of Object.entries(c.errors) as [BandId, { a: number; b: number; m_ref: number } | undefined][]) if (e) errorLaw[band] = { a: e.a, b: e.b, mRef: e.m_ref };
  return {
    imf: c.imf,
    binaryFractionOf: c.binary_fraction_of,
    qMin: c.binaries.q_min,
    qGamma: c.binaries.q_slope,
    field: { kind: c.field.model, comparisonMag, bandwidthScale: c.field.bandwidth_scale },
    limits,
    completeness: c.completeness ? { band: c.completeness.band, mag: [...c.completeness.magnitudes], fraction: [...c.completeness.fractions] } : undefined,
    errorLaw: Object.keys(errorLaw).length > 0 ? errorLaw : undefined,
    parallax: { use: c.parallax.use, zeroPointMas: c.parallax.zero_point_mas, fieldMeanMas: c.parallax.field_mean_mas, fieldSdMas: c.parallax.field_sd_mas },
    polylineToleranceMag: c.numerics.polyline_tolerance_mag,
    pruneLogRatio: c.numerics.prune_log_ratio,
    qStepSigma: c.numerics.q_step_sigma,
  };
}

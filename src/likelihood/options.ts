/**
 * The likelihood's hyper-settings as plain data (structured-cloneable, so that a worker thread can rebuild
 * the likelihood from them). The config section `[likelihood]` maps onto this (pipeline/likelihoodOptions.ts).
 */
import type { BandId } from '../core/bands.js';
import type { ImfName } from './imf.js';

export interface BandLimits {
  /** Brightest magnitude in the catalogue's selection (smaller number). */
  bright?: number;
  /** Faintest magnitude (larger number). */
  faint?: number;
}

export interface FieldOptions {
  /**
   * `uniform`: field stars spread evenly over the observed window (times the completeness).
   * `kde`: a Gaussian product-kernel density estimate from a comparison-field catalogue with the same
   * selection as the cluster catalogue, per-band bandwidth from Scott's rule times `bandwidthScale`.
   */
  kind: 'uniform' | 'kde';
  /** For `kde`: comparison-field magnitudes, one array per likelihood band (NaN = missing). */
  comparisonMag?: Float64Array[];
  bandwidthScale?: number;
}

export interface ParallaxOptions {
  /** Use the catalogue's parallaxes when it has them (default true). */
  use: boolean;
  /** Added to the cluster's true parallax: observed = true + zeroPoint. Default -0.017 mas (Lindegren et al. 2021). */
  zeroPointMas: number;
  /** Field parallax density: normal with this mean and standard deviation (defaults from the catalogue). */
  fieldMeanMas?: number;
  fieldSdMas?: number;
}

export interface LikelihoodOptions {
  imf: ImfName;
  /** Binary mass ratios: q in [qMin, 1] with density ∝ q^gamma (gamma = 0: uniform). */
  qMin: number;
  qGamma: number;
  /**
   * What f_binary counts. `all`: the fraction of all cluster systems that are binaries (the selection then
   * favours binaries, which are brighter). `catalogued`: the fraction among cluster systems in the catalogue.
   */
  binaryFractionOf: 'all' | 'catalogued';
  field: FieldOptions;
  /** Per band; a band without limits gets the catalogue's own range (stated in `describe`). */
  limits: Partial<Record<BandId, BandLimits>>;
  completeness?: { band: BandId; mag: number[]; fraction: number[] };
  /**
   * Typical error against magnitude per band, sigma(m) = a + b 10^(0.4 (m - mRef)), used for the
   * selection normalisation. Default: running medians of the catalogue's own errors.
   */
  errorLaw?: Partial<Record<BandId, { a: number; b: number; mRef: number }>>;
  parallax: ParallaxOptions;
  /** Model polyline tolerance (mag), see polyline.ts. */
  polylineToleranceMag: number;
  /** Segments whose contribution bound is below e^-pruneLogRatio of the largest are skipped. */
  pruneLogRatio: number;
  /**
   * Largest step of the q quadrature between neighbouring curves, in units of the star's own error
   * (Mahalanobis), see qGrid.ts. The trapezoid rule's error on a Gaussian bump sampled every h sigma is
   * about 2 exp(-2 pi^2 / h^2): 3e-4 at the default 1.5.
   */
  qStepSigma: number;
  /** false: integrate every segment for every star (for benchmarks and checks). */
  prune: boolean;
}

export const DEFAULT_LIKELIHOOD_OPTIONS: LikelihoodOptions = {
  imf: 'kroupa2001',
  qMin: 0.1,
  qGamma: 0,
  binaryFractionOf: 'all',
  field: { kind: 'uniform' },
  limits: {},
  parallax: { use: true, zeroPointMas: -0.017 },
  polylineToleranceMag: 1e-4,
  pruneLogRatio: 14,
  qStepSigma: 1.5,
  prune: true,
};

/** Options with defaults filled in. */
export function withDefaults(o: Partial<LikelihoodOptions> = {}): LikelihoodOptions {
  return {
    ...DEFAULT_LIKELIHOOD_OPTIONS,
    ...o,
    field: { ...DEFAULT_LIKELIHOOD_OPTIONS.field, ...(o.field ?? {}) },
    parallax: { ...DEFAULT_LIKELIHOOD_OPTIONS.parallax, ...(o.parallax ?? {}) },
    limits: { ...(o.limits ?? {}) },
  };
}

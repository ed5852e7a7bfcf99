import type { BandId } from '../core/bands.js';

/**
 * Evolutionary phases an isochrone can hold. Numbering follows the order a star passes through them, so
 * the phase label never decreases along an isochrone. Pre-main-sequence stars and remnants are not modelled.
 */
export enum Phase {
  MainSequence = 1,
  HertzsprungGap = 2,
  GiantBranch = 3,
  CoreHeliumBurning = 4,
  EarlyAGB = 5,
  ThermallyPulsingAGB = 6,
}

/** Where a model's numbers come from; printed in manifests, summaries and reports. */
export interface ModelProvenance {
  /** Short name, e.g. `coeval built-in (HPT2000 + ...)` or the grid's name. */
  model: string;
  /** Evolution source (citation). */
  evolution: string;
  /** Solar metallicity of the model's calibration, as used to turn [M/H] into Z. */
  solarZ: number;
  /** [alpha/Fe] assumed. */
  alphaFe: number;
  /** Photometric calibration per band (citation and validity range). */
  bands: Partial<Record<BandId, string>>;
  /** Honest statements of where the model is approximate. */
  caveats: string[];
}

/**
 * One isochrone: stars of one age and metallicity, ordered by initial mass (equivalently by evolutionary
 * progress). All arrays have the same length. Magnitudes are absolute and unreddened.
 */
export interface Isochrone {
  logAgeYr: number;
  feh: number;
  massInitial: Float64Array;
  massCurrent: Float64Array;
  phase: Uint8Array;
  /**
   * A coordinate that rises strictly along the isochrone and marks the same evolutionary point at
   * neighbouring ages and metallicities (e.g. phase index plus the fraction of that phase completed).
   * Interpolation between isochrones matches points of equal phase coordinate.
   */
  phaseCoord: Float64Array;
  logL: Float64Array;
  logTeff: Float64Array;
  logg: Float64Array;
  bands: BandId[];
  /** absMag[b][k]: absolute magnitude of node k in bands[b]. */
  absMag: Float64Array[];
  provenance: ModelProvenance;
}

export interface IsochroneRequest {
  bands: readonly BandId[];
}

/**
 * Anything that gives isochrones: the built-in model, or a grid that a user brings. `isochrone` returns
 * undefined where the source has no isochrone (outside its ages or metallicities); the likelihood turns
 * that into log L = -Infinity, which is distinct from a legitimately tiny likelihood.
 */
export interface IsochroneSource {
  readonly provenance: ModelProvenance;
  readonly bands: readonly BandId[];
  readonly domain: { logAgeYr: readonly [number, number]; feh: readonly [number, number] };
  isochrone(logAgeYr: number, feh: number, request: IsochroneRequest): Isochrone | undefined;
}

/**
 * Turns stellar parameters into absolute magnitudes: bolometric corrections and colour-temperature
 * relations. Kept separate from evolution so that calibrations can be swapped and tested on their own.
 */
export interface PhotometryModel {
  readonly bands: readonly BandId[];
  /** Per band: citation, validity range, and behaviour at the range edges. */
  readonly provenance: Partial<Record<BandId, string>>;
  /**
   * Absolute magnitudes of n stars in `bands`: out[b][k] for star k. Inputs are log10(L / Lsun),
   * log10(Teff / K) and log10(g / cm s^-2); feh is [Fe/H]. Must be continuous in every input (a jump
   * becomes a cliff in the posterior) and must not allocate per star.
   */
  absoluteMagnitudes(
    bands: readonly BandId[],
    logL: Float64Array,
    logTeff: Float64Array,
    logg: Float64Array,
    feh: number,
    out: Float64Array[],
    n: number,
  ): void;
}

/**
 * Interstellar extinction by band. A_b = R_b * E(B-V), where R_b may depend on the star's intrinsic
 * spectrum (Gaia's broad bands): the ratio is evaluated per star at E(B-V) -> 0 and applied linearly.
 */
export interface ExtinctionModel {
  /** Law, R_V, and the source of any colour-dependent coefficients. */
  readonly provenance: string;
  /** out[b][k] = A_b / E(B-V) for star k with intrinsic log Teff and log g, at metallicity feh. */
  ratios(bands: readonly BandId[], logTeff: Float64Array, logg: Float64Array, feh: number, out: Float64Array[], n: number): void;
}

/**
 * The built-in photometric calibration as a PhotometryModel: absolute magnitudes in B V Rc Ic, Gaia DR3
 * G BP RP and 2MASS J H Ks from (log L, log Teff, log g, [Fe/H]).
 *
 * M_b = M_bol,sun - 2.5 log(L/Lsun) - BC_b, with M_bol,sun = 4.74 (IAU 2015 Resolution B2) and BC_b from
 * the lookup table of the calibration (bcTable.ts): a few nanoseconds per star and band, no allocation per
 * star. The calibration itself, its sources and edges: provenance.ts.
 */
import { ModelError } from '../../core/errors.js';
import type { BandId } from '../../core/bands.js';
import type { PhotometryModel } from '../types.js';
import { bcTable, gridPosition, interpolate, newGridPosition } from './bcTable.js';
import { isPhotometryBand, PHOTOMETRY_BANDS } from './bolometricCorrections.js';
import { PHOTOMETRY_PROVENANCE } from './provenance.js';

/** Absolute bolometric magnitude of the Sun, IAU 2015 Resolution B2. */
export const M_BOL_SUN = 4.74;

const pos = newGridPosition();
/** Tables of the bands of the current call; reused across calls (no allocation per call). */
const callTables: Float32Array[] = [];

function resolveTables(bands: readonly BandId[], feh: number): void {
  callTables.length = bands.length;
  for (let b = 0; b < bands.length; b++) {
    const band = bands[b];
    if (!isPhotometryBand(band)) {
      throw new ModelError(`the built-in photometry has no calibration for band ${band}`, {
        found: band,
        expected: `one of ${PHOTOMETRY_BANDS.join(', ')}`,
        hint: band === 'U' ? 'U is not modelled by the built-in calibration; fit without it, or bring an isochrone grid that has U' : undefined,
      });
    }
    callTables[b] = bcTable(band, feh);
  }
}

function absoluteMagnitudes(
  bands: readonly BandId[],
  logL: Float64Array,
  logTeff: Float64Array,
  logg: Float64Array,
  feh: number,
  out: Float64Array[],
  n: number,
): void {
  resolveTables(bands, feh);
  const nb = bands.length;
  if (out.length < nb) throw new ModelError(`absoluteMagnitudes needs one output array per band: got ${out.length} for ${nb} bands`);
  for (let k = 0; k < n; k++) {
    if (!gridPosition(logTeff[k], logg[k], feh, pos)) {
      for (let b = 0; b < nb; b++) out[b][k] = NaN;
      continue;
    }
    const mbol = M_BOL_SUN - 2.5 * logL[k];
    for (let b = 0; b < nb; b++) out[b][k] = mbol - interpolate(callTables[b], pos);
  }
}

const MODEL: PhotometryModel = {
  bands: PHOTOMETRY_BANDS,
  provenance: PHOTOMETRY_PROVENANCE,
  absoluteMagnitudes,
};

/**
 * The built-in photometric calibration. Its table is filled on demand, per photometric system (B V R I; G BP
 * RP J H Ks) and per 0.1 dex of [Fe/H]: the first call at a new metallicity costs a few milliseconds.
 */
export function builtinPhotometry(): PhotometryModel {
  return MODEL;
}

/** BC of one band at one point from the table (for callers outside the hot path, e.g. extinction). */
export function tabulatedBc(band: BandId, logTeff: number, logg: number, feh: number): number {
  if (!isPhotometryBand(band)) throw new ModelError(`the built-in photometry has no calibration for band ${band}`);
  const p = newGridPosition();
  if (!gridPosition(logTeff, logg, feh, p)) return NaN;
  return interpolate(bcTable(band, feh), p);
}

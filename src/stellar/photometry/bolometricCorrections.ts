/**
 * Bolometric corrections BC_b = M_bol - M_b of every band the built-in photometry covers, evaluated
 * directly from the published relations (johnsonCousins.ts, gaia2mass.ts). Exact but slow (each colour is a
 * root-find): used to fill the lookup table (bcTable.ts), as the reference in tests and benchmarks, and for
 * one-off evaluations.
 */
import type { BandId } from '../../core/bands.js';
import { gaiaTwoMassPoint, type GaiaTwoMassPoint } from './gaia2mass.js';
import { johnsonCousinsPoint, type JohnsonCousinsPoint } from './johnsonCousins.js';

/** Bands with a calibration. U is not covered: none of the adopted relations calibrates U-B or U-V. */
export const PHOTOMETRY_BANDS = ['B', 'V', 'R', 'I', 'G', 'BP', 'RP', 'J', 'H', 'Ks'] as const satisfies readonly BandId[];
export type PhotometryBand = (typeof PHOTOMETRY_BANDS)[number];

export const JOHNSON_COUSINS_BANDS = ['B', 'V', 'R', 'I'] as const satisfies readonly PhotometryBand[];
export const GAIA_2MASS_BANDS = ['G', 'BP', 'RP', 'J', 'H', 'Ks'] as const satisfies readonly PhotometryBand[];

export function isPhotometryBand(b: string): b is PhotometryBand {
  return (PHOTOMETRY_BANDS as readonly string[]).includes(b);
}

/** BC_B, BC_V, BC_R, BC_I (in that order) into out[0..3] from BC_V and the colours. */
export function johnsonCousinsBcsFrom(p: JohnsonCousinsPoint, out: Float64Array | Float32Array, offset = 0): void {
  out[offset] = p.bcV - p.bv;
  out[offset + 1] = p.bcV;
  out[offset + 2] = p.bcV + p.vr;
  out[offset + 3] = p.bcV + p.vi;
}

/** BC_G, BC_BP, BC_RP, BC_J, BC_H, BC_Ks (in that order) into out[0..5] from BC_G and the colours. */
export function gaiaTwoMassBcsFrom(p: GaiaTwoMassPoint, out: Float64Array | Float32Array, offset = 0): void {
  // M_BP = M_G - (G-BP), M_RP = M_BP - (BP-RP), M_J = M_G - (G-J), ...
  out[offset] = p.bcG;
  out[offset + 1] = p.bcG + p.gBp;
  out[offset + 2] = p.bcG + p.gBp + p.bpRp;
  out[offset + 3] = p.bcG + p.gJ;
  out[offset + 4] = p.bcG + p.gH;
  out[offset + 5] = p.bcG + p.gKs;
}

export function johnsonCousinsBcs(logTeff: number, logg: number, feh: number, out: Float64Array): void {
  johnsonCousinsBcsFrom(johnsonCousinsPoint(logTeff, logg, feh), out);
}

export function gaiaTwoMassBcs(logTeff: number, logg: number, feh: number, out: Float64Array): void {
  gaiaTwoMassBcsFrom(gaiaTwoMassPoint(logTeff, logg, feh), out);
}

const jc = new Float64Array(4);
const gaia = new Float64Array(6);

/** BC of one band at one point, evaluated directly. */
export function bolometricCorrection(band: PhotometryBand, logTeff: number, logg: number, feh: number): number {
  const j = (JOHNSON_COUSINS_BANDS as readonly string[]).indexOf(band);
  if (j >= 0) {
    johnsonCousinsBcs(logTeff, logg, feh, jc);
    return jc[j];
  }
  gaiaTwoMassBcs(logTeff, logg, feh, gaia);
  return gaia[(GAIA_2MASS_BANDS as readonly string[]).indexOf(band)];
}

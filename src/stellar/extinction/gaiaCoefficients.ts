/**
 * Colour-dependent extinction coefficients of the broad Gaia DR3 bands: R_X = A_X/E(B-V) as polynomials in
 * the star's intrinsic colour x = (BP-RP)_0, for the CCM89 + O'Donnell 1994 law with R_V = 3.1 (Casagrande
 * et al. 2021, the coefficients distributed with the paper in repo casaluca/colte, colte.py, Gaia DR3 "COD"
 * set):
 *
 *   R_G  = 3.071 - 0.511 x + 0.058 x^2
 *   R_BP = 3.526 - 0.168 x - 0.170 x^2 + 0.060 x^3
 *   R_RP = 2.062 - 0.072 x
 *
 * Range: x is held (smoothly, within 0.05 mag) to 0.20-2.55, the colour range of the Casagrande et al. 2021
 * colour-temperature relations whose stars the coefficients were made for. Hotter stars (blue horizontal
 * branch) therefore take the x = 0.2 values, which underestimates their A_G by a few per cent; the BP cubic
 * turns up beyond 2.55 and is not followed.
 *
 * Other laws or R_V: the coefficients are multiplied by R_V A_law(x_X)/A_V over 3.1 A_COD(x_X)/A_V at the
 * band's pivot wavenumber x_X, i.e. the colour dependence is assumed to be that of CCM89 + O'Donnell. This is
 * an approximation; for CCM89 + O'Donnell at R_V = 3.1 the published polynomials are used unchanged.
 */
import { softClamp } from '../photometry/smooth.js';

export const GAIA_COEFFICIENT_COLOUR_RANGE = [0.2, 2.55] as const;
const HOLD_WIDTH = 0.05;

export type GaiaBand = 'G' | 'BP' | 'RP';

/** The colour at which the polynomials are evaluated: bpRp0 held within the range (C1, NaN stays NaN). */
export function heldColour(bpRp0: number): number {
  return softClamp(bpRp0, GAIA_COEFFICIENT_COLOUR_RANGE[0], GAIA_COEFFICIENT_COLOUR_RANGE[1], HOLD_WIDTH);
}

/** The published polynomials at an already-held colour x. */
export function ratioG(x: number): number {
  return 3.071 + x * (-0.511 + x * 0.058);
}
export function ratioBP(x: number): number {
  return 3.526 + x * (-0.168 + x * (-0.17 + x * 0.06));
}
export function ratioRP(x: number): number {
  return 2.062 - 0.072 * x;
}

/** A_X/E(B-V) for CCM89 + O'Donnell 1994, R_V = 3.1, at intrinsic colour bpRp0. */
export function gaiaExtinctionRatioCod(band: GaiaBand, bpRp0: number): number {
  const x = heldColour(bpRp0);
  return band === 'G' ? ratioG(x) : band === 'BP' ? ratioBP(x) : ratioRP(x);
}

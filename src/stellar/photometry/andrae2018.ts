/**
 * Andrae et al. 2018 (A&A 616, A8), Gaia G-band bolometric correction used by Gaia DR2's FLAME:
 * BC_G = sum a_i (Teff - 5772 K)^i, i = 0..4, one set for 4000-8000 K and one for 3300-4000 K. Numbers as
 * published in the paper and the Gaia DR2 documentation (Sect. 8.3, Table 8.3); solar value BC_G = +0.06
 * with M_bol,sun = 4.74. No gravity or metallicity terms (the paper quotes a spread of about 0.1 mag from
 * them across its grid).
 */
import { poly, pow10, smoothWeight } from './smooth.js';

const WARM = [6.0e-2, 6.731e-5, -6.647e-8, 2.859e-11, -7.197e-15];
const COOL = [1.749, 1.977e-3, 3.737e-7, -8.966e-11, -4.183e-14];

/** The two published pieces differ by 0.004 mag at 4000 K; they are blended across 3950-4050 K. */
const JOIN = [3950, 4050] as const;

export const ANDRAE2018_TEFF_RANGE = [3300, 8000] as const;

/** BC_G at Teff (kelvin), inside the published 3300-8000 K. */
export function andraeBcG(teff: number): number {
  const t = teff - 5772;
  if (teff >= JOIN[1]) return poly(WARM, t);
  if (teff <= JOIN[0]) return poly(COOL, t);
  const w = smoothWeight(teff, JOIN[0], JOIN[1]);
  return (1 - w) * poly(COOL, t) + w * poly(WARM, t);
}

/** dBC_G/dlogTeff (central difference; used only at range edges). */
export function andraeBcGSlope(logTeff: number): number {
  const h = 1e-5;
  return (andraeBcG(pow10(logTeff + h)) - andraeBcG(pow10(logTeff - h))) / (2 * h);
}

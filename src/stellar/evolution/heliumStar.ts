/**
 * Zero-age naked helium stars: HPT2000 section 6.1, eqs. (77)-(79). Used here only as the limits that the
 * zero-age horizontal branch approaches as the envelope mass goes to zero (eqs. 53, 54 and 57); naked
 * helium stars themselves are not modelled.
 */
import { pow } from './fastMath.js';

/** ZAMS luminosity of a helium star of mass m (eq. 77). */
export function lZHe(m: number): number {
  const m3 = m * m * m;
  const m6 = m3 * m3;
  const sq = Math.sqrt(m);
  return (15262 * m6 * m3 * m * pow(m, 0.25)) / (m6 * m3 + 29.54 * m6 * m * sq + 31.18 * m6 + 0.0469);
}

/** ZAMS radius of a helium star of mass m (eq. 78). */
export function rZHe(m: number): number {
  const m3 = m * m * m;
  return (0.2391 * m3 * m * pow(m, 0.6)) / (m3 * m + 0.162 * m3 + 0.0065);
}

/** Helium main-sequence lifetime, Myr (eq. 79). */
export function tHeMS(m: number): number {
  const m2 = m * m;
  const m4 = m2 * m2;
  return (0.4129 + 18.81 * m4 + 1.853 * m4 * m2) / (m4 * m2 * Math.sqrt(m));
}

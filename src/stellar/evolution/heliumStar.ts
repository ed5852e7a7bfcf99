/**
 * Zero-age naked helium stars: HPT2000 section 6.1, eqs. (77)-(79). Used here only as the limits that the
 * zero-age horizontal branch approaches as the envelope mass goes to zero (eqs. 53, 54 and 57); naked
 * helium stars themselves are not modelled.
 */
import { pow } from './fastMath.js';

/** ZAMS luminosity of a helium star of mass m (eq. 77). */
export function lZHe(m: number): number {
  const mCube = m * m * m;
  const mSixth = mCube * mCube;
  const sq = Math.sqrt(m);
  return (15262 * mSixth * mCube * m * pow(m, 0.25)) / (mSixth * mCube + 29.54 * mSixth * m * sq + 31.18 * mSixth + 0.0469);
}

/** ZAMS radius of a helium star of mass m (eq. 78). */
export function rZHe(m: number): number {
  const mCube = m * m * m;
  return (0.2391 * mCube * m * pow(m, 0.6)) / (mCube * m + 0.162 * mCube + 0.0065);
}

/** Helium main-sequence lifetime, Myr (eq. 79). */
export function tHeMS(m: number): number {
  const m2 = m * m;
  const m4 = m2 * m2;
  return (0.4129 + 18.81 * m4 + 1.853 * m4 * m2) / (m4 * m2 * Math.sqrt(m));
}

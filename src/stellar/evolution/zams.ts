/**
 * Zero-age main sequence luminosity and radius of Tout, Pols, Eggleton & Han 1996 (MNRAS 281, 257),
 * eqs. (1) and (2), with the Z-dependent coefficients of their Tables 1 and 2.
 */
import type { Coefficients } from './coefficients.js';

export function zamsLuminosity(c: Coefficients, m: number): number {
  const k = c.zamsL;
  const m2 = m * m;
  const mCube = m2 * m;
  const m5 = mCube * m2;
  const sq = Math.sqrt(m);
  return (k[0] * m5 * sq + k[1] * m5 * m5 * m) / (k[2] + mCube + k[3] * m5 + k[4] * m5 * m2 + k[5] * m5 * mCube + k[6] * m5 * mCube * m * sq);
}

export function zamsRadius(c: Coefficients, m: number): number {
  const k = c.zamsR;
  const m2 = m * m;
  const m6 = m2 * m2 * m2;
  const m8 = m6 * m2;
  const m18 = m8 * m8 * m2;
  const sq = Math.sqrt(m);
  const num = (k[0] * m2 + k[1] * m6) * sq + k[2] * m8 * m2 * m + (k[3] + k[4] * sq) * m18 * m;
  const den = k[5] + k[6] * m2 + (k[7] * m8 + m18 + k[8] * m18 * m) * sq;
  return num / den;
}

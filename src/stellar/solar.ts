/**
 * Nominal solar values of IAU 2015 Resolution B3 (Prsa et al. 2016, AJ 152, 41) and the bolometric
 * magnitude scale of IAU 2015 Resolution B2: T_eff = 5772 K, R = 6.957e8 m, GM = 1.3271244e20 m^3 s^-2,
 * L = 3.828e26 W, M_bol = 4.74. Effective temperature and surface gravity follow from L, R and M in solar
 * units through L = 4 pi R^2 sigma T^4 and g = GM/R^2.
 */
export const TEFF_SUN_K = 5772;
export const LOG_TEFF_SUN = Math.log10(TEFF_SUN_K);
/** log10 of GM_sun / R_sun^2 in cm s^-2 (= 4.4381). */
export const LOG_G_SUN = Math.log10(1.3271244e26 / (6.957e10 * 6.957e10));
export const MBOL_SUN = 4.74;

export function logTeffOf(logL: number, logR: number): number {
  return LOG_TEFF_SUN + 0.25 * logL - 0.5 * logR;
}

export function loggOf(mass: number, logR: number): number {
  return LOG_G_SUN + Math.log10(mass) - 2 * logR;
}

/** Absolute bolometric magnitude on the IAU 2015 B2 scale. */
export function mbolOf(logL: number): number {
  return MBOL_SUN - 2.5 * logL;
}

/**
 * Zero-age naked helium stars: HPT2000 section 6.1, eqs. (77)-(79). Used here only as the limits that the
 * zero-age horizontal branch approaches as the envelope mass goes to zero (eqs. 53, 54 and 57); naked
 * helium stars themselves are not modelled.
 */

/** ZAMS luminosity of a helium star of mass m (eq. 77). */
export function lZHe(m: number): number {
  return (15262 * m ** 10.25) / (m ** 9 + 29.54 * m ** 7.5 + 31.18 * m ** 6 + 0.0469);
}

/** ZAMS radius of a helium star of mass m (eq. 78). */
export function rZHe(m: number): number {
  return (0.2391 * m ** 4.6) / (m ** 4 + 0.162 * m ** 3 + 0.0065);
}

/** Helium main-sequence lifetime, Myr (eq. 79). */
export function tHeMS(m: number): number {
  return (0.4129 + 18.81 * m ** 4 + 1.853 * m ** 6) / m ** 6.5;
}

/**
 * Metallicity scales. A grid states its metallicity as [Fe/H], [M/H] or the mass fraction Z; coeval's
 * parameter is [Fe/H].
 *
 * - Z -> [M/H] = log10(Z / Zsun), with the solar Z of the grid's own calibration (the user states it; it
 *   differs between families, e.g. 0.0134 to 0.02). This is the usual convention for tables that give Z;
 *   it neglects the change of the hydrogen fraction X with Z (a few 0.01 dex at super-solar Z), which is
 *   the family's choice to make, not ours: families that define [M/H] through Z/X publish [M/H] too, and
 *   the user can then map that column instead.
 * - [M/H] -> [Fe/H] for an alpha-enhanced mixture: Salaris, Chieffi & Straniero 1993 (ApJ 414, 580),
 *   [M/H] = [Fe/H] + log10(0.638 f + 0.362), f = 10^[alpha/Fe]. For [alpha/Fe] = 0, [M/H] = [Fe/H].
 */

/** Salaris et al. 1993: the [M/H] of a mixture with the given [Fe/H] and [alpha/Fe]. */
export function fehToMh(feh: number, alphaFe = 0): number {
  return feh + salarisTerm(alphaFe);
}

export function mhToFeh(mh: number, alphaFe = 0): number {
  return mh - salarisTerm(alphaFe);
}

function salarisTerm(alphaFe: number): number {
  return alphaFe === 0 ? 0 : Math.log10(0.638 * 10 ** alphaFe + 0.362);
}

/** [M/H] = log10(Z / Zsun). */
export function zToMh(z: number, solarZ: number): number {
  return Math.log10(z / solarZ);
}

/** Z = Zsun 10^[M/H]. */
export function mhToZ(mh: number, solarZ: number): number {
  return solarZ * 10 ** mh;
}

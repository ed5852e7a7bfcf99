/**
 * From [Fe/H] to the model's Z. Alpha-enhanced mixtures are mapped onto scaled-solar ones of the same
 * total metallicity by Salaris, Chieffi & Straniero 1993 (ApJ 414, 580):
 * [M/H] = [Fe/H] + log10(0.638 f + 0.362), f = 10^[alpha/Fe]; then Z = Zsun 10^[M/H] with the
 * model's own solar metallicity, Zsun = 0.02, the calibration of Hurley, Pols & Tout 2000.
 */

/** Solar metallicity of the HPT2000 calibration. */
export const MODEL_SOLAR_Z = 0.02;

export function metallicityMH(feh: number, alphaFe: number): number {
  return feh + Math.log10(0.638 * 10 ** alphaFe + 0.362);
}

export function fehToZ(feh: number, alphaFe = 0): number {
  return MODEL_SOLAR_Z * 10 ** metallicityMH(feh, alphaFe);
}

/** The inverse: [Fe/H] for a given Z (used to state the model's [Fe/H] domain). */
export function zToFeh(Z: number, alphaFe = 0): number {
  return Math.log10(Z / MODEL_SOLAR_Z) - Math.log10(0.638 * 10 ** alphaFe + 0.362);
}

/**
 * The photometric bands coeval knows. Band identifiers are the names astronomers write (Johnson-Cousins
 * U B V R I, where R and I are the Cousins Rc and Ic; Gaia DR3 G, BP, RP; 2MASS J, H, Ks).
 * A single effective wavenumber per band is adequate for extinction in the Johnson and 2MASS bands; the
 * broad Gaia bands need colour-dependent coefficients instead.
 */
export const BAND_IDS = ['U', 'B', 'V', 'R', 'I', 'G', 'BP', 'RP', 'J', 'H', 'Ks'] as const;
export type BandId = (typeof BAND_IDS)[number];

export interface BandInfo {
  id: BandId;
  system: 'Johnson-Cousins' | 'Gaia DR3' | '2MASS';
  /** Effective wavenumber in inverse micrometres (the unit extinction laws are written in). */
  xInvUm: number;
  /** Where the wavenumber comes from. */
  source: string;
  /**
   * Effective wavenumber at which an extinction law is evaluated for this band, where it differs from
   * xInvUm because xInvUm is a conventional point rather than this band's own (see below). Absent: use xInvUm.
   */
  xExtinctionInvUm?: number;
  /** Where xExtinctionInvUm comes from. */
  extinctionSource?: string;
}

/*
 * Johnson-Cousins and 2MASS: the band wavenumbers of Cardelli, Clayton & Mathis 1989 (ApJ 345, 245),
 * Table 3 (U 2.78, B 2.27, V 1.82, R 1.43, I 1.11, J 0.80, H 0.63, K 0.46 per micron), at which their
 * A_lambda/A_V is conventionally quoted. The same values are the x grid of the CCM89 reference test in
 * karllark/dust_extinction. Gaia: pivot wavelengths of the DR3 passbands, G 0.622, BP 0.511, RP 0.777 um
 * (from memory); they are used for labels only, since Gaia extinction is colour-dependent (stellar/extinction).
 */
const CCM = 'Cardelli, Clayton & Mathis 1989, Table 3';
/*
 * CCM89's R and I wavenumbers (1.43, 1.11 per micron: 0.70 and 0.90 micron) are those of Johnson's R and I.
 * Cousins Rc and Ic are bluer; evaluating a law at 1.11 instead of Ic's wavenumber would give
 * E(V-Ic)/E(B-V) = 1.62 instead of about 1.25. Extinction therefore uses the mean wavenumbers of the
 * Bessell 1990 (PASP 102, 1181) Rc and Ic passbands, as tabulated in repo desihub/speclite
 * (speclite/data/filters/bessell-R.ecsv, bessell-I.ecsv), weighted by a 5772 K black body: 0.6522 and
 * 0.8013 micron. (For 4000 K and 9700 K the same weighting gives 1.511-1.551 and 1.243-1.252 per micron.)
 */
const COUSINS = 'Bessell 1990 passband, mean wavelength for a 5772 K black body';
const GAIA = 'Gaia DR3 passband pivot wavelength (from memory)';
export const BANDS: Readonly<Record<BandId, BandInfo>> = {
  U: { id: 'U', system: 'Johnson-Cousins', xInvUm: 2.78, source: CCM },
  B: { id: 'B', system: 'Johnson-Cousins', xInvUm: 2.27, source: CCM },
  V: { id: 'V', system: 'Johnson-Cousins', xInvUm: 1.82, source: CCM },
  R: { id: 'R', system: 'Johnson-Cousins', xInvUm: 1.43, source: CCM, xExtinctionInvUm: 1 / 0.6522, extinctionSource: COUSINS },
  I: { id: 'I', system: 'Johnson-Cousins', xInvUm: 1.11, source: CCM, xExtinctionInvUm: 1 / 0.8013, extinctionSource: COUSINS },
  G: { id: 'G', system: 'Gaia DR3', xInvUm: 1 / 0.622, source: GAIA },
  BP: { id: 'BP', system: 'Gaia DR3', xInvUm: 1 / 0.511, source: GAIA },
  RP: { id: 'RP', system: 'Gaia DR3', xInvUm: 1 / 0.777, source: GAIA },
  J: { id: 'J', system: '2MASS', xInvUm: 0.8, source: CCM },
  H: { id: 'H', system: '2MASS', xInvUm: 0.63, source: CCM },
  Ks: { id: 'Ks', system: '2MASS', xInvUm: 0.46, source: `${CCM} (K)` },
};

export function isBandId(s: string): s is BandId {
  return (BAND_IDS as readonly string[]).includes(s);
}

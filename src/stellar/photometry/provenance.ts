/**
 * What the built-in photometry is made of, band by band: printed in manifests, summaries and reports.
 * Each string names the relation, where it holds, and what happens beyond.
 */
import type { PhotometryBand } from './bolometricCorrections.js';

const MBOL = 'M_b = 4.74 - 2.5 log(L/Lsun) - BC_b (M_bol,sun = 4.74, IAU 2015 B2)';
const BCV =
  'BC_V: Flower 1996 as corrected by Torres 2010 (Table 1), no [Fe/H] or log g terms, pieces blended at log Teff 3.70 and 3.90; ' +
  'used over 3160-45 000 K for giants and 4250-45 000 K for dwarfs (dwarf and giant blended over log g 3.0-3.6); beyond, a black body\'s BC_V continued with the slope matched ' +
  '(approximate: M dwarfs 3000-3900 K within about 0.2 mag of Pecaut & Mamajek 2013)';
const JC_COLOURS =
  'dwarfs and subgiants: Casagrande et al. 2010 (Table 4, -5 <= [Fe/H] <= 0.3-0.4); giants: Ramirez & Melendez 2005 (Tables 3 and 5, colour ranges by [Fe/H] bin, bins blended over +-0.1 dex); ' +
  'blended over log g 3.0-3.6; each inverted on its published colour range';
const HOT_COOL =
  'beyond the range: hotter, the colour follows Flower 1996 B-V scaled by its mean slope ratio over the last 0.1 dex of the range; cooler, a black body\'s colour with the slope matched (ratio kept in 0.5-2.5)';
const BCG =
  'BC_G: Andrae et al. 2018 (3300-8000 K, no [Fe/H] or log g terms; pieces blended over 3950-4050 K); hotter, Flower\'s BC_V shape with an offset (G - V nearly constant for B and A stars); cooler, a black body\'s BC_G with the slope matched';
const C21 = (colour: string, dwarfs: string, giants: string) =>
  `${colour}: Casagrande et al. 2021, Gaia DR3 relation with log g and [Fe/H] terms (colour range ${dwarfs} for dwarfs, ${giants} for giants, blended over log g 3.0-3.4; 4000-8000 K; [Fe/H] held within -4 to +0.6)`;

export const PHOTOMETRY_PROVENANCE: Readonly<Record<PhotometryBand, string>> = {
  V: `Johnson V. ${MBOL}. ${BCV}.`,
  B: `Johnson B = V + (B-V). B-V: ${JC_COLOURS}; hotter than the range handed over to Flower 1996 B-V (Torres 2010 Table 2) within 0.05 dex, cooler following Flower's shape with an offset. V: ${BCV}.`,
  R: `Cousins Rc = V - (V-Rc). V-Rc: ${JC_COLOURS}; ${HOT_COOL}. V: ${BCV}.`,
  I: `Cousins Ic = V - (V-Ic). V-Ic: ${JC_COLOURS}; ${HOT_COOL}. V: ${BCV}.`,
  G: `Gaia DR3 G. ${MBOL}. ${BCG}.`,
  BP: `Gaia DR3 BP = G - (G-BP). ${C21('G-BP', '-1.00 to -0.15', '-1.40 to -0.15')}; ${HOT_COOL}. G: ${BCG}.`,
  RP: `Gaia DR3 RP = BP - (BP-RP). ${C21('BP-RP', '0.20-2.00', '0.20-2.55')}; ${HOT_COOL}. BP as for the BP band.`,
  J: `2MASS J = G - (G-J). ${C21('G-J', '0.15-2.10', '1.00-2.80')}; ${HOT_COOL}. G: ${BCG}.`,
  H: `2MASS H = G - (G-H). ${C21('G-H', '0.25-2.60', '0.25-3.70')}; ${HOT_COOL}. G: ${BCG}.`,
  Ks: `2MASS Ks = G - (G-Ks). ${C21('G-Ks', '0.20-2.80', '0.20-3.90')}; ${HOT_COOL}. G: ${BCG}.`,
};

/** Honest statements of where the built-in photometry is approximate (for ModelProvenance.caveats). */
export const PHOTOMETRY_CAVEATS: readonly string[] = [
  'Colour-temperature relations are empirical (infrared flux method) and hold for roughly 4000-8000 K; hotter and cooler stars use documented extensions. Against the Pecaut & Mamajek 2013 dwarf sequence: B-V, M_V and M_G within 0.2 mag from B2 to M5 dwarfs; for B and A dwarfs V-Ic is too red by 0.08-0.15 mag; below 3400 K (spectral type M3V and later) BP-RP and V-Ic come out too blue, by up to 0.6 mag at 3060 K, and V-Rc too red by 0.2-0.3 mag. Fits dominated by M dwarfs need a user-supplied isochrone grid.',
  'Giants: the Ramirez & Melendez (2005) colours end at V-Ic = 2.00, 1.52 and 1.30 (about 3700, 4010 and 4290 K) at [Fe/H] = 0, -1 and -2, and Flower\'s BC_V at 3160 K; cooler giants use the extensions, which give V-Ic = 2.79 and BC_I = -2.74 at 2920 K and [Fe/H] = -1. Late M giants are redder than that (V-Ic near 4 at 3000 K, from memory), so I-band magnitudes of giants cooler than about 3400 K are probably too faint.',
  'BC_V and BC_G have no metallicity or gravity terms; colours carry the [Fe/H] and log g dependence.',
  'Johnson-Cousins and Gaia/2MASS magnitudes come from independent calibrations (BC_V with Johnson-Cousins colours; BC_G with Gaia/2MASS colours); G - V is not forced to any relation.',
  'Magnitudes are interpolated in a table of the calibration (log Teff step 0.005 dex, [Fe/H] step 0.1 dex); inputs beyond log Teff 3.35-4.70, log g -1 to 5.5 or [Fe/H] -3.0 to +0.6 take the value at the table edge.',
  'U is not modelled.',
];

/**
 * Provenance of the built-in model: what produced its numbers and where they are approximate. Printed in
 * manifests, summaries and reports (design.md section 6); the caveats are meant to survive a referee.
 */
import type { ModelProvenance, PhotometryModel } from '../types.js';
import { DEFAULT_REIMERS_ETA } from '../evolution/massLoss.js';
import { MODEL_SOLAR_Z } from '../evolution/metallicity.js';
import { builtinPhotometry, PHOTOMETRY_CAVEATS } from '../photometry/index.js';

export const EVOLUTION_SOURCE =
  'Hurley, Pols & Tout 2000, MNRAS 315, 543 (analytic fits to the Pols et al. 1998 tracks), with the ZAMS of Tout et al. 1996, MNRAS 281, 257';

export function builtinCaveats(alphaFe: number, eta: number = DEFAULT_REIMERS_ETA): string[] {
  return [
    'The evolution is an analytic fit, not a stellar-evolution code: Hurley, Pols & Tout (2000) fit the Pols et al. (1998) tracks (with convective overshooting, helium Y = 0.24 + 2Z) and quote L and R mostly within 5 per cent of them. Those tracks, not modern ones, set the turnoff ages.',
    `Metallicity: [Fe/H] becomes [M/H] by Salaris, Chieffi & Straniero (1993) with [alpha/Fe] = ${alphaFe}, then Z = ${MODEL_SOLAR_Z} x 10^[M/H] (the fits' solar Z). Alpha-enhanced mixtures are represented only through their total Z. The fits cover Z = 1e-4 to 0.03; Z up to 0.0317 ([Fe/H] = +0.2 for scaled-solar) is a 0.02 dex extrapolation of the fits in log Z.`,
    'Known shortcomings of the fits that show in colour-magnitude diagrams: metal-poor turnoffs are hot (at 12 Gyr the turnoff reaches about 7050 K at [Fe/H] = -2.3 and 6330 K at -1.5, some 300-500 K hotter than observed globular-cluster turnoffs); and the giant-branch radius (HPT2000 eq. 46, as published) is not monotonic in Z: the Appendix\'s floor on b2 (-0.04167 + 55.67 Z) takes over at Z = 0.001 while b3 is near its maximum, so between Z of about 0.0012 and 0.0037 ([Fe/H] -1.2 to -0.73 for scaled-solar mixtures) the upper giant branch is up to 1000 K cooler than at both lower and higher Z (12 Gyr tips: 3876 K at [Fe/H] = -1.3, 2918 K at -1.0, 2871 K at -0.9, 3497 K at -0.7, 3962 K at -0.6), which makes red-giant colours and I-band tip magnitudes unreliable there (tip M_I = -0.99 at [Fe/H] = -1.0 against -4.05 observed).',
    'The fits have a few steep places where isochrones change quickly with age or [Fe/H]: the onset and timing of the main-sequence hook, the ramps of gamma (eq. 23), eta (eq. 18) and R_TMS (eq. 9), the switch to non-degenerate helium ignition near M_HeF (eq. 49), the horizontal branch\'s dependence on envelope mass, and the end of the early AGB at Mc,BAGB = 1.6 Msun. Elsewhere a point of fixed phase coordinate moves by less than 0.05 mag in M_bol and 0.011 dex in Teff per 0.01 dex in age or [Fe/H]; but the giant-branch and AGB radii\'s coefficients switch branches in Z (b2 at Z = 0.001, b1 at Z = 0.0028), which moves cool giants by up to 0.007 dex in Teff per 0.01 dex of [Fe/H], and cool giants\' optical magnitudes change by 25-50 mag per dex of Teff, so the upper giant branch and early AGB move by up to about 0.35 mag in B and V and 0.27 mag in I per 0.01 dex of [Fe/H] (0.8 mag beyond Z = 0.03). These changes are steep but continuous (no jumps).',
    'Pre-main-sequence stars are not modelled, so ages below 10^8 yr are refused; isochrones start at 0.1 Msun on the ZAMS-based main sequence.',
    'The giant-branch tip and the zero-age horizontal branch of a low-mass star are joined by a jump (the helium flash is not modelled); the isochrone segment between them carries no mass.',
    `Winds follow HPT2000 section 7.1: Reimers with eta = ${eta}, Nieuwenhuijzen & de Jager above 4000 Lsun, Vassiliadis & Wood on the AGB. The Wolf-Rayet-like and LBV terms and main-sequence winds are left out; they act only on stars more massive than those alive after 10^8 yr. Giant-branch mass loss sets the horizontal-branch mass, and the horizontal-branch colour of old metal-poor populations depends strongly on eta; every star of one mass loses the same mass (no spread).`,
    'A low-mass star\'s horizontal branch is set by its mass at helium ignition (the envelope fraction mu of HPT2000 eqs. 53-54 and all radii of the phase); the winds during core helium burning lower the reported current mass but not that phase\'s luminosities and radii, which leaves a step of about 0.5 per cent in radius where the early AGB begins. Because mass has been lost, the zero-age horizontal branch meets the intermediate-mass L_min,He at M_HeF only to about 1 per cent.',
    'Along an isochrone the wind losses are interpolated from a few reference tracks integrated per isochrone (to about 1e-4 Msun; see tests), not integrated per node.',
    'The thermally pulsing AGB, post-AGB stars, naked helium stars and remnants are not modelled: the isochrone ends at the first thermal pulse, or earlier where winds remove the whole envelope.',
    'Single, non-rotating stars without diffusion: binaries, blue stragglers and multiple populations are outside the model (the likelihood treats unresolved binaries and outliers separately).',
    'The built-in model is meant for exploration; use a user-supplied isochrone grid from a modern evolution code for publication.',
  ];
}

/** Caveats of the last (alphaFe, eta): every isochrone of a fit asks for the same ones. */
let lastCaveats: { alphaFe: number; eta: number; caveats: readonly string[] } | null = null;

function caveatsFor(alphaFe: number, eta: number): readonly string[] {
  if (!lastCaveats || !Object.is(lastCaveats.alphaFe, alphaFe) || !Object.is(lastCaveats.eta, eta)) {
    lastCaveats = { alphaFe, eta, caveats: builtinCaveats(alphaFe, eta) };
  }
  return lastCaveats.caveats;
}

/** The built-in model's provenance (a fresh object per call); with the built-in photometry, its caveats are appended. */
export function builtinProvenance(alphaFe: number, photometry: PhotometryModel, eta: number = DEFAULT_REIMERS_ETA): ModelProvenance {
  const builtin = photometry === builtinPhotometry();
  return {
    model: builtin ? 'coeval built-in (Hurley, Pols & Tout 2000 evolution; built-in photometric calibration)' : 'coeval built-in (Hurley, Pols & Tout 2000 evolution)',
    evolution: EVOLUTION_SOURCE,
    solarZ: MODEL_SOLAR_Z,
    alphaFe,
    bands: { ...photometry.provenance },
    caveats: [...caveatsFor(alphaFe, eta), ...(builtin ? PHOTOMETRY_CAVEATS : [])],
  };
}

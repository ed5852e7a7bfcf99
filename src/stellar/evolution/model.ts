/**
 * Builds the per-Z part of the evolution model (coefficients, mass limits, continuity constants) and
 * caches it by Z, so that isochrones at one metallicity share it. Everything here is a published formula
 * or a constant that the paper fixes by continuity at M_HeF or M_FGB; see `types.ts`.
 */
import { agbPrefactorHigh, lBAGBHigh, rAGB } from './asymptoticGiantBranch.js';
import { computeCoefficients } from './coefficients.js';
import { lMinHeRatio, rMinHeHigh, TBL_EXPONENT, tHeRatioHigh } from './coreHeliumBurning.js';
import { CoreLaw } from './coreMassLuminosity.js';
import { coreMassTerm, lBGB, lHeIHigh, rGB } from './giantBranch.js';
import { tBGB } from './mainSequence.js';
import type { DerivedConstants, EvolutionModel } from './types.js';

/** Mass limits of HPT2000 eqs. (1)-(3). */
export function massLimits(Z: number): { mHook: number; mHeF: number; mFGB: number } {
  const zeta = Math.log10(Z / 0.02);
  return {
    mHook: 1.0185 + 0.16015 * zeta + 0.0892 * zeta * zeta,
    mHeF: 1.995 + 0.25 * zeta + 0.087 * zeta * zeta,
    mFGB: (13.048 * (Z / 0.02) ** 0.06) / (1 + 0.0012 * (0.02 / Z) ** 1.27),
  };
}

/** The metallicities the fits cover (HPT2000 section 1). */
export const Z_RANGE: readonly [number, number] = [1e-4, 0.03];
/**
 * Highest Z accepted: [Fe/H] = +0.2 at the model's solar Z, a 0.024 dex extrapolation in zeta beyond the
 * fits (stated in the model caveats).
 */
export const Z_MAX_ACCEPTED = 0.02 * 10 ** 0.2;

function build(Z: number): EvolutionModel {
  const coef = computeCoefficients(Z);
  const { mHook, mHeF, mFGB } = massLimits(Z);
  const zeta = coef.zeta;
  const derived: DerivedConstants = {
    lHeIAtHeF: 0,
    alpha1: 0,
    lBagbAtHeF: 0,
    alpha3: 0,
    cBGB: 0,
    cHeI: 0,
    tHeAtHeF: 0,
    alpha4: 0,
    cMinHe: 0,
    lMinHeAtHeF: 0,
    rMinHeRatioLM: 0,
    tblAlpha: 0,
    tblLogExponent: 0,
    tblHighNorm: 0,
    agbALow: 0,
    agbAHigh: 0,
  };
  const model: EvolutionModel = {
    Z,
    coef,
    mHook,
    mHeF,
    mFGB,
    xMS: Math.max(0.95, Math.min(0.95 - 0.03 * (zeta + 0.30103), 0.99)), // eq. (6)
    logD0: 5.37 + 0.135 * zeta, // eq. (38)
    derived,
  };
  const b = coef.b;
  // Eq. (49): the low-mass branch of L_HeI meets the intermediate-mass branch at M_HeF.
  derived.lHeIAtHeF = lHeIHigh(model, mHeF);
  derived.alpha1 = (b[9] * mHeF ** b[10] - derived.lHeIAtHeF) / derived.lHeIAtHeF;
  // Eq. (56): likewise for L_BAGB.
  derived.lBagbAtHeF = lBAGBHigh(model, mHeF);
  derived.alpha3 = (b[29] * mHeF ** b[30] - derived.lBagbAtHeF) / derived.lBagbAtHeF;
  // Eq. (44): core masses at the base of the GB and at ignition are continuous at M_HeF.
  const law = new CoreLaw().setMass(model, mHeF);
  derived.cBGB = law.coreMass(lBGB(model, mHeF)) ** 4 - coreMassTerm(mHeF);
  derived.cHeI = law.coreMass(derived.lHeIAtHeF) ** 4 - coreMassTerm(mHeF);
  // Eq. (57): the low-mass CHeB lifetime meets the intermediate-mass one at M_HeF.
  derived.tHeAtHeF = tBGB(model, mHeF) * tHeRatioHigh(model, mHeF);
  derived.alpha4 = (derived.tHeAtHeF - b[39]) / b[39];
  // Eq. (51): c makes L_min,He / L_HeI equal b17 at M_FGB.
  derived.cMinHe = b[17] / mFGB ** 0.1 + (b[17] * b[16] - b[14]) / mFGB ** (b[15] + 0.1);
  derived.lMinHeAtHeF = derived.lHeIAtHeF * lMinHeRatio(model, mHeF);
  // Eq. (55): the low-mass R_mHe scales R_GB(L_ZAHB) and meets the intermediate-mass form at M_HeF, where
  // L_ZAHB = L_min,He by eq. (53).
  derived.rMinHeRatioLM = rMinHeHigh(model, mHeF) / rGB(model, mHeF, derived.lMinHeAtHeF);
  // Eq. (74): the AGB prefactor is interpolated between M_HeF - 0.2 and M_HeF.
  derived.agbALow = b[56] + b[57] * (mHeF - 0.2);
  derived.agbAHigh = agbPrefactorHigh(model, mHeF);
  // Eq. (58): blue-loop fraction; 1 at M_HeF, b45 at M_FGB, and scaled above M_FGB to meet (1 - b47').
  derived.tblAlpha = 1 - b[45] * (mHeF / mFGB) ** TBL_EXPONENT;
  derived.tblLogExponent = -b[46] * Math.log10(mHeF / mFGB);
  const rr = Math.max(1 - rMinHeHigh(model, mFGB) / rAGB(model, mFGB, lHeIHigh(model, mFGB)), 1e-12);
  derived.tblHighNorm = b[47] / (mFGB ** b[48] * rr ** b[49]);
  return model;
}

const cache = new Map<number, EvolutionModel>();
const CACHE_LIMIT = 256;

/**
 * The evolution model at metallicity Z (1e-4 <= Z <= 0.0317), cached by Z. Throws RangeError outside the
 * range: callers validate user input first and raise located errors.
 */
export function evolutionModel(Z: number): EvolutionModel {
  let m = cache.get(Z);
  if (m) return m;
  if (!(Z >= Z_RANGE[0] * (1 - 1e-9) && Z <= Z_MAX_ACCEPTED * (1 + 1e-9))) {
    throw new RangeError(`Z = ${Z} is outside the range of the Hurley, Pols & Tout 2000 fits (${Z_RANGE[0]} to ${Z_RANGE[1]}, extended to ${Z_MAX_ACCEPTED.toFixed(4)})`);
  }
  m = build(Z);
  if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as number);
  cache.set(Z, m);
  return m;
}

/** Drop cached models (benchmarks use this to time cold builds). */
export function clearEvolutionCache(): void {
  cache.clear();
}

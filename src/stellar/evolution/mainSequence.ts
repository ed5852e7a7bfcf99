/**
 * Main sequence, including the hook: HPT2000 section 5.1. A star's main-sequence quantities depend on its
 * mass only, so they are computed once per mass into a reusable `MainSequence` record (no allocation per
 * star), and `mainSequenceAt` then gives log L and log R at any age up to t_MS.
 */
import type { EvolutionModel } from './types.js';
import { powLn } from './fastMath.js';
import { zamsLuminosity, zamsRadius } from './zams.js';

/** Eq. (9): R_TMS on its upper branch uses this fixed coefficient. */
const C1_RTMS = -8.672073e-2;
/** Width of the hook in units of t_hook (eqs. 14-15). */
const HOOK_EPSILON = 0.01;

/** Time to the base of the giant branch, Myr (eq. 4). */
export function tBGB(model: EvolutionModel, m: number): number {
  const a = model.coef.a;
  const m2 = m * m;
  const m4 = m2 * m2;
  const m7 = m4 * m2 * m;
  return (a[1] + a[2] * m4 + a[3] * m4 * m * Math.sqrt(m) + m7) / (a[4] * m2 + a[5] * m7);
}

/** t_hook = mu t_BGB (eq. 7). */
export function tHook(model: EvolutionModel, m: number, tbgb: number, lnm = Math.log(m)): number {
  const a = model.coef.a;
  const mu = Math.max(0.5, 1.0 - 0.01 * Math.max(a[6] * powLn(lnm, -a[7]), a[8] + a[9] * powLn(lnm, -a[10])));
  return mu * tbgb;
}

/** Main-sequence lifetime, Myr (eqs. 5-6). */
export function tMainSequence(model: EvolutionModel, m: number): number {
  const tb = tBGB(model, m);
  return Math.max(tHook(model, m, tb), model.xMS * tb);
}

/** Luminosity at the end of the main sequence (eq. 8). */
export function lTMS(model: EvolutionModel, m: number, lnm = Math.log(m)): number {
  const a = model.coef.a;
  const mCube = m * m * m;
  const ma16 = powLn(lnm, a[16]);
  return (a[11] * mCube + a[12] * mCube * m + a[13] * ma16 * powLn(lnm, 1.8)) / (a[14] + a[15] * mCube * m * m + ma16);
}

/** Radius at the end of the main sequence (eq. 9), with R_TMS >= 1.5 R_ZAMS on the low-mass branch. */
export function rTMS(model: EvolutionModel, m: number, lnm = Math.log(m)): number {
  const a = model.coef.a;
  if (m <= a[17]) return rTMSLow(model, m, lnm);
  if (m >= a[17] + 0.1) return rTMSHigh(a, m, lnm);
  const c = constantsOf(model);
  return c.rTMS0 + ((m - a[17]) / 0.1) * (c.rTMS1 - c.rTMS0);
}

function rTMSLow(model: EvolutionModel, x: number, lnx = Math.log(x)): number {
  const a = model.coef.a;
  return Math.max((a[18] + a[19] * powLn(lnx, a[21])) / (a[20] + powLn(lnx, a[22])), 1.5 * zamsRadius(model.coef, x));
}

function rTMSHigh(a: Float64Array, x: number, lnx = Math.log(x)): number {
  const xa26 = powLn(lnx, a[26]);
  const x2 = x * x;
  return (C1_RTMS * x2 * x + a[23] * xa26 + a[24] * xa26 * x * Math.sqrt(x)) / (a[25] + x2 * x2 * x);
}

/** alpha_L (eq. 19). */
function alphaLFitted(a: Float64Array, x: number, lnx = Math.log(x)): number {
  return (a[45] + a[46] * powLn(lnx, a[48])) / (powLn(lnx, 0.4) + a[47] * powLn(lnx, 1.9));
}

function alphaL(a: Float64Array, m: number, lnm: number, c: MassIndependent): number {
  if (m >= 2.0) return alphaLFitted(a, m, lnm);
  if (m < 0.5) return a[49];
  if (m < 0.7) return a[49] + 5.0 * (0.3 - a[49]) * (m - 0.5);
  if (m < a[52]) return 0.3 + ((a[50] - 0.3) * (m - 0.7)) / (a[52] - 0.7);
  if (m < a[53]) return a[50] + ((a[51] - a[50]) * (m - a[52])) / (a[53] - a[52]);
  return a[51] + ((c.alphaL2 - a[51]) * (m - a[53])) / (2.0 - a[53]);
}

/** beta_L (eq. 20). */
function betaL(a: Float64Array, m: number, lnm: number, c: MassIndependent): number {
  const beta = Math.max(0, a[54] - a[55] * powLn(lnm, a[56]));
  if (m > a[57] && beta > 0) {
    const b = c.betaLA57;
    return Math.max(0, b - 10.0 * (m - a[57]) * b);
  }
  return beta;
}

/** eta (eq. 18): 10, or 20 above 1.1 Msun when Z <= 0.0009. */
function etaL(Z: number, m: number): number {
  const eta = m <= 1.0 ? 10 : m >= 1.1 ? 20 : 10 + 100 * (m - 1.0);
  return Math.min(eta, Z > 0.0009 ? 10 : 20);
}

/** Delta L, the hook's luminosity perturbation (eq. 16). */
function deltaLHigh(a: Float64Array, x: number, lnx = Math.log(x)): number {
  return Math.min(a[34] * powLn(lnx, -a[35]), a[36] * powLn(lnx, -a[37]));
}

function deltaL(model: EvolutionModel, m: number, lnm: number, c: MassIndependent): number {
  const a = model.coef.a;
  if (m <= model.mHook) return 0;
  if (m >= a[33]) return deltaLHigh(a, m, lnm);
  return c.deltaLA33 * Math.exp(0.4 * Math.log((m - model.mHook) / (a[33] - model.mHook)));
}

/** alpha_R (eq. 21). */
function alphaRFitted(a: Float64Array, x: number, lnx = Math.log(x)): number {
  return (a[58] * powLn(lnx, a[60])) / (a[59] + powLn(lnx, a[61]));
}

function alphaR(a: Float64Array, m: number, lnm: number, c: MassIndependent): number {
  if (m <= 0.5) return a[62];
  if (m <= 0.65) return a[62] + ((a[63] - a[62]) * (m - 0.5)) / 0.15;
  if (m <= a[68]) return a[63] + ((a[64] - a[63]) * (m - 0.65)) / (a[68] - 0.65);
  if (m <= a[66]) return a[64] + ((c.alphaRA66 - a[64]) * (m - a[68])) / (a[66] - a[68]);
  if (m <= a[67]) return alphaRFitted(a, m, lnm);
  return c.alphaRA67 + a[65] * (m - a[67]);
}

/** beta_R (eq. 22), returned as beta_R = beta'_R - 1. */
function betaRFitted(a: Float64Array, x: number, lnx = Math.log(x)): number {
  return (a[69] * x * x * x * Math.sqrt(x)) / (a[70] + powLn(lnx, a[71]));
}

function betaR(a: Float64Array, m: number, lnm: number, c: MassIndependent): number {
  let bp: number;
  if (m <= 1.0) bp = 1.06;
  else if (m <= a[74]) bp = 1.06 + ((a[72] - 1.06) * (m - 1.0)) / (a[74] - 1.0);
  else if (m <= 2.0) bp = a[72] + ((c.betaR2 - a[72]) * (m - a[74])) / (2.0 - a[74]);
  else if (m <= 16.0) bp = betaRFitted(a, m, lnm);
  else bp = c.betaR16 + a[73] * (m - 16.0);
  return bp - 1.0;
}

/** gamma (eq. 23). */
function gammaR(a: Float64Array, m: number, c: MassIndependent): number {
  const b1 = c.gammaB1;
  let g: number;
  if (m <= 1.0) {
    const d = Math.abs(m - a[78]);
    g = a[76] + (d > 0 ? a[77] * powLn(Math.log(d), a[79]) : 0);
  } else if (m <= a[75]) g = b1 + (a[80] - b1) * ((m - 1.0) / (a[75] - 1.0)) ** a[81];
  else if (m <= a[75] + 0.1) {
    const b = a[75] > 1.0 ? a[80] : b1;
    g = b - 10.0 * (m - a[75]) * b;
  } else g = 0;
  return Math.max(0, g);
}

/** Delta R, the hook's radius perturbation (eq. 17). */
function deltaRHigh(a: Float64Array, x: number): number {
  const x3 = x * x * x;
  return (a[38] + a[39] * x3 * Math.sqrt(x)) / (a[40] * x3 + powLn(Math.log(x), a[41])) - 1.0;
}

function deltaR(model: EvolutionModel, m: number, c: MassIndependent): number {
  const a = model.coef.a;
  if (m <= model.mHook) return 0;
  if (m <= a[42]) return a[43] * Math.sqrt((m - model.mHook) / (a[42] - model.mHook));
  if (m <= 2.0) return a[43] + (c.deltaR2 - a[43]) * ((m - a[42]) / (2.0 - a[42])) ** a[44];
  return deltaRHigh(a, m);
}

/**
 * The values that the piecewise formulae above take at their fixed joins (alpha_L(2), alpha_R(a66), ...):
 * they depend on Z only, so they are evaluated once per model rather than once per star. Same
 * expressions, same numbers.
 */
interface MassIndependent {
  model: EvolutionModel | null;
  rTMS0: number;
  rTMS1: number;
  alphaL2: number;
  betaLA57: number;
  deltaLA33: number;
  alphaRA66: number;
  alphaRA67: number;
  betaR2: number;
  betaR16: number;
  gammaB1: number;
  deltaR2: number;
}

const joins: MassIndependent = {
  model: null,
  rTMS0: 0,
  rTMS1: 0,
  alphaL2: 0,
  betaLA57: 0,
  deltaLA33: 0,
  alphaRA66: 0,
  alphaRA67: 0,
  betaR2: 0,
  betaR16: 0,
  gammaB1: 0,
  deltaR2: 0,
};

function constantsOf(model: EvolutionModel): MassIndependent {
  const c = joins;
  if (c.model === model) return c;
  const a = model.coef.a;
  c.rTMS0 = rTMSLow(model, a[17]);
  c.rTMS1 = rTMSHigh(a, a[17] + 0.1);
  c.alphaL2 = alphaLFitted(a, 2.0);
  c.betaLA57 = a[54] - a[55] * powLn(Math.log(a[57]), a[56]);
  c.deltaLA33 = deltaLHigh(a, a[33]);
  c.alphaRA66 = alphaRFitted(a, a[66]);
  c.alphaRA67 = alphaRFitted(a, a[67]);
  c.betaR2 = betaRFitted(a, 2.0);
  c.betaR16 = betaRFitted(a, 16.0);
  c.gammaB1 = Math.max(0, a[76] + a[77] * (1.0 - a[78]) ** a[79]);
  c.deltaR2 = deltaRHigh(a, 2.0);
  c.model = model;
  return c;
}

/** All main-sequence quantities of one star. Reused between stars: `fill` overwrites every field. */
export class MainSequence {
  m = 0;
  logLZams = 0;
  logRZams = 0;
  tBGB = 0;
  tHook = 0;
  tMS = 0;
  logLTMS = 0;
  logRTMS = 0;
  alphaL = 0;
  betaL = 0;
  etaL = 0;
  deltaL = 0;
  alphaR = 0;
  betaR = 0;
  gammaR = 0;
  deltaR = 0;

  /** tbgb and thook may be passed when the caller has them (`StellarTrack.setMass`); they are t_BGB(m), t_hook(m). */
  fill(model: EvolutionModel, m: number, tbgb = tBGB(model, m), thook = Number.NaN): this {
    const a = model.coef.a;
    const c = constantsOf(model);
    const lnm = Math.log(m);
    this.m = m;
    this.logLZams = Math.log10(zamsLuminosity(model.coef, m));
    this.logRZams = Math.log10(zamsRadius(model.coef, m));
    this.tBGB = tbgb;
    this.tHook = thook === thook ? thook : tHook(model, m, tbgb, lnm);
    this.tMS = Math.max(this.tHook, model.xMS * this.tBGB);
    this.logLTMS = Math.log10(lTMS(model, m, lnm));
    this.logRTMS = Math.log10(rTMS(model, m, lnm));
    this.alphaL = alphaL(a, m, lnm, c);
    this.betaL = betaL(a, m, lnm, c);
    this.etaL = etaL(model.Z, m);
    this.deltaL = deltaL(model, m, lnm, c);
    this.alphaR = alphaR(a, m, lnm, c);
    this.betaR = betaR(a, m, lnm, c);
    this.gammaR = gammaR(a, m, c);
    this.deltaR = deltaR(model, m, c);
    return this;
  }
}

/** log L and log R at age t <= t_MS (eqs. 11-15): written into `out[0]`, `out[1]`. */
export function mainSequenceAt(ms: MainSequence, t: number, out: Float64Array): void {
  const tau = t / ms.tMS;
  const tau1 = Math.min(1.0, t / ms.tHook);
  const tau2 = Math.max(0.0, Math.min(1.0, (t - (1.0 - HOOK_EPSILON) * ms.tHook) / (HOOK_EPSILON * ms.tHook)));
  const tau2sq = tau * tau;
  const tau3 = tau2sq * tau;
  const tau10 = tau3 * tau3 * tau3 * tau;
  const tau40 = tau10 * tau10 * tau10 * tau10;
  out[0] =
    ms.logLZams +
    ms.alphaL * tau +
    (tau > 0 ? ms.betaL * Math.exp(ms.etaL * Math.log(tau)) : 0) +
    (ms.logLTMS - ms.logLZams - ms.alphaL - ms.betaL) * tau2sq -
    ms.deltaL * (tau1 * tau1 - tau2 * tau2);
  out[1] =
    ms.logRZams +
    ms.alphaR * tau +
    ms.betaR * tau10 +
    ms.gammaR * tau40 +
    (ms.logRTMS - ms.logRZams - ms.alphaR - ms.betaR - ms.gammaR) * tau3 -
    ms.deltaR * (tau1 * tau1 * tau1 - tau2 * tau2 * tau2);
}

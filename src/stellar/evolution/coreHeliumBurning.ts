/**
 * Core helium burning (CHeB): HPT2000 section 5.3. Low-mass stars (M < M_HeF) start on the zero-age
 * horizontal branch (eqs. 53-54) after the helium flash; intermediate-mass stars descend the giant branch
 * from L_HeI to L_min,He (eq. 51) and may perform a blue loop whose share of the lifetime is eq. (58);
 * stars above M_FGB ignite helium in the Hertzsprung gap and start blue. The lifetime is eq. (57), the
 * minimum radius eq. (55), and the core grows linearly from Mc,HeI to Mc,BAGB (eq. 67). The L and R paths
 * through the phase are the piecewise forms of section 5.3 (L_x, R_x, tau_x, tau_y, xi and rho).
 *
 * Masses: `m0` (initial mass) selects the branch and enters every formula the paper makes continuous at
 * M_HeF through a factor exp(15 (M - M_HeF)) (eqs. 53, 56, 57) or M/M_HeF (eq. 55), and the end of the
 * phase (L_BAGB, Mc,BAGB). `mHe`, the mass at helium ignition, sets the envelope fraction
 * mu = (M - Mc)/(M_HeF - Mc) of the horizontal branch (eqs. 53, 54, 57) and all radii of the phase, so that
 * giant-branch mass loss moves the horizontal branch. (With mu from mHe the zero-age horizontal branch meets
 * L_min,He at M_HeF only to within a per cent, since mu < 1 there once mass has been lost.)
 */
import { pow, powLn } from './fastMath.js';
import { coreMassBAGB, lBAGB, rAGB } from './asymptoticGiantBranch.js';
import { lHeI, rGB } from './giantBranch.js';
import { lZHe, rZHe, tHeMS } from './heliumStar.js';
import type { EvolutionModel } from './types.js';

/** Exponent of mu in the denominator of eq. (53). */
const ZAHB_EXPONENT = 1.6479;
/** Exponent of M/M_FGB in eq. (58). */
export const TBL_EXPONENT = 0.4805428;

/** mu of eqs. (53)-(57): the envelope's share, floored as M -> Mc. */
function envelopeMu(model: EvolutionModel, m: number, mc: number): number {
  return Math.max((m - mc) / (model.mHeF - mc), 1e-12);
}

/** Zero-age horizontal-branch luminosity (eq. 53): mu from the envelope mass mEnv, continuity factor from m0. */
export function lZAHB(model: EvolutionModel, mEnv: number, m0: number, mc: number): number {
  const b = model.coef.b;
  const lzhe = lZHe(mc);
  const lm = model.derived.lMinHeAtHeF;
  const alpha2 = (b[18] + lzhe - lm) / (lm - lzhe);
  const mu = envelopeMu(model, mEnv, mc);
  const lnmu = Math.log(mu);
  return lzhe + (((1 + b[20]) / (1 + b[20] * powLn(lnmu, ZAHB_EXPONENT))) * b[18] * powLn(lnmu, b[19])) / (1 + alpha2 * Math.exp(15 * (m0 - model.mHeF)));
}

/** Zero-age horizontal-branch radius (eq. 54). */
export function rZAHB(model: EvolutionModel, m: number, mc: number, lzahb: number): number {
  const b = model.coef.b;
  const mu = envelopeMu(model, m, mc);
  const lnmu = Math.log(mu);
  const f = ((1 + b[21]) * powLn(lnmu, b[22])) / (1 + b[21] * powLn(lnmu, b[23]));
  return (1 - f) * rZHe(mc) + f * rGB(model, m, lzahb);
}

/** Minimum radius during the blue loop for M >= M_HeF (eq. 55). */
export function rMinHeHigh(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  const mb28 = pow(m, b[28]);
  return (b[24] * m + pow(b[25] * m, b[26]) * mb28) / (b[27] + mb28);
}

/** L_min,He / L_HeI for M_HeF <= M < M_FGB (eq. 51). */
export function lMinHeRatio(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  const mb15 = pow(m, b[15]);
  return (b[14] + model.derived.cMinHe * mb15 * pow(m, 0.1)) / (b[16] + mb15);
}

/** CHeB lifetime for M >= M_HeF, as a multiple of t_BGB (eq. 57). */
export function tHeRatioHigh(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  const m2 = m * m;
  const m5 = m2 * m2 * m;
  return (b[41] * pow(m, b[42]) + b[43] * m5) / (b[44] + m5);
}

/** Fraction of the CHeB lifetime spent in the blue loop (eq. 58). */
export function blueLoopFraction(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  const d = model.derived;
  let tbl: number;
  if (m < model.mHeF) return 1;
  if (m <= model.mFGB) {
    const x = m / model.mFGB;
    const y = Math.max(Math.log10(x) / Math.log10(model.mHeF / model.mFGB), 1e-12);
    tbl = b[45] * pow(x, TBL_EXPONENT) + d.tblAlpha * pow(y, d.tblLogExponent);
  } else {
    const r = Math.max(1 - rMinHeHigh(model, m) / rAGB(model, m, lHeI(model, m)), 1e-12);
    tbl = d.tblHighNorm * pow(m, b[48]) * pow(r, b[49]);
  }
  tbl = Math.min(1, Math.max(0, tbl));
  return tbl < 1e-10 ? 0 : tbl;
}

/** The CHeB phase of one star. Reused between stars. */
export class CoreHeliumBurning {
  lowMass = false;
  tHeI = 0;
  tHe = 0;
  lHeI = 0;
  mcHeI = 0;
  mcBAGB = 0;
  lBAGB = 0;
  /** Mass used for radii (and the low-mass envelope formulae): the mass at helium ignition. */
  mR = 0;
  lx = 0;
  rx = 0;
  tauX = 0;
  tauY = 0;
  tauBL = 0;
  xi = 1;
  rMin = 0;
  rMinHe = 0;
  ly = 0;
  ry = 0;
  /** rho's two cube roots (section 5.3), so that R(tau_x) = R_x and R(tau_y) = R_y. */
  rhoX = 0;
  rhoY = 0;
  /** Zero-age horizontal branch, for low-mass stars. */
  lZAHB = 0;
  rZAHB = 0;

  /**
   * m0: initial mass; mHe: mass at helium ignition; tbgb0 = t_BGB(m0); tHeI, lHeI, mcHeI: the giant
   * branch's end (for M >= M_FGB, the Hertzsprung gap's end); rHeI: radius at ignition.
   */
  fill(model: EvolutionModel, m0: number, mHe: number, tbgb0: number, tHeI: number, lHeIv: number, mcHeI: number, rHeI: number): this {
    const b = model.coef.b;
    const lowMass = m0 < model.mHeF;
    const highMass = m0 >= model.mFGB;
    this.lowMass = lowMass;
    this.tHeI = tHeI;
    this.lHeI = lHeIv;
    this.mcHeI = mcHeI;
    this.mR = mHe;
    this.mcBAGB = coreMassBAGB(model, m0);
    this.lBAGB = lBAGB(model, m0);
    if (lowMass) {
      const mu1 = Math.max((model.mHeF - mHe) / (model.mHeF - mcHeI), 1e-12);
      this.tHe = (b[39] + (tHeMS(mcHeI) - b[39]) * pow(mu1, b[40])) * (1 + model.derived.alpha4 * Math.exp(15 * (m0 - model.mHeF)));
      this.lZAHB = lZAHB(model, mHe, m0, mcHeI);
      this.rZAHB = rZAHB(model, mHe, mcHeI, this.lZAHB);
      this.rMinHe = rGB(model, mHe, this.lZAHB) * pow(model.derived.rMinHeRatioLM, m0 / model.mHeF);
      this.tauBL = 1;
      this.tauX = 0;
      this.lx = this.lZAHB;
      this.rx = this.rZAHB;
    } else {
      this.tHe = tbgb0 * tHeRatioHigh(model, m0);
      this.rMinHe = rMinHeHigh(model, m0);
      this.tauBL = blueLoopFraction(model, m0);
      if (highMass) {
        this.tauX = 0;
        this.lx = lHeIv;
        this.rx = rHeI;
      } else {
        this.tauX = 1 - this.tauBL;
        this.lx = lHeIv * lMinHeRatio(model, m0);
        this.rx = rGB(model, mHe, this.lx);
      }
    }
    this.tauY = this.tauX + this.tauBL;
    this.xi = Math.min(2.5, Math.max(0.4, this.rMinHe / this.rx));
    this.rMin = Math.min(this.rMinHe, this.rx);
    this.ly = this.luminosity(this.tauY);
    this.ry = rAGB(model, mHe, this.ly);
    this.rhoX = Math.cbrt(Math.log(this.rx / this.rMin));
    this.rhoY = Math.cbrt(Math.log(Math.max(this.ry, this.rMin) / this.rMin));
    return this;
  }

  /** Luminosity at phase fraction tau in [0, 1]. */
  luminosity(tau: number): number {
    const tx = this.tauX;
    if (tau < tx) {
      const u = (tx - tau) / tx;
      return this.lx * pow(this.lHeI / this.lx, u * u * u);
    }
    const span = 1 - tx;
    const u = (tau - tx) / span;
    const lam = span > 0 ? (u > 0 ? pow(u, this.xi) : 0) : 1;
    return this.lx * pow(this.lBAGB / this.lx, lam);
  }

  /** Radius at phase fraction tau, given the luminosity there. */
  radius(model: EvolutionModel, tau: number, l: number): number {
    if (tau < this.tauX) return rGB(model, this.mR, l);
    if (tau > this.tauY || this.tauY <= this.tauX) return rAGB(model, this.mR, l);
    const f = (tau - this.tauX) / (this.tauY - this.tauX);
    const rho = this.rhoY * f - this.rhoX * (1 - f);
    const ar = Math.abs(rho);
    return this.rMin * Math.exp(ar * ar * ar);
  }

  coreMass(tau: number): number {
    return (1 - tau) * this.mcHeI + tau * this.mcBAGB;
  }
}

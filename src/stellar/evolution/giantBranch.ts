/**
 * First giant branch (GB): HPT2000 section 5.3. Luminosity at its base (eq. 10), radius (eq. 46),
 * helium-ignition luminosity (eq. 49) and the core masses at the base and at ignition (eq. 44 and the end of
 * section 5.3). The luminosity follows the core-mass-luminosity law (`CoreLaw`).
 */
import { pow, powLn } from './fastMath.js';
import { CoreLaw } from './coreMassLuminosity.js';
import { coreMassBAGB } from './asymptoticGiantBranch.js';
import type { EvolutionModel } from './types.js';

/** Exponents c2, c3 of eq. (10). */
const C2_LBGB = 9.301992;
const C3_LBGB = 4.637345;
/** c1, c2 of eq. (44). */
const C1_MC = 9.20925e-5;
const C2_MC = 5.402216;

/** Luminosity at the base of the giant branch (eq. 10). */
export function lBGB(model: EvolutionModel, m: number): number {
  const a = model.coef.a;
  const lnm = Math.log(m);
  return (a[27] * powLn(lnm, a[31]) + a[28] * powLn(lnm, C2_LBGB)) / (a[29] + a[30] * powLn(lnm, C3_LBGB) + powLn(lnm, a[32]));
}

/** Giant-branch radius at luminosity l for current mass m (eq. 46). */
export function rGB(model: EvolutionModel, m: number, l: number): number {
  const b = model.coef.b;
  const lnm = Math.log(m);
  const lnl = Math.log(l);
  const A = Math.min(b[4] * powLn(lnm, -b[5]), b[6] * powLn(lnm, -b[7]));
  return A * (powLn(lnl, b[1]) + b[2] * powLn(lnl, b[3]));
}

/** Helium-ignition luminosity (eq. 49). */
export function lHeI(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  if (m < model.mHeF) return (b[9] * pow(m, b[10])) / (1 + model.derived.alpha1 * Math.exp(15 * (m - model.mHeF)));
  return lHeIHigh(model, m);
}

/** The intermediate-mass branch of eq. (49), used to fix alpha_1. */
export function lHeIHigh(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  return (b[11] + b[12] * pow(m, 3.8)) / (b[13] + m * m);
}

/** Core mass at the base of the GB for M >= M_HeF (eq. 44). */
export function coreMassBGBHigh(model: EvolutionModel, m: number): number {
  return Math.min(0.95 * coreMassBAGB(model, m), Math.sqrt(Math.sqrt(model.derived.cBGB + C1_MC * pow(m, C2_MC))));
}

/** Core mass at helium ignition for M >= M_HeF (eq. 44 with L_HeI in place of L_BGB; end of section 5.3). */
export function coreMassHeIHigh(model: EvolutionModel, m: number): number {
  return Math.min(0.95 * coreMassBAGB(model, m), Math.sqrt(Math.sqrt(model.derived.cHeI + C1_MC * pow(m, C2_MC))));
}

/** c1 M^c2 of eq. (44), for the continuity constants. */
export function coreMassTerm(m: number): number {
  return C1_MC * pow(m, C2_MC);
}

/**
 * The giant branch of one star of initial mass m: the core law started at (t_BGB, L_BGB), L_HeI, t_HeI and
 * the core masses at both ends. For M >= M_FGB helium ignites at the end of the Hertzsprung gap and there is
 * no giant branch: then t_HeI = t_BGB.
 */
export class GiantBranch {
  m = 0;
  hasGB = true;
  lBGB = 0;
  lHeI = 0;
  tBGB = 0;
  tHeI = 0;
  /** Luminosity core mass (eq. 39) at the base and at helium ignition. */
  mcLBase = 0;
  mcLTip = 0;
  /** Physical core mass at the base and at helium ignition. */
  mcBase = 0;
  mcTip = 0;
  readonly law = new CoreLaw();

  fill(model: EvolutionModel, m: number, tbgb: number, aH: number): this {
    this.m = m;
    this.tBGB = tbgb;
    this.hasGB = m < model.mFGB;
    this.lBGB = lBGB(model, m);
    this.lHeI = lHeI(model, m);
    const law = this.law.setMass(model, m).start(aH, tbgb, this.lBGB);
    this.mcLBase = law.coreMass(this.lBGB);
    if (this.hasGB) {
      const lTip = Math.max(this.lHeI, this.lBGB);
      this.tHeI = law.timeAtLuminosity(lTip);
      this.mcLTip = law.coreMass(lTip);
    } else {
      this.tHeI = tbgb;
      this.mcLTip = this.mcLBase;
    }
    if (m < model.mHeF) {
      this.mcBase = this.mcLBase;
      this.mcTip = this.mcLTip;
    } else {
      this.mcBase = coreMassBGBHigh(model, m);
      this.mcTip = coreMassHeIHigh(model, m);
    }
    return this;
  }
}

/**
 * Early asymptotic giant branch (EAGB): HPT2000 section 5.4. Luminosity at its base (eq. 56), core mass
 * at its base (eq. 66), radius (eq. 74), and the growth of the CO core by the core-mass-luminosity law
 * with A_He. The EAGB ends when the CO core reaches the helium core (after second dredge-up if
 * Mc,BAGB > 0.8 Msun), where thermal pulses begin; more massive cores (Mc,BAGB >= 1.6) end it at the core
 * mass of carbon ignition. The thermally pulsing AGB is not modelled.
 */
import { pow, powLn } from './fastMath.js';
import { A_HE, CoreLaw } from './coreMassLuminosity.js';
import type { EvolutionModel } from './types.js';

/** Luminosity at the base of the AGB (eq. 56). */
export function lBAGB(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  if (m < model.mHeF) return (b[29] * pow(m, b[30])) / (1 + model.derived.alpha3 * Math.exp(15 * (m - model.mHeF)));
  return lBAGBHigh(model, m);
}

/** The intermediate-mass branch of eq. (56), used to fix its low-mass continuity constant. */
export function lBAGBHigh(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  const mb33 = pow(m, b[33]);
  return (b[31] + b[32] * mb33 * pow(m, 1.8)) / (b[34] + mb33);
}

/** Core mass at the base of the AGB (eq. 66). */
export function coreMassBAGB(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  return Math.sqrt(Math.sqrt(b[36] * pow(m, b[37]) + b[38]));
}

/** The prefactor A of eq. (74) on its intermediate-mass branch. */
export function agbPrefactorHigh(model: EvolutionModel, m: number): number {
  const b = model.coef.b;
  const lnm = Math.log(m);
  return Math.min(b[51] * powLn(lnm, -b[52]), b[53] * powLn(lnm, -b[54]));
}

/** AGB radius at luminosity l for current mass m (eq. 74). */
export function rAGB(model: EvolutionModel, m: number, l: number): number {
  const b = model.coef.b;
  const m1 = model.mHeF - 0.2;
  let A: number;
  let b50: number;
  if (m >= model.mHeF) {
    A = agbPrefactorHigh(model, m);
    b50 = b[50];
  } else if (m <= m1) {
    A = b[56] + b[57] * m;
    b50 = b[3];
  } else {
    const f = (m - m1) / 0.2;
    A = model.derived.agbALow + (model.derived.agbAHigh - model.derived.agbALow) * f;
    b50 = b[3] * (1 + (b[55] - 1) * f);
  }
  const lnl = Math.log(l);
  return A * (powLn(lnl, b[1]) + b[2] * powLn(lnl, b50));
}

/** The core mass at which the EAGB ends (section 5.4; second dredge-up eq. 69; carbon ignition eq. 75). */
export function coreMassEndEAGB(mcBAGB: number): number {
  if (mcBAGB >= 1.6) return Math.min(mcBAGB, Math.max(1.44, 0.773 * mcBAGB - 0.35));
  if (mcBAGB > 0.8) return 0.44 * mcBAGB + 0.448;
  return mcBAGB;
}

/** The EAGB of one star. Reused between stars. */
export class EarlyAGB {
  tBAGB = 0;
  lBAGB = 0;
  /** Helium core mass on the EAGB (= Mc,BAGB). */
  mcHe = 0;
  mcCOStart = 0;
  mcCOEnd = 0;
  lEnd = 0;
  tEnd = 0;
  readonly law = new CoreLaw();

  /** m: the mass that sets the core law's p, q, B and D (eq. 38): the initial mass. */
  fill(model: EvolutionModel, m: number, tBAGB: number, lBAGB: number, mcBAGB: number): this {
    this.tBAGB = tBAGB;
    this.lBAGB = lBAGB;
    this.mcHe = mcBAGB;
    const law = this.law.setMass(model, m).start(A_HE, tBAGB, lBAGB);
    this.mcCOStart = law.coreMass(lBAGB);
    this.mcCOEnd = Math.max(this.mcCOStart, coreMassEndEAGB(mcBAGB));
    this.lEnd = law.luminosity(this.mcCOEnd);
    this.tEnd = law.timeAtLuminosity(this.lEnd);
    return this;
  }
}

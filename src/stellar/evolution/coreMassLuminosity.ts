/**
 * The core-mass-luminosity law of giants and its integral in time: HPT2000 section 5.3, eqs. (34)-(43).
 * On the first giant branch the hydrogen-exhausted core grows as dMc/dt = A_H L with L = min(B Mc^q, D Mc^p)
 * (eq. 37); on the early AGB the CO core grows the same way with A_He in place of A_H (section 5.4).
 * Integrating from a starting point (t0, L0) gives Mc(t) in closed form (eq. 39) with the times t_inf1,
 * t_x and t_inf2 of eqs. (40)-(42). `CoreLaw` holds one star's law; it is reused between stars.
 */
import { exp10, pow, powLn } from './fastMath.js';
import type { EvolutionModel } from './types.js';

/** A_He in Msun Lsun^-1 Myr^-1, for the CO core growth on the AGB (section 5.4). */
export const A_HE = 7.66e-5;

/** A_H (eq. 43), Msun Lsun^-1 Myr^-1. */
export function hydrogenRate(m: number): number {
  return exp10(Math.max(-4.8, Math.min(-5.7 + 0.8 * m, -4.1 + 0.14 * m)));
}

/**
 * Below M_HeF (and below 2.38 Msun, where 500 + 1.75e4 M^0.6 stays under the floor of 3e4 in B) the law's
 * p, q, B and D, and so M_x and L_x, do not depend on the mass: they are computed once per model and
 * reused, which spares three powers per star on the giant branch and the AGB of an old isochrone.
 */
const FLOOR_B_MASS = 2.38;
const lowMass = { model: null as EvolutionModel | null, D: 0, mx: 0, lx: 0, bTerm: 0 };

export class CoreLaw {
  p = 6;
  q = 3;
  B = 0;
  D = 0;
  /** Core growth constant (A_H or A_He). */
  A = 0;
  mx = 0;
  lx = 0;
  t0 = 0;
  l0 = 0;
  tInf1 = 0;
  tX = 0;
  tInf2 = 0;

  /** p, q, B and D of eq. (38) for a star of mass m (linear in m between M_HeF and 2.5 Msun). */
  setMass(model: EvolutionModel, m: number): this {
    const mHeF = model.mHeF;
    const d0 = model.logD0;
    if (m <= mHeF && m < FLOOR_B_MASS) {
      if (lowMass.model !== model) this.lowMassConstants(model);
      this.p = 6;
      this.q = 3;
      this.D = lowMass.D;
      this.B = 3.0e4;
      this.mx = lowMass.mx;
      this.lx = lowMass.lx;
      return this;
    }
    let logD: number;
    if (m <= mHeF) {
      this.p = 6;
      this.q = 3;
      logD = d0;
    } else {
      const high = Math.max(-1.0, 0.975 * d0 - 0.18 * m, 0.5 * d0 - 0.06 * m);
      if (m >= 2.5) {
        this.p = 5;
        this.q = 2;
        logD = high;
      } else {
        const f = (m - mHeF) / (2.5 - mHeF);
        this.p = 6 - f;
        this.q = 3 - f;
        // log D interpolates linearly between its values at M_HeF and 2.5 Msun.
        const high25 = Math.max(-1.0, 0.975 * d0 - 0.45, 0.5 * d0 - 0.15);
        logD = d0 + f * (high25 - d0);
      }
    }
    this.D = exp10(logD);
    this.B = Math.max(3.0e4, 500.0 + 1.75e4 * pow(m, 0.6));
    this.mx = pow(this.B / this.D, 1 / (this.p - this.q));
    this.lx = this.D * pow(this.mx, this.p);
    return this;
  }

  /** Fill `lowMass` for this model with the same expressions as the general path (p = 6, q = 3, B = 3e4). */
  private lowMassConstants(model: EvolutionModel): void {
    const D = exp10(model.logD0);
    const B = 3.0e4;
    const mx = pow(B / D, 1 / (6 - 3));
    const lx = D * pow(mx, 6);
    lowMass.D = D;
    lowMass.mx = mx;
    lowMass.lx = lx;
    lowMass.bTerm = pow(B / lx, (3 - 1) / 3);
    lowMass.model = model;
  }

  /** Start the integral of eq. (39) at (t0, L0) with growth constant A (eqs. 40-42). */
  start(A: number, t0: number, l0: number): this {
    const { p, q, B, D } = this;
    this.A = A;
    this.t0 = t0;
    this.l0 = l0;
    if (l0 <= this.lx) {
      this.tInf1 = t0 + (1 / ((p - 1) * A * D)) * pow(D / l0, (p - 1) / p);
      this.tX = this.tInf1 - (this.tInf1 - t0) * pow(l0 / this.lx, (p - 1) / p);
      // The same power as lowMass.bTerm whenever its inputs are the same.
      const bTerm = q === 3 && B === 3.0e4 && this.lx === lowMass.lx ? lowMass.bTerm : pow(B / this.lx, (q - 1) / q);
      this.tInf2 = this.tX + (1 / ((q - 1) * A * B)) * bTerm;
    } else {
      // Starting above the crossover: only the B branch is ever used.
      this.tInf1 = t0;
      this.tX = t0;
      this.tInf2 = t0 + (1 / ((q - 1) * A * B)) * pow(B / l0, (q - 1) / q);
    }
    return this;
  }

  luminosity(mc: number): number {
    const lnmc = Math.log(mc);
    return Math.min(this.B * powLn(lnmc, this.q), this.D * powLn(lnmc, this.p));
  }

  coreMass(l: number): number {
    return l <= this.lx ? pow(l / this.D, 1 / this.p) : pow(l / this.B, 1 / this.q);
  }

  /** Mc(t) of eq. (39). */
  coreMassAt(t: number): number {
    if (t <= this.tX) return pow((this.p - 1) * this.A * this.D * (this.tInf1 - t), 1 / (1 - this.p));
    return pow((this.q - 1) * this.A * this.B * (this.tInf2 - t), 1 / (1 - this.q));
  }

  /** The age at which the law reaches luminosity L (the inverse of eqs. 39 and 37). */
  timeAtLuminosity(l: number): number {
    if (l <= this.lx) return this.tInf1 - (1 / ((this.p - 1) * this.A * this.D)) * pow(this.D / l, (this.p - 1) / this.p);
    return this.tInf2 - (1 / ((this.q - 1) * this.A * this.B)) * pow(this.B / l, (this.q - 1) / this.q);
  }
}

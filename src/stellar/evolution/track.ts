/**
 * One star's evolutionary track: the phase records of HPT2000 sections 5.1-5.4 for one initial mass,
 * filled lazily phase by phase (an isochrone node on the giant branch never needs the main-sequence
 * shape), and the mass-loss equation of each phase in its progress variable (for `DenseMass`).
 *
 * Mass bookkeeping. The main sequence loses no mass (HPT2000 apply winds there only above 4000 Lsun,
 * i.e. to stars more massive than the isochrone domain needs; see the caveats). From the Hertzsprung gap
 * on, the mass follows the winds of `massLoss.ts`. Radii on the giant branches use the current mass, as
 * the paper prescribes; the envelope of a low-mass core-helium-burning star is its mass at helium ignition
 * (`mHeI`), which is how giant-branch mass loss moves the horizontal branch (see `coreHeliumBurning.ts`).
 */
import { exp10, pow } from './fastMath.js';
import { Phase } from '../types.js';
import { EarlyAGB, rAGB } from './asymptoticGiantBranch.js';
import { CoreHeliumBurning, rMinHeHigh } from './coreHeliumBurning.js';
import { A_HE, hydrogenRate } from './coreMassLuminosity.js';
import type { MassDerivative } from './denseMass.js';
import { GiantBranch, rGB } from './giantBranch.js';
import { HertzsprungGap } from './hertzsprungGap.js';
import { lTMS, MainSequence, rTMS, tBGB, tHook } from './mainSequence.js';
import { massLossRate } from './massLoss.js';
import type { EvolutionModel } from './types.js';

/** Radius at helium ignition for stars that ignite it in the gap (M >= M_FGB; HPT2000 section 5.3). */
export function rHeIHighMass(model: EvolutionModel, m0: number, mass: number, lHeI: number): number {
  const rmin = rMinHeHigh(model, m0);
  if (m0 >= 12 || model.mFGB >= 12) return rmin;
  const mu = Math.log10(m0 / 12) / Math.log10(model.mFGB / 12);
  return rmin * pow(rGB(model, mass, lHeI) / rmin, mu);
}

export class StellarTrack implements MassDerivative {
  model!: EvolutionModel;
  m0 = 0;
  eta = 0.5;
  tBGB = 0;
  tHook = 0;
  tMS = 0;
  tHeI = 0;
  tBAGB = 0;
  tEnd = 0;
  aH = 0;
  /** Masses at the end of the gap, at helium ignition and at the end of CHeB (set by the caller). */
  mEndHG = 0;
  mHeI = 0;
  mEndHe = 0;
  readonly ms = new MainSequence();
  readonly gb = new GiantBranch();
  readonly hg = new HertzsprungGap();
  readonly he = new CoreHeliumBurning();
  readonly agb = new EarlyAGB();
  private readonly tmp = new Float64Array(3);
  /**
   * The last (phase, x) of `dMassDx` and its mass-independent factors (L, and R where R does not depend on
   * the current mass): RK4 evaluates each midpoint twice and each step end twice (k4 and the next k1),
   * so half the evaluations reuse them. Any fill clears it.
   */
  private memoPhase = 0;
  private memoX = Number.NaN;
  private memoL = 0;
  private memoR = 0;

  /** Start a star: its main-sequence and gap timescales (cheap). */
  setMass(model: EvolutionModel, m0: number, eta: number): this {
    this.model = model;
    this.m0 = m0;
    this.eta = eta;
    this.tBGB = tBGB(model, m0);
    this.tHook = tHook(model, m0, this.tBGB);
    this.tMS = Math.max(this.tHook, model.xMS * this.tBGB);
    this.memoX = Number.NaN;
    return this;
  }

  fillMainSequence(): this {
    this.ms.fill(this.model, this.m0, this.tBGB, this.tHook);
    return this;
  }

  /** Giant branch (or, above M_FGB, helium ignition at the end of the gap): sets t_HeI. */
  fillGiant(): this {
    this.aH = hydrogenRate(this.m0);
    this.gb.fill(this.model, this.m0, this.tBGB, this.aH);
    this.tHeI = this.gb.tHeI;
    this.memoX = Number.NaN;
    return this;
  }

  /** Hertzsprung gap, given the mass at its end (which sets the end radius). Needs `fillGiant`. */
  fillGap(mEndHG: number): this {
    const model = this.model;
    const m0 = this.m0;
    const gb = this.gb;
    this.mEndHG = mEndHG;
    const lEnd = gb.hasGB ? gb.lBGB : gb.lHeI;
    const rEnd = gb.hasGB ? rGB(model, mEndHG, gb.lBGB) : rHeIHighMass(model, m0, mEndHG, gb.lHeI);
    const mcEnd = m0 < model.mHeF ? gb.mcLBase : gb.hasGB ? gb.mcBase : gb.mcTip;
    this.hg.fill(m0, this.tMS, this.tBGB, Math.log10(lTMS(model, m0)), Math.log10(rTMS(model, m0)), lEnd, rEnd, mcEnd);
    this.memoX = Number.NaN;
    return this;
  }

  /**
   * Core helium burning and the early AGB, given the mass at helium ignition. Needs `fillGiant`. Callers
   * that need nothing past core helium burning pass withAGB = false (the AGB fill costs half a dozen
   * powers); `tEnd` is then NaN.
   */
  fillHelium(mHeI: number, withAGB = true): this {
    const model = this.model;
    const m0 = this.m0;
    const gb = this.gb;
    this.mHeI = mHeI;
    const rHeI = gb.hasGB ? rGB(model, mHeI, gb.lHeI) : rHeIHighMass(model, m0, mHeI, gb.lHeI);
    this.he.fill(model, m0, mHeI, this.tBGB, this.tHeI, gb.lHeI, gb.mcTip, rHeI);
    this.tBAGB = this.tHeI + this.he.tHe;
    if (withAGB) {
      this.agb.fill(model, m0, this.tBAGB, this.he.lBAGB, this.he.mcBAGB);
      this.tEnd = this.agb.tEnd;
    } else this.tEnd = Number.NaN;
    this.memoX = Number.NaN;
    return this;
  }

  /** Progress variable of a post-main-sequence phase at age t (see `dMassDx`). */
  progressAt(phase: Phase, t: number): number {
    switch (phase) {
      case Phase.HertzsprungGap:
        return this.hg.fraction(t);
      case Phase.GiantBranch: {
        const gb = this.gb;
        const span = gb.mcLTip - gb.mcLBase;
        return span > 0 ? Math.min(1, Math.max(0, (gb.law.coreMassAt(t) - gb.mcLBase) / span)) : 1;
      }
      case Phase.CoreHeliumBurning:
        return Math.min(1, Math.max(0, (t - this.tHeI) / this.he.tHe));
      case Phase.EarlyAGB: {
        const agb = this.agb;
        const span = agb.mcCOEnd - agb.mcCOStart;
        return span > 0 ? Math.min(1, Math.max(0, (agb.law.coreMassAt(t) - agb.mcCOStart) / span)) : 1;
      }
      default:
        return 0;
    }
  }

  /** Phase at age t, or 0 once the modelled phases are over. Needs the fills up to that phase. */
  phaseAt(t: number): Phase | 0 {
    if (t < this.tMS) return Phase.MainSequence;
    if (t < this.tBGB) return Phase.HertzsprungGap;
    if (t < this.tHeI) return Phase.GiantBranch;
    if (t < this.tBAGB) return Phase.CoreHeliumBurning;
    if (t < this.tEnd) return Phase.EarlyAGB;
    return 0;
  }

  /**
   * log L, log R and core mass at a post-main-sequence point (phase, progress x), for current mass
   * `mass`: out[0..2]. Returns the fraction of the phase completed, as used by the isochrone's phase
   * coordinate: the fraction of the rise in log L on the giant branches, and the time fraction in the gap
   * and in CHeB (which, unlike a fraction of each sub-phase, rises strictly with mass along an isochrone).
   */
  stateAt(phase: Phase, x: number, mass: number, out: Float64Array): number {
    const model = this.model;
    switch (phase) {
      case Phase.HertzsprungGap:
        this.hg.at(x, out);
        return x;
      case Phase.GiantBranch: {
        const gb = this.gb;
        const mcL = gb.mcLBase + x * (gb.mcLTip - gb.mcLBase);
        const l = gb.law.luminosity(mcL);
        out[0] = Math.log10(l);
        out[1] = Math.log10(rGB(model, mass, l));
        if (this.m0 < model.mHeF) out[2] = mcL;
        else {
          // Above M_HeF the core grows linearly in time from Mc,BGB to Mc,HeI (HPT2000 section 5.3).
          const span = this.tHeI - this.tBGB;
          const tau = span > 0 ? (gb.law.timeAtLuminosity(l) - this.tBGB) / span : 1;
          out[2] = gb.mcBase + (gb.mcTip - gb.mcBase) * tau;
        }
        const lTip = Math.max(gb.lHeI, gb.lBGB);
        return lTip > gb.lBGB ? Math.log(l / gb.lBGB) / Math.log(lTip / gb.lBGB) : x;
      }
      case Phase.CoreHeliumBurning: {
        const he = this.he;
        const l = he.luminosity(x);
        out[0] = Math.log10(l);
        out[1] = Math.log10(he.radius(model, x, l));
        out[2] = he.coreMass(x);
        return x;
      }
      case Phase.EarlyAGB: {
        const agb = this.agb;
        const mc = agb.mcCOStart + x * (agb.mcCOEnd - agb.mcCOStart);
        const l = agb.law.luminosity(mc);
        out[0] = Math.log10(l);
        out[1] = Math.log10(rAGB(model, mass, l));
        out[2] = agb.mcHe;
        return agb.lEnd > agb.lBAGB ? Math.log(l / agb.lBAGB) / Math.log(agb.lEnd / agb.lBAGB) : x;
      }
      default:
        throw new RangeError(`stateAt: phase ${phase} is not a post-main-sequence phase`);
    }
  }

  // --- MassDerivative: the wind equation of each phase in its progress variable ---

  dMassDx(phase: number, x: number, m: number): number {
    const model = this.model;
    const Z = model.Z;
    const eta = this.eta;
    const fresh = x !== this.memoX || phase !== this.memoPhase;
    this.memoPhase = phase;
    this.memoX = x;
    switch (phase) {
      case Phase.HertzsprungGap: {
        if (fresh) {
          this.hg.at(x, this.tmp);
          this.memoL = exp10(this.tmp[0]);
          this.memoR = exp10(this.tmp[1]);
        }
        const rate = massLossRate(Z, eta, this.memoL, this.memoR, m, false);
        return -1e6 * rate * (this.tBGB - this.tMS);
      }
      case Phase.GiantBranch: {
        const gb = this.gb;
        const dmc = gb.mcLTip - gb.mcLBase;
        if (fresh) this.memoL = gb.law.luminosity(gb.mcLBase + x * dmc);
        const l = this.memoL;
        const rate = massLossRate(Z, eta, l, rGB(model, m, l), m, false);
        return (-1e6 * rate * dmc) / (gb.law.A * l);
      }
      case Phase.CoreHeliumBurning: {
        const he = this.he;
        if (fresh) {
          this.memoL = he.luminosity(x);
          this.memoR = he.radius(model, x, this.memoL);
        }
        const rate = massLossRate(Z, eta, this.memoL, this.memoR, m, false);
        return -1e6 * rate * he.tHe;
      }
      case Phase.EarlyAGB: {
        const agb = this.agb;
        const dmc = agb.mcCOEnd - agb.mcCOStart;
        if (fresh) this.memoL = agb.law.luminosity(agb.mcCOStart + x * dmc);
        const l = this.memoL;
        const rate = massLossRate(Z, eta, l, rAGB(model, m, l), m, true);
        return (-1e6 * rate * dmc) / (A_HE * l);
      }
      default:
        return 0;
    }
  }

  coreMassAt(phase: number, x: number): number {
    switch (phase) {
      case Phase.HertzsprungGap:
        return ((1 - x) * this.hg.rho + x) * this.hg.mcEnd;
      case Phase.GiantBranch: {
        const gb = this.gb;
        return gb.mcBase + x * (gb.mcTip - gb.mcBase);
      }
      case Phase.CoreHeliumBurning:
        return this.he.coreMass(x);
      case Phase.EarlyAGB:
        return this.agb.mcHe;
      default:
        return 0;
    }
  }

  /** Kinks of the CHeB rates (tau_x, tau_y) as integration breaks: [0, tau_x, tau_y, 1]. */
  heliumBreaks(out: Float64Array): Float64Array {
    out[0] = 0;
    out[1] = this.he.tauX;
    out[2] = Math.min(1, this.he.tauY);
    out[3] = 1;
    return out;
  }
}

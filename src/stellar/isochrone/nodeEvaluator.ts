/**
 * Evaluates one isochrone node: the star of initial mass m0 at the isochrone's age, in a phase the caller
 * already knows (from the phase boundaries, so that nodes on a boundary get the phase of their interval).
 * Main-sequence nodes are evaluated exactly; post-main-sequence nodes come from the phase curves
 * (`phaseCurve.ts`), which are validated against exact evaluations. Results go to public fields; nothing
 * is allocated per node.
 */
import { Phase } from '../types.js';
import { mainSequenceAt } from '../evolution/mainSequence.js';
import { StellarTrack } from '../evolution/track.js';
import type { EvolutionModel } from '../evolution/types.js';
import { LOG_G_SUN, LOG_TEFF_SUN } from '../solar.js';
import type { PhaseInterval } from './boundaries.js';
import { massBreaks, type MassLossInterpolant } from './massLossInterpolant.js';
import { CORE_MASS, FRACTION, LOG_L, LOG_R, MASS, PhaseCurve, SPACING, STATE_WIDTH } from './phaseCurve.js';

/**
 * The main sequence's phase-coordinate fraction: f = (1 - tau^2) h(M) + tau^2 with tau = t/t_MS and
 * h(M) = ln(M/0.1)/ln(1000). Unevolved stars (tau << 1) keep their coordinate as the isochrone ages, so
 * interpolating between isochrones at fixed coordinate matches stars of equal mass there (whose position
 * barely changes), while near the turnoff the coordinate follows tau, i.e. the same evolutionary point.
 * It rises strictly with mass along an isochrone (both tau and h do, and h < 1) and reaches 1 at tau = 1.
 */
const LN_1000 = Math.log(1000);

export function mainSequenceCoordinate(m0: number, tau: number): number {
  const h = Math.log(m0 / 0.1) / LN_1000;
  const w = tau * tau;
  return (1 - w) * h + w;
}

export class NodeEvaluator {
  private model!: EvolutionModel;
  private tMyr = 0;
  private eta = 0.5;
  private readonly track = new StellarTrack();
  private readonly ms = new Float64Array(2);
  private readonly state = new Float64Array(STATE_WIDTH);
  /** One curve per post-main-sequence phase, indexed by Phase. */
  private readonly curves: (PhaseCurve | null)[] = [null, null, new PhaseCurve(), new PhaseCurve(), new PhaseCurve(), new PhaseCurve(), null];

  // Results of the last `evaluate`.
  mass = 0;
  coreMass = 0;
  logL = 0;
  logR = 0;
  logTeff = 0;
  logg = 0;
  /** Fraction of the phase completed (t/t_MS on the main sequence). */
  fraction = 0;
  /** The phase coordinate's fractional part (see `mainSequenceCoordinate`). */
  coordinate = 0;
  /**
   * A variable nearly linear in m0 in which the node's magnitudes vary evenly: time to the core law's
   * singularity on the giant branches (so that geometric steps in it are even steps in log L).
   */
  spacing = 0;
  /** True when the envelope is exhausted (the star is a remnant and not part of the isochrone). */
  dead = false;

  setup(model: EvolutionModel, tMyr: number, eta: number, losses: MassLossInterpolant, intervals: readonly PhaseInterval[]): void {
    this.model = model;
    this.tMyr = tMyr;
    this.eta = eta;
    const breaks = massBreaks(model);
    for (const iv of intervals) {
      const curve = this.curves[iv.phase];
      if (curve) curve.build(model, tMyr, eta, losses, iv.phase, iv.mLo, iv.mHi, breaks);
    }
    for (let p = 0; p < this.curves.length; p++) if (this.curves[p] && !intervals.some((iv) => iv.phase === p)) this.curves[p]!.clear();
  }

  /** Exact evaluations spent on the phase curves of the current isochrone. */
  exactEvaluations(): number {
    let n = 0;
    for (const c of this.curves) if (c) n += c.evaluations;
    return n;
  }

  /** Pieces of each phase curve (HG, GB, CHeB, EAGB) of the current isochrone. */
  curvePieces(): number[] {
    return this.curves.filter((c): c is PhaseCurve => c !== null).map((c) => c.pieces());
  }

  evaluate(m0: number, phase: Phase): void {
    if (phase === Phase.MainSequence) {
      const tr = this.track.setMass(this.model, m0, this.eta).fillMainSequence();
      const t = Math.min(this.tMyr, tr.tMS);
      mainSequenceAt(tr.ms, t, this.ms);
      this.mass = m0;
      this.coreMass = 0;
      this.fraction = t / tr.tMS;
      this.coordinate = mainSequenceCoordinate(m0, this.fraction);
      this.spacing = m0;
      this.dead = false;
      this.finish(this.ms[0], this.ms[1]);
      return;
    }
    const s = this.state;
    this.curves[phase]!.at(m0, s);
    this.mass = s[MASS];
    this.coreMass = s[CORE_MASS];
    this.fraction = s[FRACTION];
    this.coordinate = s[FRACTION];
    this.spacing = s[SPACING];
    this.dead = !(s[MASS] > s[CORE_MASS] + 1e-6);
    this.finish(s[LOG_L], s[LOG_R]);
  }

  private finish(logL: number, logR: number): void {
    this.logL = logL;
    this.logR = logR;
    this.logTeff = LOG_TEFF_SUN + 0.25 * logL - 0.5 * logR;
    this.logg = LOG_G_SUN + Math.log10(this.mass) - 2 * logR;
  }
}

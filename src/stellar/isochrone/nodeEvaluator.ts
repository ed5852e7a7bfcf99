/**
 * Evaluates one isochrone node: the star of initial mass m0 at the isochrone's age, in a phase the caller
 * already knows (from the phase boundaries, so that nodes on a boundary get the phase of their interval).
 * Results go to public fields; nothing is allocated per node.
 */
import { Phase } from '../types.js';
import { mainSequenceAt } from '../evolution/mainSequence.js';
import { StellarTrack } from '../evolution/track.js';
import type { EvolutionModel } from '../evolution/types.js';
import { logTeffOf, loggOf } from '../solar.js';
import type { MassLossInterpolant } from './massLossInterpolant.js';

export class NodeEvaluator {
  model!: EvolutionModel;
  tMyr = 0;
  eta = 0.5;
  losses!: MassLossInterpolant;
  readonly track = new StellarTrack();
  private readonly out = new Float64Array(3);

  // Results of the last `evaluate`.
  mass = 0;
  coreMass = 0;
  logL = 0;
  logR = 0;
  logTeff = 0;
  logg = 0;
  /** Fraction of the phase completed (the phase coordinate's fractional part). */
  fraction = 0;
  /**
   * A variable nearly linear in m0 in which the node's magnitudes vary evenly: time to the core law's
   * singularity on the giant branches (so that geometric steps in it are even steps in log L).
   */
  spacing = 0;
  /** True when the envelope is exhausted (the star is a remnant and not part of the isochrone). */
  dead = false;

  setup(model: EvolutionModel, tMyr: number, eta: number, losses: MassLossInterpolant): void {
    this.model = model;
    this.tMyr = tMyr;
    this.eta = eta;
    this.losses = losses;
  }

  evaluate(m0: number, phase: Phase): void {
    const t = this.tMyr;
    const tr = this.track.setMass(this.model, m0, this.eta);
    const out = this.out;
    this.dead = false;
    if (phase === Phase.MainSequence) {
      tr.fillMainSequence();
      const tt = Math.min(t, tr.tMS);
      mainSequenceAt(tr.ms, tt, out);
      this.mass = m0;
      this.coreMass = 0;
      this.fraction = tt / tr.tMS;
      this.spacing = m0;
      this.finish(out[0], out[1]);
      return;
    }
    tr.fillGiant();
    const losses = this.losses;
    if (phase === Phase.HertzsprungGap) tr.fillGap(losses.massEndHG(m0));
    else if (phase !== Phase.GiantBranch) tr.fillHelium(losses.massAtHeI(m0, tr.gb.hasGB));
    const x = tr.progressAt(phase, t);
    const mass = m0 - losses.lost(phase, m0, x);
    this.fraction = tr.stateAt(phase, x, mass, out);
    this.mass = mass;
    this.coreMass = out[2];
    this.dead = !(mass > out[2] + 1e-6);
    if (phase === Phase.GiantBranch) this.spacing = this.timeToSingularity(tr.gb.law, 10 ** out[0], t);
    else if (phase === Phase.EarlyAGB) this.spacing = this.timeToSingularity(tr.agb.law, 10 ** out[0], t);
    else this.spacing = x;
    this.finish(out[0], out[1]);
  }

  private timeToSingularity(law: { lx: number; tInf1: number; tInf2: number }, l: number, t: number): number {
    return (l <= law.lx ? law.tInf1 : law.tInf2) - t;
  }

  private finish(logL: number, logR: number): void {
    this.logL = logL;
    this.logR = logR;
    this.logTeff = logTeffOf(logL, logR);
    this.logg = loggOf(this.mass, logR);
  }
}

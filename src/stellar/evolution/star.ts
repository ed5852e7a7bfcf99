/**
 * One star at one age: `evolveStar(m0, Z, ageMyr)`. The reference evaluation of the model, exact up to
 * the accuracy of the mass-loss integral, which it takes with many steps (64 per segment). Isochrones use
 * a faster route to the same numbers (src/stellar/isochrone); tests compare the two.
 */
import { Phase } from '../types.js';
import { logTeffOf, loggOf } from '../solar.js';
import { DenseMass } from './denseMass.js';
import { DEFAULT_REIMERS_ETA } from './massLoss.js';
import { mainSequenceAt } from './mainSequence.js';
import { evolutionModel } from './model.js';
import { StellarTrack } from './track.js';

export interface StarState {
  phase: Phase;
  ageMyr: number;
  massInitial: number;
  /** Current mass after winds. */
  mass: number;
  /** Helium core mass (hydrogen-exhausted core); on the EAGB the helium core, `coreMassCO` the CO core. */
  coreMass: number;
  coreMassCO: number;
  logL: number;
  logR: number;
  logTeff: number;
  logg: number;
  /** Fraction of the current phase completed (as used by the isochrone's phase coordinate). */
  phaseFraction: number;
  /** Ages (Myr) at which the phases end: MS, HG, GB (helium ignition), CHeB, EAGB. */
  phaseEndsMyr: [number, number, number, number, number];
}

export interface EvolveOptions {
  /** Reimers eta (HPT2000 section 7.1; 0.5 by default). */
  eta?: number;
  /** RK4 steps per integration segment. */
  steps?: number;
}

/**
 * The state of a star of initial mass m0 (0.1-100 Msun) and metallicity Z at age ageMyr, or undefined
 * when it has left the modelled phases (thermally pulsing AGB, or a remnant, or its envelope is gone).
 */
export function evolveStar(m0: number, Z: number, ageMyr: number, options: EvolveOptions = {}): StarState | undefined {
  if (!(m0 >= 0.1 && m0 <= 100)) throw new RangeError(`initial mass ${m0} is outside 0.1-100 Msun`);
  const model = evolutionModel(Z);
  const eta = options.eta ?? DEFAULT_REIMERS_ETA;
  const steps = options.steps ?? 64;
  const t = ageMyr;
  const track = new StellarTrack().setMass(model, m0, eta);
  const out = new Float64Array(3);
  const ends = (): [number, number, number, number, number] => [track.tMS, track.tBGB, track.tHeI, track.tBAGB, track.tEnd];
  const finish = (phase: Phase, mass: number, logL: number, logR: number, mc: number, mcCO: number, fraction: number): StarState => ({
    phase,
    ageMyr: t,
    massInitial: m0,
    mass,
    coreMass: mc,
    coreMassCO: mcCO,
    logL,
    logR,
    logTeff: logTeffOf(logL, logR),
    logg: loggOf(mass, logR),
    phaseFraction: fraction,
    phaseEndsMyr: ends(),
  });

  track.fillGiant();
  if (t < track.tMS) {
    track.fillMainSequence();
    mainSequenceAt(track.ms, t, out);
    track.tBAGB = Number.NaN;
    track.tEnd = Number.NaN;
    return finish(Phase.MainSequence, m0, out[0], out[1], 0, 0, t / track.tMS);
  }
  const dense = new DenseMass(4 * steps + 8);
  const breaks = new Float64Array(5);
  const integrateTo = (phase: Phase, mStart: number, xNow: number, extra?: Float64Array): number => {
    let n = 0;
    const pts = extra ? Array.from(extra) : [0, 1];
    if (xNow > 0 && xNow < 1) pts.push(xNow);
    pts.sort((a, b) => a - b);
    for (const p of pts) breaks[n++] = p;
    return dense.integrate(track, phase, mStart, breaks.subarray(0, n), steps);
  };

  // Hertzsprung gap: integrate with the gap's shape at the initial mass, then fix its end radius.
  track.fillGap(m0);
  const xHG = track.progressAt(Phase.HertzsprungGap, t);
  const mEndHG = integrateTo(Phase.HertzsprungGap, m0, xHG);
  if (dense.xDead <= 1) return undefined;
  track.fillGap(mEndHG);
  if (t < track.tBGB) {
    track.tBAGB = Number.NaN;
    track.tEnd = Number.NaN;
    const mass = dense.at(xHG);
    track.stateAt(Phase.HertzsprungGap, xHG, mass, out);
    return finish(Phase.HertzsprungGap, mass, out[0], out[1], out[2], 0, xHG);
  }

  let mHeI = mEndHG;
  if (track.gb.hasGB) {
    const xGB = t < track.tHeI ? track.progressAt(Phase.GiantBranch, t) : 1;
    mHeI = integrateTo(Phase.GiantBranch, mEndHG, xGB);
    if (dense.xDead <= xGB) return undefined;
    if (t < track.tHeI) {
      track.tBAGB = Number.NaN;
      track.tEnd = Number.NaN;
      const mass = dense.at(xGB);
      const f = track.stateAt(Phase.GiantBranch, xGB, mass, out);
      return finish(Phase.GiantBranch, mass, out[0], out[1], out[2], 0, f);
    }
  }

  track.fillHelium(mHeI);
  const xHe = track.progressAt(Phase.CoreHeliumBurning, t);
  const mEndHe = integrateTo(Phase.CoreHeliumBurning, mHeI, t < track.tBAGB ? xHe : 1, track.heliumBreaks(new Float64Array(4)));
  if (t < track.tBAGB) {
    if (dense.xDead <= xHe) return undefined;
    const mass = dense.at(xHe);
    const f = track.stateAt(Phase.CoreHeliumBurning, xHe, mass, out);
    return finish(Phase.CoreHeliumBurning, mass, out[0], out[1], out[2], 0, f);
  }
  if (dense.xDead <= 1) return undefined;
  track.mEndHe = mEndHe;
  if (t >= track.tEnd) return undefined;
  const xAGB = track.progressAt(Phase.EarlyAGB, t);
  integrateTo(Phase.EarlyAGB, mEndHe, xAGB);
  if (dense.xDead <= xAGB) return undefined;
  const mass = dense.at(xAGB);
  const f = track.stateAt(Phase.EarlyAGB, xAGB, mass, out);
  const mcCO = track.agb.mcCOStart + xAGB * (track.agb.mcCOEnd - track.agb.mcCOStart);
  return finish(Phase.EarlyAGB, mass, out[0], out[1], out[2], mcCO, f);
}

/** Ages (Myr) at which a star's phases end, with the mass lost on the way (HPT2000 sections 5 and 7). */
export function phaseEnds(m0: number, Z: number, options: EvolveOptions = {}): { tMS: number; tBGB: number; tHeI: number; tBAGB: number; tEnd: number; massAtHeI: number } {
  const model = evolutionModel(Z);
  const eta = options.eta ?? DEFAULT_REIMERS_ETA;
  const steps = options.steps ?? 64;
  const track = new StellarTrack().setMass(model, m0, eta).fillGiant().fillGap(m0);
  const dense = new DenseMass(steps + 2);
  const unit = new Float64Array([0, 1]);
  const mEndHG = dense.integrate(track, Phase.HertzsprungGap, m0, unit, steps);
  track.fillGap(mEndHG);
  const mHeI = track.gb.hasGB ? dense.integrate(track, Phase.GiantBranch, mEndHG, unit, steps) : mEndHG;
  track.fillHelium(mHeI);
  return { tMS: track.tMS, tBGB: track.tBGB, tHeI: track.tHeI, tBAGB: track.tBAGB, tEnd: track.tEnd, massAtHeI: mHeI };
}

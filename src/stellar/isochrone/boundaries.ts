/**
 * The initial masses at which an isochrone's stars change phase: the roots of t_X(M) = t for the end
 * times of each phase (HPT2000 section 5), found by bracketing (`bracketedRoot`). Every end time falls
 * with mass, so the stars of each phase form one interval of initial mass, in phase order.
 *
 * The first three boundaries (end of MS, of the gap, of the GB) depend on the initial mass alone. The end
 * of core helium burning and of the early AGB depend, for low-mass stars, on the mass left at helium
 * ignition; they are found twice: first ignoring winds (to bound the range over which the mass-loss
 * reference tracks are needed), then with the interpolated wind losses.
 */
import { Phase } from '../types.js';
import { tMainSequence, tBGB } from '../evolution/mainSequence.js';
import { bracketedRoot } from '../evolution/rootFind.js';
import { StellarTrack } from '../evolution/track.js';
import type { EvolutionModel } from '../evolution/types.js';
import type { MassLossInterpolant } from './massLossInterpolant.js';

export const MIN_MASS = 0.1;
const MAX_MASS = 100;

export interface PhaseInterval {
  phase: Phase;
  mLo: number;
  mHi: number;
}

const scratch = new StellarTrack();

/**
 * Root of f(m) = t_X(m) - t on [lo, hi], where f(lo) >= 0 and f falls with m; returns hi if f stays
 * positive. Phase boundaries lie close above the previous one, so the bracket grows geometrically in ln m
 * from lo (1, 2, 4, ... per cent) before the root is polished in ln m.
 */
function crossing(f: (m: number) => number, lo: number, hi: number, firstStep = 0.01): number {
  const fLo0 = f(lo);
  if (fLo0 <= 0) return lo;
  let uLo = Math.log(lo);
  let fLo = fLo0;
  const uMax = Math.log(hi);
  let step = firstStep;
  for (;;) {
    const uHi = Math.min(uLo + step, uMax);
    const fHi = f(Math.exp(uHi));
    if (fHi <= 0) {
      const u = bracketedRoot((v) => f(Math.exp(v)), uLo, uHi, fLo, fHi, 1e-11);
      return Math.min(hi, Math.max(lo, Math.exp(u)));
    }
    if (uHi >= uMax) return hi;
    uLo = uHi;
    fLo = fHi;
    step *= 2;
  }
}

/** Mass whose main sequence ends at age t (Myr). */
export function turnoffMass(model: EvolutionModel, tMyr: number): number {
  return crossing((m) => tMainSequence(model, m) - tMyr, MIN_MASS, MAX_MASS, 0.5);
}

export interface EarlyBoundaries {
  mTMS: number;
  mBGB: number;
  /** Last star on the GB, and first star in core helium burning (equal unless the GB ends at M_FGB). */
  mGBEnd: number;
  mHeI: number;
  /** The last living star if there were no winds (the end of the early AGB without mass loss). */
  mEndDry: number;
}

/**
 * Upper bound on the last living star with winds, for the range of the wind reference tracks: the dry end
 * raised by the fraction `pad`. Winds lengthen low-mass lifetimes after the giant branch only slightly
 * (they move the end of the early AGB up in mass by at most 4e-4 of itself at eta = 0.5, 2e-3 at eta = 1,
 * over 10^9-10^10.15 yr and the whole Z range); the caller checks the bound and widens it when reached.
 */
export function upperMass(early: EarlyBoundaries, pad: number): number {
  return Math.min(MAX_MASS, Math.max(early.mEndDry * (1 + pad), early.mHeI * 1.0001, early.mTMS * (1 + 1e-6)));
}

export function earlyBoundaries(model: EvolutionModel, tMyr: number, eta: number): EarlyBoundaries {
  const mTMS = turnoffMass(model, tMyr);
  const mBGB = crossing((m) => tBGB(model, m) - tMyr, mTMS, MAX_MASS);
  const tHeI = (m: number): number => scratch.setMass(model, m, eta).fillGiant().tHeI - tMyr;
  let mHeI = crossing(tHeI, mBGB, MAX_MASS);
  let mGBEnd = mHeI;
  // At M_FGB, t_HeI drops to t_BGB. A root there means that the giant branch ends just below M_FGB,
  // unfinished, and that core helium burning starts at M_FGB with stars that skipped the giant branch.
  if (mBGB < model.mFGB && mHeI > model.mFGB * (1 - 1e-9)) {
    mHeI = model.mFGB;
    mGBEnd = model.mFGB * (1 - 1e-12);
  }
  const tEndDry = (m: number): number => {
    const tr = scratch.setMass(model, m, eta).fillGiant();
    return tr.fillHelium(m).tEnd - tMyr;
  };
  const mEndDry = crossing(tEndDry, mHeI, MAX_MASS);
  return { mTMS, mBGB, mGBEnd, mHeI, mEndDry };
}

/**
 * The phase intervals, with the winds' effect on the end of CHeB and of the EAGB, searched up to mUpper
 * (the range of the wind reference tracks in `losses`). If the last interval ends at mUpper, the bound was
 * too tight (see `upperMass`).
 */
export function phaseIntervals(model: EvolutionModel, tMyr: number, eta: number, early: EarlyBoundaries, losses: MassLossInterpolant, mUpper: number): PhaseInterval[] {
  const { mTMS, mBGB, mGBEnd, mHeI } = early;
  const heliumTrack = (m: number, withAGB: boolean): StellarTrack => {
    const tr = scratch.setMass(model, m, eta).fillGiant();
    return tr.fillHelium(losses.massAtHeI(m, tr.gb.hasGB), withAGB);
  };
  const mBAGB = crossing((m) => heliumTrack(m, false).tBAGB - tMyr, mHeI, mUpper);
  const mEnd = crossing((m) => heliumTrack(m, true).tEnd - tMyr, mBAGB, mUpper);
  const list: PhaseInterval[] = [
    { phase: Phase.MainSequence, mLo: MIN_MASS, mHi: mTMS },
    { phase: Phase.HertzsprungGap, mLo: mTMS, mHi: mBGB },
    { phase: Phase.GiantBranch, mLo: mBGB, mHi: mGBEnd },
    { phase: Phase.CoreHeliumBurning, mLo: mHeI, mHi: mBAGB },
    { phase: Phase.EarlyAGB, mLo: mBAGB, mHi: mEnd },
  ];
  return list.filter((iv) => iv.mHi > iv.mLo * (1 + 1e-13) || iv.phase === Phase.MainSequence);
}

/**
 * Mass lost by winds, for every post-main-sequence node of one isochrone, from a handful of reference
 * tracks.
 *
 * Why: a node's current mass is its initial mass minus the wind losses integrated along its own track up
 * to the isochrone's age (HPT2000 section 7.1). Integrating that per node would cost microseconds per node
 * (the giant-branch and AGB rates depend on the current mass, so it is an ODE, not a quadrature). But the
 * post-main-sequence part of an isochrone spans a narrow range of initial mass, and at a fixed point of a
 * phase (progress x, see `StellarTrack.dMassDx`) the mass lost is a smooth function of initial mass. So we
 * integrate K reference tracks once per isochrone, at Chebyshev-Lobatto initial masses over that range,
 * keeping a dense output in x for every phase, and interpolate: barycentric (Lagrange) in initial mass,
 * cubic Hermite in x. The range is split where the formulae have kinks in mass (M_HeF, M_FGB and the breaks
 * of A_H, B, p and q), so that each piece is smooth. Tests compare the result with `evolveStar`.
 */
import { Phase } from '../types.js';
import { DenseMass } from '../evolution/denseMass.js';
import { StellarTrack } from '../evolution/track.js';
import type { EvolutionModel } from '../evolution/types.js';

/** RK4 steps per integration segment for each phase (HG, GB, CHeB per segment, EAGB). */
const STEPS = [4, 12, 8, 12];
const PHASE_INDEX: Record<number, number> = {
  [Phase.HertzsprungGap]: 0,
  [Phase.GiantBranch]: 1,
  [Phase.CoreHeliumBurning]: 2,
  [Phase.EarlyAGB]: 3,
};

/** Masses where the formulae of HPT2000 switch branch (A_H: 1.125, 2.4242; B: 2.3877; p, q, D: 2.5). */
const FIXED_BREAKS = [1.125, (29500 / 17500) ** (1 / 0.6), 1.6 / 0.66, 2.5];

/** Branch switches in initial mass, ascending: the fixed ones plus M_HeF and M_FGB of this Z. */
export function massBreaks(model: EvolutionModel): number[] {
  return [...FIXED_BREAKS, model.mHeF, model.mFGB].sort((a, b) => a - b);
}

/**
 * Reference tracks per piece of relative width rel = (hi - lo)/lo. Measured against tracks integrated at
 * each mass (40 masses per piece, the 4 phases at x = 0.1, 0.5, 0.9, 1; log age 8-10.15, [Fe/H] -2.3 to
 * +0.2): the interpolation error in the mass lost is below 3e-6 Msun on the first giant branch and CHeB
 * and 2e-5 Msun on the early AGB (whose tolerance is relative, 2e-3), against 3e-4 Msun allowed. Where a
 * piece holds a kink in x of the CHeB rates (stars just at tau_x), more tracks do not help; the count
 * is then set by the pieces' widths as everywhere.
 */
function referenceCount(rel: number): number {
  return rel < 1e-6 ? 1 : rel < 0.005 ? 3 : rel < 0.02 ? 4 : rel < 0.05 ? 5 : rel < 0.1 ? 6 : 8;
}

class ReferenceTrack {
  m0 = 0;
  hasGB = true;
  mEndHG = 0;
  mHeI = 0;
  readonly track = new StellarTrack();
  readonly dense = [new DenseMass(16), new DenseMass(32), new DenseMass(32), new DenseMass(32)];
  private readonly unit = new Float64Array([0, 1]);
  private readonly heBreaks = new Float64Array(4);

  integrate(model: EvolutionModel, m0: number, eta: number): void {
    const tr = this.track.setMass(model, m0, eta).fillGiant().fillGap(m0);
    this.m0 = m0;
    this.hasGB = tr.gb.hasGB;
    this.mEndHG = this.dense[0].integrate(tr, Phase.HertzsprungGap, m0, this.unit, STEPS[0]);
    tr.fillGap(this.mEndHG);
    if (this.hasGB) this.mHeI = this.dense[1].integrate(tr, Phase.GiantBranch, this.mEndHG, this.unit, STEPS[1]);
    else {
      this.mHeI = this.mEndHG;
      this.dense[1].n = 0;
    }
    tr.fillHelium(this.mHeI);
    const mEndHe = this.dense[2].integrate(tr, Phase.CoreHeliumBurning, this.mHeI, tr.heliumBreaks(this.heBreaks), STEPS[2]);
    this.dense[3].integrate(tr, Phase.EarlyAGB, mEndHe, this.unit, STEPS[3]);
  }

  /** Mass lost from the initial mass up to progress x of a phase. */
  lost(pi: number, x: number): number {
    const d = this.dense[pi];
    if (d.n === 0) return this.m0 - this.mEndHG;
    return this.m0 - d.at(x);
  }
}

export class MassLossInterpolant {
  private readonly pool: ReferenceTrack[] = [];
  /** Pieces of the mass range: [lo, hi), first reference index, reference count. */
  private lo = new Float64Array(8);
  private hi = new Float64Array(8);
  private first = new Int32Array(8);
  private count = new Int32Array(8);
  private pieces = 0;
  private readonly w = new Float64Array(16);
  /** The mass and piece of the weights in `w`: one star asks for several phases in a row. */
  private wMass = Number.NaN;
  private wPiece = 0;

  /** Integrate the reference tracks over [mLo, mHi]. */
  build(model: EvolutionModel, eta: number, mLo: number, mHi: number): void {
    const breaks = massBreaks(model).filter((b) => b > mLo * (1 + 1e-9) && b < mHi * (1 - 1e-9));
    const edges = [mLo, ...breaks, mHi];
    this.pieces = 0;
    this.wMass = Number.NaN;
    let used = 0;
    for (let s = 0; s + 1 < edges.length; s++) {
      const a = edges[s];
      const b = edges[s + 1];
      const rel = (b - a) / a;
      const k = referenceCount(rel);
      this.lo[this.pieces] = a;
      this.hi[this.pieces] = b;
      this.first[this.pieces] = used;
      this.count[this.pieces] = k;
      for (let j = 0; j < k; j++) {
        // Chebyshev-Lobatto points, inset by a hair so that no reference sits exactly on a kink.
        const c = k === 1 ? 0 : Math.cos((Math.PI * j) / (k - 1));
        const inset = (b - a) * 1e-9;
        const m = 0.5 * (a + b) - 0.5 * (b - a - 2 * inset) * c;
        if (used >= this.pool.length) this.pool.push(new ReferenceTrack());
        this.pool[used++].integrate(model, m, eta);
      }
      this.pieces++;
    }
  }

  /** Barycentric weights of the piece containing m0 into `this.w`; returns the piece index. */
  private weights(m0: number): number {
    if (m0 === this.wMass) return this.wPiece;
    const p = this.computeWeights(m0);
    this.wMass = m0;
    this.wPiece = p;
    return p;
  }

  private computeWeights(m0: number): number {
    let p = 0;
    while (p < this.pieces - 1 && m0 >= this.hi[p]) p++;
    const k = this.count[p];
    const f = this.first[p];
    if (k === 1) {
      this.w[0] = 1;
      return p;
    }
    let sum = 0;
    for (let j = 0; j < k; j++) {
      const d = m0 - this.pool[f + j].m0;
      if (d === 0) {
        for (let i = 0; i < k; i++) this.w[i] = i === j ? 1 : 0;
        return p;
      }
      const wj = ((j & 1 ? -1 : 1) * (j === 0 || j === k - 1 ? 0.5 : 1)) / d;
      this.w[j] = wj;
      sum += wj;
    }
    for (let j = 0; j < k; j++) this.w[j] /= sum;
    return p;
  }

  /** Mass lost by a star of initial mass m0 from the ZAMS to progress x of a post-main-sequence phase. */
  lost(phase: Phase, m0: number, x: number): number {
    const pi = PHASE_INDEX[phase];
    const p = this.weights(m0);
    const f = this.first[p];
    let v = 0;
    for (let j = 0; j < this.count[p]; j++) v += this.w[j] * this.pool[f + j].lost(pi, x);
    return v;
  }

  /** Mass at the end of the Hertzsprung gap. */
  massEndHG(m0: number): number {
    return m0 - this.lost(Phase.HertzsprungGap, m0, 1);
  }

  /** Mass at helium ignition (the end of the GB, or of the gap above M_FGB). */
  massAtHeI(m0: number, hasGB: boolean): number {
    return m0 - this.lost(hasGB ? Phase.GiantBranch : Phase.HertzsprungGap, m0, 1);
  }
}

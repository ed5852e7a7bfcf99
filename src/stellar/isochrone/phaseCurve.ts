/**
 * One post-main-sequence phase of an isochrone as a curve in initial mass: log L, log R, core mass,
 * current mass, phase fraction and the node-spacing variable of the star of initial mass m at the
 * isochrone's age, as piecewise polynomials in m.
 *
 * Why: the stars of one post-main-sequence phase of an isochrone span a very narrow range of initial mass
 * (often well under 1 per cent), and the node placement wants hundreds to thousands of points there, each
 * of which would cost tens of powers and logarithms (HPT2000 section 5 plus the wind losses). Between the
 * masses where a formula switches branch the state is smooth in m, so it is taken from exact evaluations at
 * Chebyshev-Lobatto points and interpolated (barycentric Lagrange, `chebyshev.ts`). Each piece is sampled
 * at 9 Lobatto points, which contain the 5 of the next lower order; the piece is kept (with its 9-point
 * interpolant) only if the 5-point interpolant already reproduces the other 4 samples (to 3e-5 dex in L,
 * 1e-4 dex in R, 3e-5 Msun in core mass, 2e-4 Msun in current mass and 3e-5 in phase fraction), which for
 * these smooth functions leaves the 9-point one far more accurate; otherwise the piece is halved. Where the state is not smooth
 * in m, the piece's variable is changed so that it is: on the giant branches v = ln T_lin(m), with T_lin
 * the linear interpolant in m of the time left to the core law's singularity (log L is nearly linear in
 * ln T, and the singularity lies just beyond the tip of the giant branch); in core helium burning, on the
 * side of tau_x where L rises as (tau - tau_x)^xi with xi possibly below 1 (section 5.3), v = u^xi with u
 * the piece's linear coordinate from that end. Known branch switches (M_HeF, M_FGB, the breaks of A_H, B, p and q) and, in
 * core helium burning, the masses whose stars are just at tau_x or tau_y, split pieces from the start;
 * validation catches kinks not known in advance (clamps of tau_bl or xi, the max in R_min). Tests compare
 * nodes with `evolveStar`.
 */
import { Phase } from '../types.js';
import { StellarTrack } from '../evolution/track.js';
import type { EvolutionModel } from '../evolution/types.js';
import { bracketedRoot } from '../evolution/rootFind.js';
import { lobattoPoints } from './chebyshev.js';
import type { MassLossInterpolant } from './massLossInterpolant.js';

/**
 * Samples per piece (Lobatto): a piece is first sampled at 9 points and checked with the nested 5; if that
 * fails, at the 17 points that contain the 9, and checked with those; if that fails too, it is halved.
 */
const K = 9;
const K_HIGH = 17;
const MAX_DEPTH = 14;
/** States remembered by initial mass, so that a halved piece does not evaluate its ends again. */
const KNOWN = 64;
/** Check tolerances per field: log L, log R, core mass, current mass, fraction. */
const TOLERANCE = [3e-5, 1e-4, 3e-5, 2e-4, 3e-5];
/** Numbers stored per piece for the map m -> v: a, b, T(a), T(b), exponent (NaN: not graded). */
const ENDS = 5;

/** Fields of the packed state. */
export const LOG_L = 0;
export const LOG_R = 1;
export const CORE_MASS = 2;
export const MASS = 3;
export const FRACTION = 4;
export const SPACING = 5;
export const STATE_WIDTH = 6;

/** Barycentric weights of k Lobatto points up to a common factor: (-1)^j, halved at the ends. */
function lobattoSigns(k: number): Float64Array {
  return Float64Array.from({ length: k }, (_, j) => (j & 1 ? -1 : 1) * (j === 0 || j === k - 1 ? 0.5 : 1));
}
const SIGNS: Float64Array[] = [];
for (const k of [(K + 1) / 2, K, K_HIGH]) SIGNS[k] = lobattoSigns(k);

export class PhaseCurve {
  private phase: Phase = Phase.GiantBranch;
  private model!: EvolutionModel;
  private tMyr = 0;
  private eta = 0.5;
  private losses!: MassLossInterpolant;
  private nPieces = 0;
  /** Whether the curve's variable is ln T_lin (giant branches) rather than m. */
  private logTime = false;
  /** Masses where the CHeB luminosity starts rising as (tau - tau_x)^xi (graded pieces start there). */
  private singular: number[] = [];
  private hi: Float64Array = new Float64Array(32);
  /** Per piece: the map m -> v (see ENDS). */
  private ends: Float64Array = new Float64Array(32 * ENDS);
  /** Per piece: its first sample (index into `points`) and its number of samples. */
  private first = new Int32Array(32);
  private count = new Int32Array(32);
  /** Sample points in the curve variable, and the states there, piece after piece. */
  private points: Float64Array = new Float64Array(32 * K);
  private samples: Float64Array = new Float64Array(32 * K * STATE_WIDTH);
  private nPoints = 0;
  private readonly track = new StellarTrack();
  private readonly out = new Float64Array(3);
  private readonly pts = new Float64Array(K_HIGH);
  private readonly probe = new Float64Array(STATE_WIDTH);
  private readonly pending = new Float64Array(K_HIGH * STATE_WIDTH);
  /** Ring of recent exact states (initial mass, state, CHeB xi), see KNOWN. */
  private readonly knownMass = new Float64Array(KNOWN);
  private readonly knownState = new Float64Array(KNOWN * STATE_WIDTH);
  private readonly knownXi = new Float64Array(KNOWN);
  private nKnown = 0;
  /** xi of the CHeB luminosity rise (section 5.3) of the last `state` call. */
  private lastXi = Number.NaN;
  /** Exact evaluations made by the last build. */
  evaluations = 0;

  build(model: EvolutionModel, tMyr: number, eta: number, losses: MassLossInterpolant, phase: Phase, mLo: number, mHi: number, breaks: readonly number[]): void {
    this.model = model;
    this.tMyr = tMyr;
    this.eta = eta;
    this.losses = losses;
    this.phase = phase;
    this.nPieces = 0;
    this.nPoints = 0;
    this.nKnown = 0;
    this.evaluations = 0;
    this.logTime = phase === Phase.GiantBranch || phase === Phase.EarlyAGB;
    this.singular = [];
    if (phase === Phase.CoreHeliumBurning) {
      // The interval starts at tau = 0; when tau_x = 0 (low and high masses), L rises as tau^xi there.
      this.state(mLo, this.probe, 0);
      if (this.track.he.tauX === 0) this.singular.push(mLo);
    }
    const loop = phase === Phase.CoreHeliumBurning ? this.loopBreaks(mLo, mHi) : this.logTime ? this.lawBreaks(mLo, mHi) : [];
    const all = [...breaks, ...loop].sort((x, y) => x - y);
    // A piece that ends at a break ends just below it, so that its samples all lie on one branch of the
    // formulae (the state can jump there: at M_FGB the CHeB time fraction does, by some 4e-5), and
    // masses from the break on belong to the next piece.
    let a = mLo;
    for (const b of all) {
      if (b > a * (1 + 1e-12) && b < mHi * (1 - 1e-12)) {
        this.fit(a, b * (1 - Number.EPSILON), 0);
        a = b;
      }
    }
    this.fit(a, mHi, 0);
  }

  /** Interpolated state of initial mass m0 into out[0..STATE_WIDTH-1]. */
  at(m0: number, out: Float64Array): void {
    // Pieces are few; a linear scan beats a search.
    let p = 0;
    const last = this.nPieces - 1;
    while (p < last && m0 > this.hi[p]) p++;
    const x = this.variable(m0, p * ENDS);
    const xs = this.points;
    const s = this.samples;
    const o = this.first[p];
    const k = this.count[p];
    const signs = SIGNS[k];
    // Barycentric formula (second form), all fields in one pass and one division by the weights' sum.
    let sw = 0;
    let f0 = 0;
    let f1 = 0;
    let f2 = 0;
    let f3 = 0;
    let f4 = 0;
    let f5 = 0;
    for (let j = 0; j < k; j++) {
      const d = x - xs[o + j];
      const r = (o + j) * STATE_WIDTH;
      if (d === 0) {
        for (let f = 0; f < STATE_WIDTH; f++) out[f] = s[r + f];
        return;
      }
      const c = signs[j] / d;
      sw += c;
      f0 += c * s[r];
      f1 += c * s[r + 1];
      f2 += c * s[r + 2];
      f3 += c * s[r + 3];
      f4 += c * s[r + 4];
      f5 += c * s[r + 5];
    }
    const inv = 1 / sw;
    out[0] = f0 * inv;
    out[1] = f1 * inv;
    out[2] = f2 * inv;
    out[3] = f3 * inv;
    out[4] = f4 * inv;
    out[5] = f5 * inv;
  }

  /** `exactState`, or a copy of it if m was evaluated recently in this build. */
  private state(m: number, out: Float64Array, o: number): void {
    const n = Math.min(this.nKnown, KNOWN);
    for (let i = 0; i < n; i++) {
      if (this.knownMass[i] === m) {
        for (let f = 0; f < STATE_WIDTH; f++) out[o + f] = this.knownState[i * STATE_WIDTH + f];
        this.lastXi = this.knownXi[i];
        return;
      }
    }
    this.exactState(m, out, o);
    this.lastXi = this.phase === Phase.CoreHeliumBurning ? this.track.he.xi : Number.NaN;
    const slot = this.nKnown++ % KNOWN;
    this.knownMass[slot] = m;
    this.knownXi[slot] = this.lastXi;
    for (let f = 0; f < STATE_WIDTH; f++) this.knownState[slot * STATE_WIDTH + f] = out[o + f];
  }

  /** The exact state of initial mass m at the isochrone's age into out[o..]. */
  exactState(m: number, out: Float64Array, o: number): void {
    this.evaluations++;
    const phase = this.phase;
    const losses = this.losses;
    const tr = this.track.setMass(this.model, m, this.eta).fillGiant();
    if (phase === Phase.HertzsprungGap) tr.fillGap(losses.massEndHG(m));
    else if (phase !== Phase.GiantBranch) tr.fillHelium(losses.massAtHeI(m, tr.gb.hasGB), phase === Phase.EarlyAGB);
    const x = tr.progressAt(phase, this.tMyr);
    const mass = m - losses.lost(phase, m, x);
    const fraction = tr.stateAt(phase, x, mass, this.out);
    out[o + LOG_L] = this.out[0];
    out[o + LOG_R] = this.out[1];
    out[o + CORE_MASS] = this.out[2];
    out[o + MASS] = mass;
    out[o + FRACTION] = fraction;
    // Node spacing: on the giant branches the time left to the core law's singularity, in which the
    // track is nearly linear in m and log L nearly linear in its logarithm; elsewhere the phase fraction.
    if (phase === Phase.GiantBranch || phase === Phase.EarlyAGB) {
      const law = phase === Phase.GiantBranch ? tr.gb.law : tr.agb.law;
      out[o + SPACING] = (Math.pow(10, this.out[0]) <= law.lx ? law.tInf1 : law.tInf2) - this.tMyr;
    } else out[o + SPACING] = x;
  }

  /** The curve variable of mass m in the piece whose map starts at ends[e]. */
  private variable(m: number, e: number): number {
    const ends = this.ends;
    if (this.logTime) return Math.log(ends[e + 2] + ((ends[e + 3] - ends[e + 2]) * (m - ends[e])) / (ends[e + 1] - ends[e]));
    const g = ends[e + 4];
    if (g === g) return Math.pow(Math.max(0, (m - ends[e]) / (ends[e + 1] - ends[e])), g);
    return m;
  }

  /** The inverse map: mass of curve variable v in the piece whose map starts at ends[e]. */
  private massOf(v: number, e: number): number {
    const ends = this.ends;
    const a = ends[e];
    const b = ends[e + 1];
    if (this.logTime) return a + ((b - a) * (Math.exp(v) - ends[e + 2])) / (ends[e + 3] - ends[e + 2]);
    const g = ends[e + 4];
    if (g === g) return a + (b - a) * Math.pow(v, 1 / g);
    return v;
  }

  /** Masses in (mLo, mHi) whose stars are exactly at tau_x or tau_y of core helium burning (kinks of R). */
  private loopBreaks(mLo: number, mHi: number): number[] {
    const out: number[] = [];
    const tr = this.track;
    const gap = (m: number, which: number): number => {
      tr.setMass(this.model, m, this.eta).fillGiant();
      tr.fillHelium(this.losses.massAtHeI(m, tr.gb.hasGB), false);
      const tau = tr.progressAt(Phase.CoreHeliumBurning, this.tMyr);
      return tau - (which === 0 ? tr.he.tauX : tr.he.tauY);
    };
    for (let which = 0; which < 2; which++) {
      const f = (m: number): number => gap(m, which);
      const fa = f(mLo);
      const fb = f(mHi);
      if (fa * fb < 0) {
        const m = bracketedRoot(f, mLo, mHi, fa, fb, 1e-12);
        out.push(m);
        if (which === 0) this.singular.push(m);
      }
    }
    return out;
  }

  /**
   * On the giant branches, the mass in (mLo, mHi) whose star is just at the core law's crossover L_x
   * (eq. 37: L = min(B Mc^q, D Mc^p)) at the isochrone's age: L has a kink there, and the spacing
   * variable switches from t_inf1 to t_inf2.
   */
  private lawBreaks(mLo: number, mHi: number): number[] {
    const tr = this.track;
    const onGB = this.phase === Phase.GiantBranch;
    const f = (m: number): number => {
      tr.setMass(this.model, m, this.eta).fillGiant();
      if (onGB) return this.tMyr - tr.gb.law.tX;
      tr.fillHelium(this.losses.massAtHeI(m, tr.gb.hasGB));
      return this.tMyr - tr.agb.law.tX;
    };
    const fa = f(mLo);
    const fb = f(mHi);
    return fa * fb < 0 ? [bracketedRoot(f, mLo, mHi, fa, fb, 1e-12)] : [];
  }

  private fit(a: number, b: number, depth: number): void {
    const pending = this.pending;
    const pts = this.pts;
    // Piece ends first: they fix the map m -> v.
    this.state(a, pending, 0);
    const xiA = this.lastXi;
    this.state(b, pending, (K - 1) * STATE_WIDTH);
    const e = this.nPieces * ENDS;
    this.ensure(this.nPieces + 1, this.nPoints + K_HIGH);
    const ends = this.ends;
    ends[e] = a;
    ends[e + 1] = b;
    ends[e + 2] = pending[SPACING];
    ends[e + 3] = pending[(K - 1) * STATE_WIDTH + SPACING];
    // Grade only where L is the singular field (xi < 1); for xi >= 1 the rise is smooth enough in m.
    ends[e + 4] = this.singular.includes(a) && xiA < 1 ? xiA : Number.NaN;
    const va = this.variable(a, e);
    const vb = this.variable(b, e);
    lobattoPoints(va, vb, K, pts);
    for (let j = 1; j < K - 1; j++) this.state(this.massOf(pts[j], e), pending, j * STATE_WIDTH);
    const refine = depth < MAX_DEPTH && b - a > 1e-11 * b;
    // The 5-point subset (every second point) must already reproduce the other 4.
    let k = K;
    if (refine && !this.reproduces(pts, pending, K)) {
      // Nested 17 points: the 9 known ones go to the even places, the new ones between them.
      for (let j = K - 1; j >= 0; j--) {
        for (let f = 0; f < STATE_WIDTH; f++) pending[2 * j * STATE_WIDTH + f] = pending[j * STATE_WIDTH + f];
      }
      lobattoPoints(va, vb, K_HIGH, pts);
      for (let j = 1; j < K_HIGH; j += 2) this.state(this.massOf(pts[j], e), pending, j * STATE_WIDTH);
      k = K_HIGH;
      if (!this.reproduces(pts, pending, K_HIGH)) {
        const mid = this.massOf(pts[(K_HIGH - 1) / 2], e);
        this.fit(a, mid, depth + 1);
        this.fit(mid, b, depth + 1);
        return;
      }
    }
    const p = this.nPieces++;
    this.hi[p] = b;
    this.first[p] = this.nPoints;
    this.count[p] = k;
    this.points.set(pts.subarray(0, k), this.nPoints);
    this.samples.set(pending.subarray(0, k * STATE_WIDTH), this.nPoints * STATE_WIDTH);
    this.nPoints += k;
  }

  /**
   * Whether the interpolant through the even-numbered of k Lobatto samples (themselves Lobatto points of
   * the next lower order) reproduces the odd-numbered ones within TOLERANCE in every field.
   */
  private reproduces(pts: Float64Array, samples: Float64Array, k: number): boolean {
    const kLow = (k + 1) / 2;
    const signs = SIGNS[kLow];
    for (let j = 1; j < k; j += 2) {
      const x = pts[j];
      for (let f = 0; f < SPACING; f++) {
        let sw = 0;
        let v = 0;
        for (let i = 0; i < kLow; i++) {
          const c = signs[i] / (x - pts[2 * i]);
          sw += c;
          v += c * samples[2 * i * STATE_WIDTH + f];
        }
        if (!(Math.abs(v / sw - samples[j * STATE_WIDTH + f]) <= TOLERANCE[f])) return false;
      }
    }
    return true;
  }

  private ensure(pieces: number, points: number): void {
    const grow = (x: Float64Array, len: number): Float64Array => {
      const y = new Float64Array(len);
      y.set(x);
      return y;
    };
    if (pieces > this.hi.length) {
      const n = 2 * pieces;
      this.hi = grow(this.hi, n);
      this.ends = grow(this.ends, ENDS * n);
      const first = new Int32Array(n);
      first.set(this.first);
      this.first = first;
      const count = new Int32Array(n);
      count.set(this.count);
      this.count = count;
    }
    if (points > this.points.length) {
      const n = 2 * points;
      this.points = grow(this.points, n);
      this.samples = grow(this.samples, n * STATE_WIDTH);
    }
  }

  /** Forget the last build (the phase is absent from the isochrone). */
  clear(): void {
    this.nPieces = 0;
    this.nPoints = 0;
    this.evaluations = 0;
  }

  /** Pieces of the last build (for tests and benchmarks). */
  pieces(): number {
    return this.nPieces;
  }
}

/**
 * The unresolved-binary term of the likelihood (design.md section 3): for one star, the integral over the
 * primary mass and the mass ratio q of the IMF and q weights times the star's Gaussian, as a quadrature over
 * q (qGrid.ts) of closed-form integrals along the binary curves of fixed q (binaryCurves.ts); and Z_B, the
 * same integral of the probability of selection. Kept apart from cmdLikelihood.ts, which combines it with
 * the single stars, the field and the parallaxes, because its state (the curves of each q class, built on
 * first use after each parameter change, their indices, and the per-star items) concerns binaries only.
 */
import type { ModelPolyline } from './polyline.js';
import { BinaryCurveBuilder } from './binaryCurves.js';
import { QGrid } from './qGrid.js';
import { logSegmentIntegral, segmentMinQ } from './segmentIntegral.js';
import { SegmentIndex } from './segmentIndex.js';
import { SegmentSet, segmentBounds } from './segmentSet.js';
import type { Selection } from './selection.js';

/**
 * The q grid for a catalogue: nested levels from 64 to at most 256 intervals, enough that the star with the
 * smallest errors (at sigmaExtra = 0; `maxInvVarSum` is its largest sum over bands of 1 / sigma^2) gets
 * steps below qStepSigma.
 */
export function qGridForErrors(qMin: number, qGamma: number, qStepSigma: number, maxInvVarSum: number): QGrid {
  let levels = 1;
  for (; levels < 3; levels++) {
    const g = new QGrid({ qMin, gamma: qGamma }, levels);
    if (g.maxStepMag[0] * Math.sqrt(maxInvVarSum) <= qStepSigma) break;
  }
  return new QGrid({ qMin, gamma: qGamma }, levels);
}

export class BinaryTerm {
  readonly grid: QGrid;
  private readonly nBands: number;
  private readonly poly: ModelPolyline;
  private readonly prune: boolean;
  private readonly pruneLogRatio: number;
  private readonly builder: BinaryCurveBuilder;
  /** The binary curves of each q class (qGrid.classOf), built on first use after each reset. */
  private readonly classSets: SegmentSet[];
  private readonly classBuilt: Uint8Array;
  /** Per class: segmentBounds with the level-free weights qGrid.lnPrune. */
  private readonly classBound: Float64Array[];
  private readonly classIndex: (SegmentIndex | undefined)[][];
  private readonly classIndexPool: (SegmentIndex | undefined)[][];
  /** First primary node whose binaries any star can see, for the current parameters. */
  private kStart = 0;
  /** Per-curve log selection integrals, scratch for Z_B. */
  private readonly zCurve: Float64Array;

  // per-star scratch
  private sm: Float64Array;
  private siv: Float64Array;
  private cand = new Int32Array(1024);
  private cA = new Float64Array(1024);
  private cB = new Float64Array(1024);
  private cC = new Float64Array(1024);
  private cUb = new Float64Array(1024);
  private cSeg = new Int32Array(1024);
  // the star's segment integrals (without q weight) and their curves, see logIntegral
  private itemVal = new Float64Array(1024);
  private itemCurve = new Int32Array(1024);
  private nItems = 0;
  private itemMax = -Infinity;
  private binMaxUb = -Infinity;

  /** `poly` is the likelihood's single-star polyline, rebuilt in place for each parameter vector. */
  constructor(poly: ModelPolyline, grid: QGrid, options: { prune: boolean; pruneLogRatio: number }) {
    this.poly = poly;
    this.grid = grid;
    this.nBands = poly.nBands;
    this.prune = options.prune;
    this.pruneLogRatio = options.pruneLogRatio;
    const nb = this.nBands;
    const nq = grid.nLevels;
    this.builder = new BinaryCurveBuilder(nb);
    this.classSets = Array.from({ length: nq }, () => new SegmentSet(nb, 1024));
    this.classBuilt = new Uint8Array(nq);
    this.classBound = Array.from({ length: nq }, () => new Float64Array(2));
    this.classIndex = Array.from({ length: nq }, () => new Array(nb).fill(undefined));
    this.classIndexPool = Array.from({ length: nq }, () => new Array(nb).fill(undefined));
    this.zCurve = new Float64Array(grid.n0 + 1);
    this.sm = new Float64Array(nb);
    this.siv = new Float64Array(nb);
  }

  /**
   * After the polyline changed: the curves and their indices are stale and are rebuilt on first use, from
   * primary node `kStart` on (fainter primaries make no binary any star can see).
   */
  reset(kStart: number): void {
    this.kStart = kStart;
    this.classBuilt.fill(0);
    for (const row of this.classIndex) for (let b = 0; b < this.nBands; b++) row[b] = undefined;
  }

  /** The index of q class `c` in reference band `band`, built on first use. */
  private indexFor(c: number, band: number): SegmentIndex {
    const slot = this.classIndex[c];
    let ix = slot[band];
    if (!ix) {
      ix = this.classIndexPool[c][band] ?? new SegmentIndex();
      this.classIndexPool[c][band] = ix;
      ix.build(this.classSet(c), band, 0.1, 1, true);
      slot[band] = ix;
    }
    return ix;
  }

  private ensureCandidates(n: number): void {
    if (this.cand.length >= n) return;
    const cap = Math.max(n, 2 * this.cand.length);
    this.cand = new Int32Array(cap);
    this.cA = new Float64Array(cap);
    this.cB = new Float64Array(cap);
    this.cC = new Float64Array(cap);
    this.cUb = new Float64Array(cap);
    this.cSeg = new Int32Array(cap);
  }

  /** The binary curves of q class c (qGrid.classOf) at the current parameters, built on first use. */
  classSet(c: number): SegmentSet {
    const set = this.classSets[c];
    if (!this.classBuilt[c]) {
      const { first, stride } = this.grid.classNodes(c);
      this.builder.build(this.poly, this.grid, stride, set, this.kStart, first);
      segmentBounds(set, this.grid.lnPrune, 1, this.classBound[c]);
      this.classBuilt[c] = 1;
    }
    return set;
  }

  /**
   * log Z_B for band pattern `mask`: per-curve selection integrals (Selection.accumulateCurves) summed
   * with the weights of nested q levels, from 64 intervals (checked against 32) towards the finest,
   * stopping at the first level that agrees with the next coarser one within Z_Q_TOLERANCE. The selection
   * integrand is smooth in q (a curve's selected weight changes with q only through where it crosses the
   * window's edges, on the scale of the typical errors there); in the benchmark's setting 64 and 128
   * intervals agree to 1.4e-7, 32 and 64 to 3.4e-4. Coarser starts are not used: two coarse levels can agree
   * by chance while both are off (seen for single stars' binary integrals, logIntegral). See Z_Q_TOLERANCE.
   */
  normalisation(selection: Selection, mask: number, sigmaExtra: number): number {
    const grid = this.grid;
    const z = this.zCurve;
    z.fill(-Infinity);
    const top = grid.nLevels - 1;
    const lvl64 = Math.max(0, top - 3);
    for (let c = top; c > lvl64; c--) selection.accumulateCurves(this.classSet(c), mask, sigmaExtra, z);
    let prev = curveLevelSum(z, grid.lnWeight[lvl64 + 1]);
    for (let l = lvl64; l >= 0; l--) {
      selection.accumulateCurves(this.classSet(l), mask, sigmaExtra, z);
      const cur = curveLevelSum(z, grid.lnWeight[l]);
      if (cur === -Infinity && prev === -Infinity) return -Infinity;
      if (Math.abs(Math.expm1(prev - cur)) <= Z_Q_TOLERANCE) return cur;
      prev = cur;
    }
    return prev;
  }

  /**
   * log of the binary integral for a star with magnitudes m and inverse variances iv (0 for a missing band),
   * without the Gaussian's constant:
   * sum over the q nodes j of level l (the star's level from the qStepSigma rule) of w_l(j) I_j, where I_j
   * is the closed-form integral along curve j. The level's curves are those of classes l and coarser
   * (qGrid.classOf), each with its own index; pruning is as in CmdLikelihood.logComponent, with the level-free weight
   * bound qGrid.lnPrune and the running largest bound over the classes gathered so far.
   *
   * Tried and left out: stopping at the first level that agrees with the next coarser one (nested levels as
   * in adaptive quadrature). At 1e-4 relative it saved 12% of the segment integrals but moved log L_i by up
   * to 2.5e-4 against the fixed level (coarse levels can agree by chance, e.g. 16 and 8 intervals to 3e-5
   * while both are 7% off for a faint red star whose q integrand falls from q = qMin over a tenth of the
   * range); at 1e-5 it saved 2%. A locally adaptive trapezoid (panels halved where |T_h - T_2h| / 3 exceeds
   * their share) integrated as many curves as the fixed level.
   */
  logIntegral(m: Float64Array, iv: Float64Array, l: number, rb: number, negligible: number): number {
    this.sm = m;
    this.siv = iv;
    const grid = this.grid;
    this.nItems = 0;
    this.itemMax = -Infinity;
    this.binMaxUb = -Infinity;
    // The weights of level l are at most lnPrune + l ln 2 (qGrid.ts).
    const neg = negligible - l * Math.LN2;
    for (let c = grid.nLevels - 1; c >= l; c--) this.gatherClass(c, rb, neg);
    return itemLevelSum(this.itemVal, this.itemCurve, this.nItems, this.itemMax, grid.lnWeight[l]);
  }

  /**
   * Integrate, for the current star, the segments of q class c that can matter (see CmdLikelihood.logComponent for the
   * pruning and the widening of the query), appending each integral (without q weight) and its curve to the
   * star's items. Reads the segments from the index's records (sequential memory), not from the set.
   */
  private gatherClass(c: number, rb: number, negligible: number): void {
    const set = this.classSet(c);
    if (set.n === 0) return;
    this.ensureCandidates(set.n);
    if (this.itemVal.length < this.nItems + set.n) {
      const cap = Math.max(this.nItems + set.n, 2 * this.itemVal.length);
      const v = new Float64Array(cap);
      v.set(this.itemVal.subarray(0, this.nItems));
      const k = new Int32Array(cap);
      k.set(this.itemCurve.subarray(0, this.nItems));
      this.itemVal = v;
      this.itemCurve = k;
    }
    if (!this.prune) {
      this.gatherAll(set);
      return;
    }
    const nb = this.nBands;
    const m = this.sm;
    const iv = this.siv;
    const lnP = this.grid.lnPrune;
    const bound = this.classBound[c];
    const cut = this.pruneLogRatio;
    let ivMin = Infinity;
    let allBands = true;
    for (let b = 0; b < nb; b++) {
      if (iv[b] > 0) ivMin = Math.min(ivMin, iv[b]);
      else allBands = false;
    }
    const G = allBands ? Math.min(bound[0], bound[1] + 0.5 * Math.log((2 * Math.PI) / ivMin)) : bound[0];
    const lnCount = Math.log(set.n + 1);
    const index = this.indexFor(c, rb);
    const rec = index.rec;
    const stride = index.stride;
    const oS = 2 * nb;
    const oD = 3 * nb;
    const oW = 4 * nb;
    let R2 = 2 * cut + 9;
    let kept = 0;
    let maxUb = this.binMaxUb;
    for (;;) {
      // The index does the box test, on boxes stored in its own (sequential) order.
      const nCand = index.queryBox(m, iv, R2, this.cand);
      kept = 0;
      maxUb = this.binMaxUb;
      for (let k = 0; k < nCand; k++) {
        const o = this.cand[k] * stride;
        let A = 0;
        let B = 0;
        let C = 0;
        for (let b = 0; b < nb; b++) {
          const w = iv[b];
          const e = rec[o + oD + b];
          const r = m[b] - rec[o + oS + b];
          A += w * e * e;
          B += w * e * r;
          C += w * r * r;
        }
        const ub = rec[o + oW + 3] + lnP[rec[o + oW + 4]] - 0.5 * segmentMinQ(A, B, C) + (A > 2 * Math.PI ? 0.5 * Math.log((2 * Math.PI) / A) : 0);
        this.cA[kept] = A;
        this.cB[kept] = B;
        this.cC[kept] = C;
        this.cUb[kept] = ub;
        this.cSeg[kept] = o;
        kept++;
        if (ub > maxUb) maxUb = ub;
      }
      if (kept === 0) {
        // Every segment of the class lies beyond Mahalanobis distance sqrt(R2): its sum is below this bound,
        // and when it is also below the cut no segment of the class could be kept.
        if (G + lnCount - 0.5 * R2 < negligible || G - 0.5 * R2 < this.binMaxUb - cut) return;
        R2 *= 4;
        if (R2 > 1e7) {
          this.gatherAll(set);
          return;
        }
        continue;
      }
      if (G - 0.5 * R2 < maxUb - cut) break;
      R2 = 2 * (G - maxUb + cut) + 1;
    }
    this.binMaxUb = maxUb;
    const floor = maxUb - cut;
    let n = this.nItems;
    let mx = this.itemMax;
    for (let k = 0; k < kept; k++) {
      if (this.cUb[k] < floor) continue;
      const o = this.cSeg[k];
      const l = logSegmentIntegral(this.cA[k], this.cB[k], this.cC[k], rec[o + oW], rec[o + oW + 1], rec[o + oW + 2]);
      if (l === -Infinity) continue;
      const j = rec[o + oW + 4];
      this.itemVal[n] = l;
      this.itemCurve[n] = j;
      n++;
      if (l + lnP[j] > mx) mx = l + lnP[j];
    }
    this.nItems = n;
    this.itemMax = mx;
  }

  /** Every segment of `set`, integrated for the current star (no pruning: checks and benchmarks). */
  private gatherAll(set: SegmentSet): void {
    const nb = this.nBands;
    const m = this.sm;
    const iv = this.siv;
    const lnP = this.grid.lnPrune;
    let n = this.nItems;
    let mx = this.itemMax;
    for (let s = 0; s < set.n; s++) {
      let A = 0;
      let B = 0;
      let C = 0;
      for (let b = 0; b < nb; b++) {
        const w = iv[b];
        const e = set.delta[b][s];
        const r = m[b] - set.start[b][s];
        A += w * e * e;
        B += w * e * r;
        C += w * r * r;
      }
      const l = logSegmentIntegral(A, B, C, set.c0[s], set.c1[s], set.c2[s]);
      if (l === -Infinity) continue;
      const j = set.curve[s];
      this.itemVal[n] = l;
      this.itemCurve[n] = j;
      n++;
      if (l + lnP[j] > mx) mx = l + lnP[j];
    }
    this.nItems = n;
    this.itemMax = mx;
  }
}


/**
 * Z_B enters every star's log L alike, so its error adds up over a catalogue: 1e-6 relative costs at most
 * 0.01 in log L at 10^4 stars. With the error falling by a factor >= 16 per halving (Gregory's rule, O(h^4)),
 * the accepted level errs by under 1e-6 / 15.
 */
const Z_Q_TOLERANCE = 1e-6;
/** log sum_j exp(v[j] + lnW[j]) over the curves with a finite weight. */
function curveLevelSum(v: Float64Array, lnW: Float64Array): number {
  let mx = -Infinity;
  for (let j = 0; j < v.length; j++) if (lnW[j] > -Infinity && v[j] + lnW[j] > mx) mx = v[j] + lnW[j];
  if (mx === -Infinity) return -Infinity;
  let s = 0;
  for (let j = 0; j < v.length; j++) if (lnW[j] > -Infinity) s += Math.exp(v[j] + lnW[j] - mx);
  return mx + Math.log(s);
}

/** log sum over items of exp(val + lnW[curve]), items whose curve has weight at the level; `ref` >= every val + lnW - small. */
function itemLevelSum(val: Float64Array, curve: Int32Array, n: number, ref: number, lnW: Float64Array): number {
  if (ref === -Infinity) return -Infinity;
  let s = 0;
  for (let k = 0; k < n; k++) {
    const w = lnW[curve[k]];
    if (w > -Infinity) s += Math.exp(val[k] + w - ref);
  }
  return s > 0 ? ref + Math.log(s) : -Infinity;
}

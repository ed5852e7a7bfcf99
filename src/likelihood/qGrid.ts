/**
 * The quadrature over the binary mass ratio q.
 *
 * For a star, the binary integral is int g(q) I(q) dq, where I(q) is the closed-form integral along the
 * binary sequence of fixed q (binaryCurves.ts). As q varies, that sequence sweeps from the single-star
 * sequence (small q) to 2.5 log10 2 = 0.753 mag above it (q = 1), fastest near q = 1. A star's I(q) is
 * therefore a narrow bump in q, of width about sigma / (d offset / dq).
 *
 * Two changes of variable make the integrand smooth and resolved with few nodes:
 * 1. u in [0, 1] with du/dq proportional to o'(q) + c, where o(q) = 2.5 log10(1 + q^a) is the offset of a
 *    binary whose components have flux ∝ M^a (a = 4; main-sequence stars have a of about 4-6 in optical
 *    bands) and c = 0.5 mag keeps nodes at small q: equal steps in u are roughly equal steps in offset.
 * 2. u = psi(s) = s + sin(pi s)/pi, which has psi'(1) = psi''(1) = 0: nodes cluster towards q = 1, where a
 *    star near the equal-mass sequence makes the integrand a Gaussian cut off by the end of the range, the
 *    worst case for any fixed rule. After the change the integrand and its first derivative vanish there.
 * The integral becomes int_0^1 g(q) q'(u) psi'(s) I(q) ds on nodes equally spaced in s, done with the
 * trapezoid rule with Gregory's end corrections through third differences (end weights 3/8, 7/6, 23/24;
 * exact for cubics). Tested on model integrands (a constant, a plateau, interior bumps, bumps cut at q = 1,
 * offsets widths 0.012-0.05 mag): with 64 intervals the relative error is below 3e-4, with 128 below 3e-5.
 *
 * Nested levels: level l uses every 2^l-th node, from the finest (level 0, n0 intervals) down to 8 intervals.
 * Each star uses the coarsest level (of at least 64 intervals) whose step in magnitude offset is small
 * against its own errors; Z_B refines through the levels until two neighbours agree (cmdLikelihood.ts).
 * The curves that a level adds to the next coarser one (its "class", see classOf) are built only when
 * some star or Z_B asks for them.
 */
import { logMassRatioDensity, type MassRatioDistribution } from './massRatio.js';

const A_EXP = 4;
const C_LIN = 0.5;
/** Intervals of the finest level when there is one level of resolution (the constructor's `fineLevels`). */
export const COARSEST_INTERVALS = 64;
/** Intervals of the coarsest nested level (only compared against, never accepted: Gregory's rule needs n >= 6). */
export const COARSEST_NESTED_INTERVALS = 8;
const K25 = 2.5 / Math.LN10;

function offset(q: number): number {
  return K25 * Math.log1p(Math.pow(q, A_EXP));
}
function offsetSlope(q: number): number {
  const qa = Math.pow(q, A_EXP);
  return (K25 * A_EXP * (qa / q)) / (1 + qa);
}

export class QGrid {
  /** Intervals at the finest level (a power of two times COARSEST_INTERVALS). */
  readonly n0: number;
  /** Number of nested levels, from n0 intervals (level 0) down to COARSEST_NESTED_INTERVALS (level nLevels - 1). */
  readonly nLevels: number;
  /** q at node j of the finest level, j = 0..n0. */
  readonly q: Float64Array;
  /** ln q. */
  readonly lnQ: Float64Array;
  /** Largest step in the offset o(q) between neighbouring nodes at each level, mag. */
  readonly maxStepMag: Float64Array;
  /** lnWeight[l][j]: log quadrature weight of node j at level l (-Infinity where j is not a level-l node). */
  readonly lnWeight: Float64Array[];
  /**
   * A level-free bound on node j's weight, for pruning: ln(7/6 / n0) + ln Jacobian. The weight of node j at
   * level l is at most lnPrune[j] + l ln 2 (the largest Gregory weight is 7/6 and the step is 2^l / n0).
   */
  readonly lnPrune: Float64Array;

  /** `fineLevels` sets the finest resolution: n0 = COARSEST_INTERVALS * 2^(fineLevels - 1). */
  constructor(dist: MassRatioDistribution, fineLevels: number) {
    this.n0 = COARSEST_INTERVALS * (1 << (fineLevels - 1));
    this.nLevels = Math.round(Math.log2(this.n0 / COARSEST_NESTED_INTERVALS)) + 1;
    const nLevels = this.nLevels;
    const qMin = dist.qMin;
    const s0 = offset(qMin);
    const span = offset(1) - s0 + C_LIN * (1 - qMin);
    const n0 = this.n0;
    this.q = new Float64Array(n0 + 1);
    this.lnQ = new Float64Array(n0 + 1);
    const lnJac = new Float64Array(n0 + 1);
    for (let j = 0; j <= n0; j++) {
      const sj = j / n0;
      const u = sj + Math.sin(Math.PI * sj) / Math.PI;
      const target = Math.min(1, u) * span;
      // s(q) * span = o(q) - o(qMin) + c (q - qMin) is increasing: bisection.
      let lo = qMin;
      let hi = 1;
      for (let it = 0; it < 60; it++) {
        const mid = 0.5 * (lo + hi);
        if (offset(mid) - s0 + C_LIN * (mid - qMin) < target) lo = mid;
        else hi = mid;
      }
      const q = j === 0 ? qMin : j === n0 ? 1 : 0.5 * (lo + hi);
      this.q[j] = q;
      this.lnQ[j] = Math.log(q);
      // dq/ds = psi'(s) span / (o'(q) + c); the weight g(q) dq/ds (zero at q = 1).
      const dPsi = 1 + Math.cos(Math.PI * sj);
      lnJac[j] = logMassRatioDensity(dist, q) + Math.log((dPsi * span) / (offsetSlope(q) + C_LIN));
    }
    this.lnWeight = [];
    this.maxStepMag = new Float64Array(nLevels);
    for (let l = 0; l < nLevels; l++) {
      const step = 1 << l;
      let mx = 0;
      for (let j = 0; j + step <= n0; j += step) mx = Math.max(mx, offset(this.q[j + step]) - offset(this.q[j]));
      this.maxStepMag[l] = mx;
    }
    for (let l = 0; l < nLevels; l++) {
      const step = 1 << l;
      const n = n0 / step;
      const h = 1 / n;
      const w = new Float64Array(n0 + 1).fill(-Infinity);
      for (let i = 0; i <= n; i++) {
        w[i * step] = Math.log(h * gregoryWeight(i, n)) + lnJac[i * step];
      }
      this.lnWeight.push(w);
    }
    this.lnPrune = new Float64Array(n0 + 1);
    for (let j = 0; j <= n0; j++) this.lnPrune[j] = Math.log(7 / 6 / n0) + lnJac[j];
  }

  /**
   * The class of node j: the finest level l whose nodes include j and those of no coarser level, i.e. the
   * curves that refining from level l + 1 to level l adds. The coarsest level's nodes are all its class.
   */
  classOf(j: number): number {
    let c = 0;
    while (c < this.nLevels - 1 && j % (2 << c) === 0) c++;
    return c;
  }

  /** First node and stride of class c (see classOf). */
  classNodes(c: number): { first: number; stride: number } {
    return c === this.nLevels - 1 ? { first: 0, stride: 1 << c } : { first: 1 << c, stride: 2 << c };
  }
}

/** Trapezoid weights with Gregory end corrections through third differences (n >= 6). */
export function gregoryWeight(i: number, n: number): number {
  const e = Math.min(i, n - i);
  if (e === 0) return 3 / 8;
  if (e === 1) return 7 / 6;
  if (e === 2) return 23 / 24;
  return 1;
}

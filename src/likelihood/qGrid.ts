/**
 * The quadrature over the binary mass ratio q.
 *
 * For a star, the binary integral is int g(q) I(q) dq, where I(q) is the closed-form integral along the
 * binary sequence of fixed q (binaryCurves.ts). As q varies, that sequence sweeps from the single-star
 * sequence (small q) to 2.5 log10 2 = 0.753 mag above it (q = 1), fastest near q = 1. A star's I(q) is
 * therefore a narrow bump in q, of width about sigma / (d offset / dq).
 *
 * We change variable to s in [0, 1] with ds/dq proportional to o'(q) + c, where o(q) = 2.5 log10(1 + q^a)
 * is the offset of a binary whose components have flux ∝ M^a (a = 5 here; main-sequence stars have a of
 * about 4-6 in optical bands) and c = 0.3 mag keeps nodes at small q (which keeps q'(s) smooth enough that the
 * weights integrate a constant to 1.4e-4 with 32 intervals and 1.2e-5 with 64), so that equal steps in s are roughly
 * equal steps in magnitude offset. The integral becomes int_0^1 g(q(s)) q'(s) I(q(s)) ds, whose integrand
 * is smooth, and is done with the trapezoid rule with Gregory's end corrections through third differences
 * (end weights 3/8, 7/6, 23/24; exact for cubics). In the interior the trapezoid rule converges faster than
 * any power of the step for smooth bumps; the end corrections make the q = qMin and q = 1 ends O(h^4).
 *
 * Nested levels: level l uses every 2^l-th node, so each star can use the coarsest level whose step in
 * magnitude offset is small against its own errors, without building more curves.
 */
import { logMassRatioDensity, type MassRatioDistribution } from './massRatio.js';

const A_EXP = 5;
const C_LIN = 0.3;
const K25 = 2.5 / Math.LN10;

function offset(q: number): number {
  return K25 * Math.log1p(Math.pow(q, A_EXP));
}
function offsetSlope(q: number): number {
  const qa = Math.pow(q, A_EXP);
  return (K25 * A_EXP * (qa / q)) / (1 + qa);
}

export class QGrid {
  /** Intervals at the finest level (a power of two times 32, the coarsest level). */
  readonly n0: number;
  readonly nLevels: number;
  /** q at node j of the finest level, j = 0..n0. */
  readonly q: Float64Array;
  /** ln q. */
  readonly lnQ: Float64Array;
  /** Total span of the magnitude-like variable, in mag; the offset step at level l is at most about span / n_l. */
  readonly spanMag: number;
  /** lnWeight[l][j]: log quadrature weight of node j at level l (-Infinity where j is not a level-l node). */
  readonly lnWeight: Float64Array[];

  constructor(dist: MassRatioDistribution, nLevels: number) {
    this.nLevels = nLevels;
    this.n0 = 32 * (1 << (nLevels - 1));
    const qMin = dist.qMin;
    const s0 = offset(qMin);
    const span = offset(1) - s0 + C_LIN * (1 - qMin);
    this.spanMag = span;
    const n0 = this.n0;
    this.q = new Float64Array(n0 + 1);
    this.lnQ = new Float64Array(n0 + 1);
    const lnJac = new Float64Array(n0 + 1);
    for (let j = 0; j <= n0; j++) {
      const target = (j / n0) * span;
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
      // q'(s) = span / (o'(q) + c); the weight g(q) q'(s).
      lnJac[j] = logMassRatioDensity(dist, q) + Math.log(span / (offsetSlope(q) + C_LIN));
    }
    this.lnWeight = [];
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

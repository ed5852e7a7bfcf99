/**
 * A brute-force reference for the likelihood, for tests and benchmarks only: slow and plain.
 *
 * It integrates the same model as CmdLikelihood (the model polyline of polyline.ts, flux-summed binaries,
 * the same selection window and field), but by dense quadrature instead of closed forms and pruning:
 * - along each polyline segment, 8-point Gauss-Legendre on sub-intervals no longer than the star's
 *   smallest sigma in any band (0.005 mag for Z); the IMF weight is evaluated directly as dN/dM * dM/dt from imf.ts's
 *   densities (not from the fitted coefficients), with ln M linear in t as the model defines;
 * - over q, 8-point Gauss-Legendre on 48 panels (0.018 mag each) equally spaced in the offset-like variable of qGrid.ts
 *   (a change of variables with its Jacobian), evaluating the flux sum of primary and secondary at every
 *   node, the secondary's magnitude interpolated on the polyline (or its faint continuation);
 * - Z by the same grids, with the per-band selection probabilities of selection.ts.
 * Far from the sequence (more than 4 sigma from every node) the sub-intervals shrink in proportion to the
 * distance, since the integrand then falls off on a scale sigma^2 / distance. The only shortcut: for one star, a primary segment's binaries are skipped when the bounding box of all
 * binaries it can make lies more than 12 sigma (Mahalanobis, squared distance 150) further than the nearest
 * such box; their contribution is below e^-75 of the nearest ones for any IMF weight ratio below e^35.
 */
import { logAddExp } from '../core/sum.js';
import type { CmdLikelihood } from './cmdLikelihood.js';
import { logImfDensity } from './imf.js';
import { logMassRatioDensity } from './massRatio.js';
import { parallaxMasFromDm, thetaObject, type ClusterParameters } from './theta.js';

const GL8_X = [-0.9602898564975363, -0.7966664774136267, -0.525532409916329, -0.1834346424956498, 0.1834346424956498, 0.525532409916329, 0.7966664774136267, 0.9602898564975363];
const GL8_W = [0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.362683783378362, 0.362683783378362, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763];
const LN_2PI = Math.log(2 * Math.PI);
const MAG_K = 2.5 / Math.LN10;
const FLUX_K = 0.4 * Math.LN10;

/** Nodes and log weights of the reference q quadrature. */
function qNodes(lik: CmdLikelihood): { q: Float64Array; lnW: Float64Array } {
  const { qMin, qGamma } = lik.options;
  const a = 5;
  const c = 0.1;
  const o = (q: number) => MAG_K * Math.log1p(Math.pow(q, a)) + c * q;
  const oSlope = (q: number) => (MAG_K * a * Math.pow(q, a - 1)) / (1 + Math.pow(q, a)) + c;
  const inv = (y: number) => {
    let lo = qMin;
    let hi = 1;
    for (let i = 0; i < 70; i++) {
      const mid = 0.5 * (lo + hi);
      if (o(mid) < y) lo = mid;
      else hi = mid;
    }
    return 0.5 * (lo + hi);
  };
  const panels = 48;
  const y0 = o(qMin);
  const y1 = o(1);
  const q = new Float64Array(panels * 8);
  const lnW = new Float64Array(panels * 8);
  for (let p = 0; p < panels; p++) {
    for (let g = 0; g < 8; g++) {
      const y = y0 + ((p + 0.5 + 0.5 * GL8_X[g]) * (y1 - y0)) / panels;
      const qq = inv(y);
      q[p * 8 + g] = qq;
      lnW[p * 8 + g] = Math.log((0.5 * GL8_W[g] * (y1 - y0)) / panels / oSlope(qq)) + logMassRatioDensity({ qMin, gamma: qGamma }, qq);
    }
  }
  return { q, lnW };
}

/** Per-star log L_i by brute force (for the listed stars, default all) and the log Z values used. */
export function referenceLogLikelihoods(lik: CmdLikelihood, theta: ArrayLike<number> | ClusterParameters, stars?: number[]): { logL: Float64Array; lnZs: number[]; lnZb: number[] } {
  const p: ClusterParameters = (theta as ClusterParameters).logAgeYr !== undefined ? (theta as ClusterParameters) : thetaObject(theta as ArrayLike<number>);
  const idx = stars ?? Array.from({ length: lik.nStars }, (_, i) => i);
  const out = new Float64Array(idx.length);
  if (!lik.prepare(p, false)) {
    out.fill(-Infinity);
    return { logL: out, lnZs: [], lnZb: [] };
  }
  const poly = lik.poly;
  const nb = lik.bands.length;
  const K = poly.n;
  const f = p.fBinary;
  const sx2 = p.sigmaExtra * p.sigmaExtra;
  const { q: qs, lnW: qLnW } = qNodes(lik);
  const imf = lik.imf;

  // Magnitude of the polyline (or its faint continuation) at log mass x.
  const magAt = (b: number, x: number): number => {
    if (x < poly.lnMass[0]) return poly.mag[b][0] + poly.faintSlope[b] * (x - poly.lnMass[0]);
    let k = 0;
    let hiK = K - 2;
    while (k < hiK) {
      const mid = (k + hiK + 1) >> 1;
      if (poly.lnMass[mid] <= x) k = mid;
      else hiK = mid - 1;
    }
    const t = (x - poly.lnMass[k]) / (poly.lnMass[k + 1] - poly.lnMass[k]);
    return poly.mag[b][k] + t * (poly.mag[b][k + 1] - poly.mag[b][k]);
  };
  // Dense points along the polyline: log mass, log weight (dN/dM dM/dt dt), magnitudes, segment.
  const cache = new Map<number, ReturnType<typeof buildPointsRaw>>();
  const buildPoints = (stepMag: number) => {
    // Steps rounded down to powers of 2^(1/4), so that stars share grids.
    const key = Math.floor(4 * Math.log2(stepMag));
    let g = cache.get(key);
    if (!g) {
      g = buildPointsRaw(Math.pow(2, key / 4));
      cache.set(key, g);
    }
    return g;
  };
  function buildPointsRaw(stepMag: number) {
    const lnM: number[] = [];
    const lnW: number[] = [];
    const seg: number[] = [];
    for (let k = 0; k + 1 < K; k++) {
      let len = 0;
      for (let b = 0; b < nb; b++) len = Math.max(len, Math.abs(poly.mag[b][k + 1] - poly.mag[b][k]));
      const nSub = Math.min(20000, Math.max(1, Math.ceil(len / stepMag)));
      const L = poly.lnMass[k + 1] - poly.lnMass[k];
      for (let s = 0; s < nSub; s++) {
        for (let g = 0; g < 8; g++) {
          const t = (s + 0.5 + 0.5 * GL8_X[g]) / nSub;
          const x = poly.lnMass[k] + L * t;
          lnM.push(x);
          lnW.push(logImfDensity(imf, Math.exp(x)) + x + Math.log(L) + Math.log((0.5 * GL8_W[g]) / nSub));
          seg.push(k);
        }
      }
    }
    const mags = Array.from({ length: nb }, (_, b) => Float64Array.from(lnM, (x, i) => {
      const k = seg[i];
      const t = (x - poly.lnMass[k]) / (poly.lnMass[k + 1] - poly.lnMass[k]);
      return poly.mag[b][k] + t * (poly.mag[b][k + 1] - poly.mag[b][k]);
    }));
    return { lnM: Float64Array.from(lnM), lnW: Float64Array.from(lnW), seg: Int32Array.from(seg), mags };
  }
  const binaryMag = (b: number, m1: number, x2: number): number => {
    const d = magAt(b, x2) - m1;
    return m1 - MAG_K * Math.log1p(Math.exp(-FLUX_K * d));
  };

  // Selection normalisations per pattern, on a fine grid (0.005 mag) with exact per-band probabilities.
  const sel = lik.selection;
  const zPts = buildPoints(0.005);
  const lnPsel = (mask: number, mags: ArrayLike<number>[] | Float64Array, i: number, single: boolean, m: Float64Array): number => {
    let l = 0;
    for (let b = 0; b < nb; b++) {
      if (!sel.limited[b] || !(mask & (1 << b))) continue;
      const mu = single ? (mags as Float64Array[])[b][i] : m[b];
      l += Math.log(sel.bandProbability(b, mu, p.sigmaExtra));
    }
    return l;
  };
  // Running minimum of each band over the polyline nodes up to k (the brightest a secondary can be).
  const prefixMin = Array.from({ length: nb }, (_, b) => {
    const a = new Float64Array(K);
    let mn = Infinity;
    for (let k = 0; k < K; k++) a[k] = mn = Math.min(mn, poly.mag[b][k]);
    return a;
  });
  const boxVersusWindow = (i: number, g: { seg: Int32Array; mags: Float64Array[] }, mask: number): number => {
    let inside = true;
    for (let b = 0; b < nb; b++) {
      if (!sel.limited[b] || !(mask & (1 << b))) continue;
      const m1 = g.mags[b][i];
      const lo = Math.min(m1, prefixMin[b][g.seg[i] + 1]) - 0.7527;
      const sHi = Math.sqrt(Math.max(...Array.from(sel.errors[b].sigma)) ** 2 + sx2);
      if (lo > sel.faint[b] + 12 * sHi || m1 < sel.bright[b] - 12 * sHi) return 0;
      const full = sel.completeness && sel.completeness.band === b ? -Infinity : sel.faint[b];
      if (!(lo > sel.bright[b] + 12 * sHi && m1 < full - 12 * sHi)) inside = false;
    }
    return inside ? 1 : 2;
  };
  const lnZs: number[] = [];
  const lnZb: number[] = [];
  const mb = new Float64Array(nb);
  for (const mask of lik.patterns) {
    let zs = -Infinity;
    let zb = -Infinity;
    for (let i = 0; i < zPts.lnM.length; i++) zs = logAddExp(zs, zPts.lnW[i] + lnPsel(mask, zPts.mags, i, true, mb));
    if (f > 0) {
      // Binaries: a 0.02 mag primary grid (8-point rule on each step) is ample for P, which varies on the
      // scale of the typical errors at the limits.
      const coarse = buildPoints(0.02);
      let qTotal = -Infinity;
      for (let j = 0; j < qs.length; j++) qTotal = logAddExp(qTotal, qLnW[j]);
      for (let i = 0; i < coarse.lnM.length; i++) {
        // Every binary of this primary lies between (brightest of primary and lower masses) - 0.753 and the
        // primary: when that box is 12 sigma inside every limit (or outside one), P is 1 (or 0) to 1e-30.
        const where = boxVersusWindow(i, coarse, mask);
        if (where === 0) continue;
        if (where === 1) {
          zb = logAddExp(zb, coarse.lnW[i] + qTotal);
          continue;
        }
        for (let j = 0; j < qs.length; j++) {
          const x2 = coarse.lnM[i] + Math.log(qs[j]);
          for (let b = 0; b < nb; b++) mb[b] = binaryMag(b, coarse.mags[b][i], x2);
          zb = logAddExp(zb, coarse.lnW[i] + qLnW[j] + lnPsel(mask, coarse.mags, i, false, mb));
        }
      }
    }
    lnZs.push(zs);
    lnZb.push(zb);
  }

  const intrinsic = lik.options.binaryFractionOf === 'all';
  const plxC = lik.useParallax ? parallaxMasFromDm(p.dm) + lik.options.parallax.zeroPointMas : 0;
  const iv = new Float64Array(nb);
  const m = new Float64Array(nb);
  for (let r = 0; r < idx.length; r++) {
    const i = idx[r];
    const mask = lik.mask[i];
    const pat = lik.patternOf[i];
    let lnNorm = 0;
    let sMin = Infinity;
    for (let b = 0; b < nb; b++) {
      if (mask & (1 << b)) {
        const e = lik.data.err[b][i];
        const v = e * e + sx2;
        iv[b] = 1 / v;
        m[b] = lik.data.mag[b][i];
        lnNorm -= 0.5 * (LN_2PI + Math.log(v));
        sMin = Math.min(sMin, Math.sqrt(v));
      } else {
        iv[b] = 0;
        m[b] = 0;
      }
    }
    // Far from the sequence the integrand falls off from its nearest point on a scale sigma^2 / distance,
    // not sigma: refine by the distance (in sigma) to the nearest polyline node.
    let dMin = Infinity;
    for (let k = 0; k < K; k++) {
      let q = 0;
      for (let b = 0; b < nb; b++) if (iv[b] > 0) q += iv[b] * (m[b] - poly.mag[b][k]) ** 2;
      dMin = Math.min(dMin, Math.sqrt(q));
    }
    const pts = buildPoints(sMin / Math.max(1, dMin / 4));
    const chi2 = (mu: (b: number) => number) => {
      let q = 0;
      for (let b = 0; b < nb; b++) if (iv[b] > 0) q += iv[b] * (m[b] - mu(b)) ** 2;
      return q;
    };
    let lnS = -Infinity;
    for (let k = 0; k < pts.lnM.length; k++) lnS = logAddExp(lnS, pts.lnW[k] - 0.5 * chi2((b) => pts.mags[b][k]));
    lnS += lnNorm;
    let lnB = -Infinity;
    if (f > 0) {
      // Bounding boxes of each primary segment's binaries: magnitudes between min(primary, any
      // lower-mass star) - 0.753 and the primary itself.
      const boxD2 = new Float64Array(K - 1);
      let minBox = Infinity;
      for (let k = 0; k + 1 < K; k++) {
        let d2 = 0;
        for (let b = 0; b < nb; b++) {
          if (!(iv[b] > 0)) continue;
          const pre = prefixMin[b][k + 1];
          const lo = Math.min(pre, poly.mag[b][k], poly.mag[b][k + 1]) - 0.7527;
          const hi = Math.max(poly.mag[b][k], poly.mag[b][k + 1]);
          const dd = m[b] < lo ? lo - m[b] : m[b] > hi ? m[b] - hi : 0;
          d2 += iv[b] * dd * dd;
        }
        boxD2[k] = d2;
        minBox = Math.min(minBox, d2);
      }
      const mu = new Float64Array(nb);
      for (let k = 0; k < pts.lnM.length; k++) {
        if (boxD2[pts.seg[k]] > minBox + 150) continue;
        for (let j = 0; j < qs.length; j++) {
          const x2 = pts.lnM[k] + Math.log(qs[j]);
          for (let b = 0; b < nb; b++) mu[b] = iv[b] > 0 ? binaryMag(b, pts.mags[b][k], x2) : 0;
          lnB = logAddExp(lnB, pts.lnW[k] + qLnW[j] - 0.5 * chi2((b) => mu[b]));
        }
      }
      lnB += lnNorm;
    }
    let a: number;
    let c: number;
    if (intrinsic) {
      const lnZc = logAddExp(f < 1 ? Math.log1p(-f) + lnZs[pat] : -Infinity, f > 0 ? Math.log(f) + lnZb[pat] : -Infinity);
      a = f < 1 ? Math.log1p(-f) + lnS - lnZc : -Infinity;
      c = f > 0 ? Math.log(f) + lnB - lnZc : -Infinity;
    } else {
      a = f < 1 ? Math.log1p(-f) + lnS - lnZs[pat] : -Infinity;
      c = f > 0 ? Math.log(f) + lnB - lnZb[pat] : -Infinity;
    }
    if (lik.useParallax && lik.data.parallaxMas && lik.data.parallaxErrorMas && Number.isFinite(lik.data.parallaxMas[i]) && lik.data.parallaxErrorMas[i] > 0) {
      const pe = lik.data.parallaxErrorMas[i];
      const d = lik.data.parallaxMas[i] - plxC;
      const lp = -0.5 * (LN_2PI + 2 * Math.log(pe) + (d * d) / (pe * pe));
      a += lp;
      c += lp;
    }
    const pi = lik.data.membership ? lik.data.membership[i] : 1 - p.fField;
    const cl = pi > 0 ? Math.log(pi) + logAddExp(a, c) : -Infinity;
    const fl = pi < 1 ? Math.log1p(-pi) + lik.logField[i] + lik.logFieldPlx[i] : -Infinity;
    out[r] = lik.logCompleteness[i] + logAddExp(cl, fl);
  }
  return { logL: out, lnZs, lnZb };
}

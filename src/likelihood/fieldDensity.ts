/**
 * The field (and outlier) density at each catalogue star, normalised over the observed window in the
 * bands that star has. It does not depend on the cluster parameters, so it is computed once.
 *
 * The likelihood factors the completeness c(m) at the star's observed magnitude out of every component
 * (cmdLikelihood.ts), so the values here are the observed field density divided by c(m_i):
 *
 * - uniform: the field's true density is flat over the window; observed, it is c(m) / int_W c, so the
 *   value is 1 / (product of the window widths in the star's bands, with int c dm for the completeness band).
 * - kde: a comparison field observed with the same selection already carries c(m); its density estimate,
 *   a product of Gaussian kernels, is normalised over the window in closed form (per comparison star, a
 *   product of Phi differences) and divided by c(m_i). Bandwidth per band: Scott's rule
 *   h_b = sigma_b n^(-1/(d+4)) (Scott 1992, Multivariate Density Estimation, eq. 6.42), with the robust
 *   spread sigma_b = min(standard deviation, IQR / 1.349) (Silverman 1986, eq. 3.30), times a scale factor.
 *   The kernels are not widened by the star's own errors: the comparison stars carry errors of the same
 *   kind already.
 */
import { logNormalDiff } from './normalTail.js';
import { completenessIntegral, type CompletenessTable } from './selection.js';

const LOG_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

export interface FieldWindow {
  bright: Float64Array;
  faint: Float64Array;
  completeness?: CompletenessTable;
}

/** log of the uniform field density for a star with the bands in `mask`. */
export function logUniformField(w: FieldWindow, mask: number): number {
  let l = 0;
  for (let b = 0; b < w.bright.length; b++) {
    if (!(mask & (1 << b))) continue;
    const width = w.completeness && w.completeness.band === b ? completenessIntegral(w.completeness, w.bright[b], w.faint[b]) : w.faint[b] - w.bright[b];
    l -= Math.log(width);
  }
  return l;
}

export interface KdeField {
  bandwidth: Float64Array;
  nComparison: number;
  /** Per pattern mask: log of the window integral of the (unnormalised, mean-kernel) estimate. */
  logNorm: Map<number, number>;
  /** Comparison magnitudes sorted by band 0. */
  x: Float64Array[];
}

export function buildKde(comparisonMag: Float64Array[], w: FieldWindow, masks: number[], scale: number): KdeField {
  const nb = comparisonMag.length;
  const keep: number[] = [];
  for (let j = 0; j < comparisonMag[0].length; j++) {
    let ok = true;
    for (let b = 0; b < nb; b++) if (!Number.isFinite(comparisonMag[b][j])) ok = false;
    if (ok) keep.push(j);
  }
  keep.sort((a, b) => comparisonMag[0][a] - comparisonMag[0][b]);
  const n = keep.length;
  const x = comparisonMag.map((col) => Float64Array.from(keep, (j) => col[j]));
  const bandwidth = new Float64Array(nb);
  const factor = Math.pow(n, -1 / (nb + 4));
  for (let b = 0; b < nb; b++) {
    const v = Array.from(x[b]).sort((p, q) => p - q);
    const mean = v.reduce((s, y) => s + y, 0) / n;
    const sd = Math.sqrt(v.reduce((s, y) => s + (y - mean) ** 2, 0) / Math.max(1, n - 1));
    const iqr = v[Math.floor(0.75 * (n - 1))] - v[Math.floor(0.25 * (n - 1))];
    bandwidth[b] = scale * factor * Math.min(sd, iqr / 1.349);
  }
  const logNorm = new Map<number, number>();
  for (const mask of masks) {
    let acc = 0;
    let mx = -Infinity;
    for (let j = 0; j < n; j++) {
      let l = 0;
      for (let b = 0; b < nb; b++) {
        if (!(mask & (1 << b))) continue;
        const h = bandwidth[b];
        l += logNormalDiff((w.bright[b] - x[b][j]) / h, (w.faint[b] - x[b][j]) / h);
      }
      if (l > mx) {
        acc = acc * Math.exp(mx - l) + 1;
        mx = l;
      } else acc += Math.exp(l - mx);
    }
    logNorm.set(mask, mx + Math.log(acc));
  }
  return { bandwidth, nComparison: n, logNorm, x };
}

/** log of the KDE field density at magnitudes m (per band; only bands in `mask` are used). */
export function logKdeField(k: KdeField, m: ArrayLike<number>, mask: number): number {
  const nb = k.x.length;
  const n = k.nComparison;
  let lo = 0;
  let hi = n;
  if (mask & 1) {
    // Only comparison stars within 8 bandwidths in band 0 contribute more than e^-32 of a kernel peak.
    const x0 = k.x[0];
    const h0 = 8 * k.bandwidth[0];
    lo = lowerBound(x0, m[0] - h0);
    hi = lowerBound(x0, m[0] + h0);
  }
  let logConst = 0;
  for (let b = 0; b < nb; b++) if (mask & (1 << b)) logConst -= LOG_SQRT_2PI + Math.log(k.bandwidth[b]);
  let mx = -Infinity;
  let acc = 0;
  const sweep = (from: number, to: number) => {
    for (let j = from; j < to; j++) {
      let q = 0;
      for (let b = 0; b < nb; b++) {
        if (!(mask & (1 << b))) continue;
        const z = (m[b] - k.x[b][j]) / k.bandwidth[b];
        q -= 0.5 * z * z;
      }
      if (q > mx) {
        acc = acc * Math.exp(mx - q) + 1;
        mx = q;
      } else acc += Math.exp(q - mx);
    }
  };
  sweep(lo, hi);
  if (mx < -30) {
    // Far from every comparison star in band 0's window: take every star, in log space.
    mx = -Infinity;
    acc = 0;
    sweep(0, n);
  }
  return mx + Math.log(acc) + logConst - Math.log(n) - (k.logNorm.get(mask) as number) + Math.log(n);
}

function lowerBound(a: Float64Array, v: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The observed window and the selection normalisation.
 *
 * A star enters the catalogue when its observed magnitude in every limited band b lies in
 * [bright_b, faint_b], and then with probability c(m) given by an optional completeness table in one band
 * (linear interpolation, constant beyond the table's ends). For a model star of true magnitudes mu, observed
 * with the typical errors at that magnitude (sigma_typ,b(mu_b), combined with sigmaExtra in quadrature),
 * the probability of selection is a product over the limited bands:
 *
 *     P_b(mu_b) = Phi((faint - mu)/s) - Phi((bright - mu)/s)                        (no completeness)
 *     P_b(mu_b) = int_bright^faint c(m) N(m | mu, s^2) dm                            (completeness band)
 *
 * The second is exact for a piecewise-linear c: on a piece where c(m) = alpha + beta m,
 * int_u^v (alpha + beta m) N(m | mu, s^2) dm = (alpha + beta mu)[Phi(zv) - Phi(zu)] - beta s [phi(zv) - phi(zu)],
 * z = (m - mu)/s, phi the standard normal density.
 *
 * Z (for singles, or binaries) is the IMF-weighted integral of P along the model sequence. Segments
 * lying at least 8 sigma inside every limit (and where c = 1) contribute their whole weight; segments 8
 * sigma outside contribute nothing; on the rest, only the stretches within 8 sigma of a limit (or where the
 * completeness is below 1) are cut into pieces no longer than the local sigma in any band and integrated
 * with 4-point Gauss-Legendre; the stretches between are the IMF weight in closed form, or zero. The
 * Gauss-Legendre error on a piece of length h is h^9 (4!)^4 / (9 (8!)^3) max|f^(8)| = 5.6e-10 h^9 max|f^(8)|
 * (Abramowitz & Stegun 1964, 25.4.30). For a normal CDF of width sigma, max|f^(8)| = max_z |He_7(z) phi(z)|
 * / sigma^8 = 14.2 / sigma^8 (evaluated on a grid of step 1e-4), so the error is below 1e-8 of the piece for
 * h = sigma (the IMF weight varies on far longer scales), far below the 1e-6 to which Z_B is refined.
 * Z is computed per pattern of present bands:
 * a star missing a band was selected on the bands it has.
 */
import { logNormalDiff, normalCdf } from './normalTail.js';
import { logSegmentIntegral } from './segmentIntegral.js';
import type { SegmentSet } from './segmentSet.js';

/** Typical 1-sigma error against magnitude in one band: a piecewise-linear table, constant beyond its ends. */
export interface ErrorLaw {
  mag: Float64Array;
  sigma: Float64Array;
}

export function errorAt(law: ErrorLaw, m: number): number {
  const x = law.mag;
  const n = x.length;
  if (m <= x[0]) return law.sigma[0];
  if (m >= x[n - 1]) return law.sigma[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid] <= m) lo = mid;
    else hi = mid;
  }
  const t = (m - x[lo]) / (x[hi] - x[lo]);
  return law.sigma[lo] + t * (law.sigma[hi] - law.sigma[lo]);
}

export interface CompletenessTable {
  /** Index of the band, among the likelihood's bands. */
  band: number;
  mag: Float64Array;
  fraction: Float64Array;
}

export function completenessAt(c: CompletenessTable, m: number): number {
  const x = c.mag;
  const n = x.length;
  if (m <= x[0]) return c.fraction[0];
  if (m >= x[n - 1]) return c.fraction[n - 1];
  let k = 0;
  while (x[k + 1] < m) k++;
  const t = (m - x[k]) / (x[k + 1] - x[k]);
  return c.fraction[k] + t * (c.fraction[k + 1] - c.fraction[k]);
}

/** int_u^v c(m) dm, for the uniform field density. */
export function completenessIntegral(c: CompletenessTable, u: number, v: number): number {
  // Trapezoids are exact on a piecewise-linear function; break at the table's nodes.
  const pts = [u, ...Array.from(c.mag).filter((x) => x > u && x < v), v];
  let s = 0;
  for (let k = 0; k + 1 < pts.length; k++) s += 0.5 * (pts[k + 1] - pts[k]) * (completenessAt(c, pts[k]) + completenessAt(c, pts[k + 1]));
  return s;
}

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);
function stdPdf(z: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * z * z);
}

export class Selection {
  readonly nBands: number;
  /** Per band; +-Infinity where a band has no limit. */
  readonly bright: Float64Array;
  readonly faint: Float64Array;
  readonly limited: Uint8Array;
  readonly errors: ErrorLaw[];
  readonly completeness?: CompletenessTable;
  /** Magnitude below which the completeness is 1 everywhere (used to skip exact integration). */
  private readonly fullUntil: number;

  constructor(bright: Float64Array, faint: Float64Array, errors: ErrorLaw[], completeness?: CompletenessTable) {
    this.nBands = bright.length;
    this.bright = bright;
    this.faint = faint;
    this.errors = errors;
    this.completeness = completeness;
    this.limited = new Uint8Array(this.nBands);
    for (let b = 0; b < this.nBands; b++) this.limited[b] = Number.isFinite(bright[b]) || Number.isFinite(faint[b]) ? 1 : 0;
    if (completeness) this.limited[completeness.band] = 1;
    let full = -Infinity;
    if (completeness) {
      const f = completeness.fraction;
      if (f[0] >= 1) {
        full = Infinity;
        for (let k = 0; k < f.length; k++) {
          if (f[k] < 1) {
            full = completeness.mag[k - 1];
            break;
          }
        }
      }
    }
    this.fullUntil = full;
  }

  /** Probability that a star of true magnitude mu in band b is selected in that band. */
  bandProbability(b: number, mu: number, sigmaExtra: number): number {
    const se = errorAt(this.errors[b], mu);
    const s = Math.sqrt(se * se + sigmaExtra * sigmaExtra);
    const br = this.bright[b];
    const fa = this.faint[b];
    const c = this.completeness;
    if (!c || c.band !== b) {
      return Math.exp(logNormalDiff((br - mu) / s, (fa - mu) / s));
    }
    // Piecewise-linear completeness between the table's nodes, clipped to the window.
    let total = 0;
    let u = br;
    const x = c.mag;
    const n = x.length;
    let k = 0;
    while (u < fa) {
      while (k < n && x[k] <= u) k++;
      const v = Math.min(fa, k < n ? x[k] : Infinity);
      const cu = completenessAt(c, Number.isFinite(u) ? u : x[0] - 1);
      const cv = completenessAt(c, Number.isFinite(v) ? v : x[n - 1] + 1);
      const beta = Number.isFinite(u) && Number.isFinite(v) && v > u ? (cv - cu) / (v - u) : 0;
      const alpha = (Number.isFinite(u) ? cu - beta * u : cv - beta * v);
      const zu = (u - mu) / s;
      const zv = (v - mu) / s;
      const dPhi = normalCdf(zv) - normalCdf(zu);
      const dphi = (Number.isFinite(zv) ? stdPdf(zv) : 0) - (Number.isFinite(zu) ? stdPdf(zu) : 0);
      total += (alpha + beta * mu) * dPhi - beta * s * dphi;
      u = v;
    }
    return Math.max(0, total);
  }

  /**
   * log Z: the IMF-weighted selection probability along the segments of `set` (restricted to the curves
   * with finite `lnCurveW`, or all single-star segments when lnCurveW is undefined), for a star that has
   * the bands in `mask` (bit b set = band b present).
   */
  logNormalisation(set: SegmentSet, lnCurveW: Float64Array | undefined, mask: number, sigmaExtra: number): number {
    let maxL = -Infinity;
    let acc = 0;
    for (let s = 0; s < set.n; s++) {
      const lw = lnCurveW === undefined ? 0 : lnCurveW[set.curve[s]];
      if (lw === -Infinity) continue;
      const l = lw + this.logSegmentSelected(set, s, mask, sigmaExtra);
      if (l === -Infinity) continue;
      if (l > maxL) {
        acc = acc * Math.exp(maxL - l) + 1;
        maxL = l;
      } else acc += Math.exp(l - maxL);
    }
    return maxL + Math.log(acc);
  }

  /**
   * Per binary curve: log-adds into out[curve] the IMF-weighted selection probability of each segment of
   * `set` (without q weights), so that Z_B can be formed at any nested q level (cmdLikelihood.ts).
   */
  accumulateCurves(set: SegmentSet, mask: number, sigmaExtra: number, out: Float64Array): void {
    for (let s = 0; s < set.n; s++) {
      const l = this.logSegmentSelected(set, s, mask, sigmaExtra);
      if (l === -Infinity) continue;
      const j = set.curve[s];
      const a = out[j];
      out[j] = a === -Infinity ? l : a > l ? a + Math.log1p(Math.exp(l - a)) : l + Math.log1p(Math.exp(a - l));
    }
  }

  /** Scratch: the ends of the transition zones along one segment (two per limit). */
  private readonly breaks = new Float64Array(2 + 4 * 16);

  private logSegmentSelected(set: SegmentSet, s: number, mask: number, sigmaExtra: number): number {
    // Per band, the selection probability is 1 more than 8 sigma inside its limits and 0 more than 8 sigma
    // outside (to Phi(-8) = 6e-16). Only the stretches of the segment within 8 sigma of a limit (its
    // transition zones; for the completeness band, also wherever c < 1) need quadrature; elsewhere the
    // integrand is the IMF weight alone or zero, integrated in closed form.
    const br = this.breaks;
    let nb = 0;
    br[nb++] = 0;
    br[nb++] = 1;
    let inside = true;
    for (let b = 0; b < this.nBands; b++) {
      if (!this.limited[b] || !(mask & (1 << b))) continue;
      const lo = set.lo[b][s];
      const hi = set.hi[b][s];
      const seLo = errorAt(this.errors[b], lo);
      const seHi = errorAt(this.errors[b], hi);
      const sMax = Math.sqrt(Math.max(seLo, seHi) ** 2 + sigmaExtra * sigmaExtra);
      const bright = this.bright[b];
      const faint = this.faint[b];
      if (hi < bright - 8 * sMax || lo > faint + 8 * sMax) return -Infinity;
      const cutoff = this.completeness && this.completeness.band === b ? Math.min(faint, this.fullUntil) : faint;
      if (lo >= bright + 8 * sMax && hi <= cutoff - 8 * sMax) continue;
      inside = false;
      const m0 = set.start[b][s];
      const d = set.delta[b][s];
      if (d === 0 || nb + 4 > br.length) continue;
      for (const edge of [bright - 8 * sMax, bright + 8 * sMax, cutoff - 8 * sMax, faint + 8 * sMax]) {
        const t = (edge - m0) / d;
        if (t > 0 && t < 1) br[nb++] = t;
      }
    }
    const c0 = set.c0[s];
    const c1 = set.c1[s];
    const c2 = set.c2[s];
    if (inside) return logSegmentIntegral(0, 0, 0, c0, c1, c2);
    br.subarray(0, nb).sort();
    let maxL = -Infinity;
    let acc = 0;
    for (let k = 0; k + 1 < nb; k++) {
      const u = br[k];
      const v = br[k + 1];
      if (!(v > u)) continue;
      const l = this.logPieceSelected(set, s, mask, sigmaExtra, u, v);
      if (l === -Infinity) continue;
      if (l > maxL) {
        acc = acc * Math.exp(maxL - l) + 1;
        maxL = l;
      } else acc += Math.exp(l - maxL);
    }
    return maxL === -Infinity ? -Infinity : maxL + Math.log(acc);
  }

  /** log of the selected IMF weight over t in [u, v] of segment s, a stretch inside or outside every transition zone. */
  private logPieceSelected(set: SegmentSet, s: number, mask: number, sigmaExtra: number, u: number, v: number): number {
    const c0 = set.c0[s];
    const c1 = set.c1[s];
    const c2 = set.c2[s];
    const w = v - u;
    // Is the stretch within 8 sigma of some limit (or where c < 1)? Decided at its midpoint, since its ends
    // are zone ends; also sets the number of pieces: none longer than the local sigma (see the header).
    let nPieces = 0;
    const tm = 0.5 * (u + v);
    for (let b = 0; b < this.nBands; b++) {
      if (!this.limited[b] || !(mask & (1 << b))) continue;
      const m0 = set.start[b][s];
      const d = set.delta[b][s];
      const mu = m0 + tm * d;
      const sMax = Math.sqrt(Math.max(errorAt(this.errors[b], set.lo[b][s]), errorAt(this.errors[b], set.hi[b][s])) ** 2 + sigmaExtra * sigmaExtra);
      const cutoff = this.completeness && this.completeness.band === b ? Math.min(this.faint[b], this.fullUntil) : this.faint[b];
      if (mu >= this.bright[b] + 8 * sMax && mu <= cutoff - 8 * sMax) continue;
      if (mu < this.bright[b] - 8 * sMax || mu > this.faint[b] + 8 * sMax) return -Infinity;
      const sMin = Math.sqrt(Math.min(errorAt(this.errors[b], set.lo[b][s]), errorAt(this.errors[b], set.hi[b][s])) ** 2 + sigmaExtra * sigmaExtra);
      nPieces = Math.max(nPieces, Math.ceil((Math.abs(d) * w) / sMin));
    }
    // Inside every window by 8 sigma: the IMF weight over [u, v] in closed form (t = u + w tau).
    if (nPieces === 0) return logSegmentIntegral(0, 0, 0, c0 + c1 * u + c2 * u * u + Math.log(w), (c1 + 2 * c2 * u) * w, c2 * w * w);
    nPieces = Math.min(nPieces, 4000);
    let total = 0;
    const h = w / nPieces;
    for (let p = 0; p < nPieces; p++) {
      for (let g = 0; g < 4; g++) {
        const t = u + (p + 0.5 + 0.5 * GL4_X[g]) * h;
        let prob = 1;
        for (let b = 0; b < this.nBands && prob > 0; b++) {
          if (!this.limited[b] || !(mask & (1 << b))) continue;
          prob *= this.bandProbability(b, set.start[b][s] + t * set.delta[b][s], sigmaExtra);
        }
        total += 0.5 * h * GL4_W[g] * prob * Math.exp(c0 + t * (c1 + c2 * t));
      }
    }
    return total > 0 ? Math.log(total) : -Infinity;
  }
}

/** 4-point Gauss-Legendre nodes and weights on [-1, 1] (Abramowitz & Stegun 1964, Table 25.4). */
export const GL4_X = [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526];
export const GL4_W = [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538];

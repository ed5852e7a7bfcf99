/**
 * Each star's initial mass, read off the single-star sequence: for one posterior draw of the cluster
 * parameters, the isochrone at (age, [Fe/H]) is moved to apparent magnitudes (distance modulus plus A_b =
 * R_b E(B-V), R_b per node from the extinction model), and the star's mass given that it is a single
 * member follows from Bayes' rule along the sequence: density proportional to the IMF (the stars between
 * two nodes) times the Gaussian of the star's magnitudes about the sequence (its errors and sigma_extra
 * added in quadrature). Between nodes the sequence is a straight segment in magnitude space and the mass
 * runs linearly along it, so each segment's Gaussian integral is closed-form (error functions). One mass is
 * drawn from that distribution per posterior draw, and the median over draws is the posterior median of
 * the star's mass, the cluster parameters marginalised.
 *
 * Stars far from the single-star sequence (unresolved binaries well above it, field stars, blue
 * stragglers) have no meaningful single-star mass: a draw gives NaN when the star's smallest Mahalanobis
 * distance to the sequence exceeds `maxDistanceSigma`, and the median is NaN unless at least half the draws
 * gave a mass. A binary close to the sequence gets the mass of a single star of the same magnitudes, which
 * on the main sequence exceeds its primary's.
 *
 * This reads only the isochrone (not the likelihood's internals), so that it checks the fit from outside.
 */
import erfc from '@stdlib/math-base-special-erfc';
import erfcinv from '@stdlib/math-base-special-erfcinv';
import mt19937 from '@stdlib/random-base-mt19937';
import type { BandId } from '../core/bands.js';
import type { CatalogArrays } from '../likelihood/cmdLikelihood.js';
import { imfCumulative, type Imf } from '../likelihood/imf.js';
import type { ClusterParameters } from '../likelihood/theta.js';
import type { ExtinctionModel, IsochroneSource } from '../stellar/types.js';

export interface StarMassOptions {
  /** A draw gives no mass when the star is farther than this from the sequence (Mahalanobis); default 5. */
  maxDistanceSigma?: number;
  /** Seed of the generator that draws the masses. */
  seed: number;
  /** Posterior draws that will be added (storage). */
  maxDraws: number;
}

/** What stars.arrow's metadata says about `mass_median`. */
export const MASS_METHOD =
  'posterior median of the initial mass (Msun) the star would have as a single cluster member: per posterior draw, one mass drawn along the single-star sequence of the isochrone (apparent magnitudes with the draw\'s distance and extinction), weighted by the IMF and by the Gaussian of the star\'s magnitudes (errors and sigma_extra in quadrature); NaN unless the star lies within 5 sigma (Mahalanobis) of that sequence in at least half of the draws. For an unresolved binary this is the mass of a single star of the same magnitudes, above its primary\'s on the main sequence.';

const BUCKET_MAG = 0.1;
const WINDOW_SIGMA = 8;
const SQRT2 = Math.SQRT2;

export class SingleSequenceMasses {
  readonly nStars: number;
  private readonly bands: BandId[];
  private readonly data: CatalogArrays;
  private readonly source: IsochroneSource;
  private readonly extinction: ExtinctionModel;
  private readonly imf: Imf;
  private readonly maxQ: number;
  private readonly maxDraws: number;
  private readonly samples: Float32Array;
  private nDraws = 0;
  private readonly uniform: () => number;

  constructor(data: CatalogArrays, source: IsochroneSource, extinction: ExtinctionModel, imf: Imf, options: StarMassOptions) {
    this.data = data;
    this.bands = [...data.bands];
    this.nStars = data.nStars;
    this.source = source;
    this.extinction = extinction;
    this.imf = imf;
    const d = options.maxDistanceSigma ?? 5;
    this.maxQ = d * d;
    this.maxDraws = options.maxDraws;
    this.samples = new Float32Array(this.nStars * this.maxDraws).fill(Number.NaN);
    // The factory's result has `normalized` (uniform on [0, 1)) at run time; its type declaration omits it.
    this.uniform = (mt19937.factory({ seed: options.seed >>> 0 || 1 }) as unknown as { normalized: () => number }).normalized;
  }

  /** Draw one mass per star at the cluster parameters `p` (a posterior draw). */
  addDraw(p: ClusterParameters): void {
    if (this.nDraws >= this.maxDraws) throw new RangeError(`more than ${this.maxDraws} draws`);
    const d = this.nDraws++;
    const iso = this.source.isochrone(p.logAgeYr, p.feh, { bands: this.bands });
    if (!iso || iso.massInitial.length < 2) return;
    const nb = this.bands.length;
    const n = iso.massInitial.length;
    const ratio = this.bands.map(() => new Float64Array(n));
    this.extinction.ratios(this.bands, iso.logTeff, iso.logg, p.feh, ratio, n);
    const mu = this.bands.map((b, j) => {
      const col = iso.bands.indexOf(b);
      const out = new Float64Array(n);
      for (let k = 0; k < n; k++) out[k] = iso.absMag[col][k] + p.dm + ratio[j][k] * p.ebv;
      return out;
    });
    const mass = iso.massInitial;
    const cum = new Float64Array(n);
    for (let k = 0; k < n; k++) cum[k] = imfCumulative(this.imf, mass[k]);
    // Segments that carry stars (a jump such as the helium flash joins nodes of equal mass: no stars).
    const seg: number[] = [];
    for (let k = 0; k + 1 < n; k++) if (mass[k + 1] > mass[k] && cum[k + 1] > cum[k]) seg.push(k);
    const nSeg = seg.length;
    if (nSeg === 0) return;
    const lnW = Float64Array.from(seg, (k) => Math.log(cum[k + 1] - cum[k]));
    const indices: (BucketIndex | undefined)[] = new Array(nb).fill(undefined);
    const sx2 = p.sigmaExtra * p.sigmaExtra;
    const iv = new Float64Array(nb);
    const r = new Float64Array(nb);
    let cand = new Int32Array(256);
    let cA = new Float64Array(256);
    let cB = new Float64Array(256);
    let cC = new Float64Array(256);
    let cw = new Float64Array(256);
    const stamp = new Int32Array(nSeg).fill(-1);
    for (let i = 0; i < this.nStars; i++) {
      let rb = -1;
      for (let b = 0; b < nb; b++) {
        const m = this.data.mag[b][i];
        if (Number.isNaN(m)) {
          iv[b] = 0;
          continue;
        }
        const e = this.data.err[b][i];
        iv[b] = 1 / (e * e + sx2);
        if (rb < 0) rb = b;
      }
      if (rb < 0) continue;
      const index = (indices[rb] ??= new BucketIndex(seg, mu[rb]));
      const x = this.data.mag[rb][i];
      const half = WINDOW_SIGMA / Math.sqrt(iv[rb]);
      let nc = 0;
      let qRef = Infinity;
      for (let bk = index.bucketOf(x - half); bk <= index.bucketOf(x + half); bk++) {
        for (let e = index.start[bk]; e < index.start[bk + 1]; e++) {
          const s = index.entries[e];
          if (stamp[s] === i) continue;
          stamp[s] = i;
          const k = seg[s];
          let A = 0;
          let B = 0;
          let C = 0;
          for (let b = 0; b < nb; b++) {
            if (iv[b] === 0) continue;
            const dlt = mu[b][k + 1] - mu[b][k];
            r[b] = this.data.mag[b][i] - mu[b][k];
            A += iv[b] * dlt * dlt;
            B += iv[b] * dlt * r[b];
            C += iv[b] * r[b] * r[b];
          }
          const tc = A > 0 ? Math.min(1, Math.max(0, B / A)) : 0;
          const qc = A * tc * tc - 2 * B * tc + C;
          if (nc === cand.length) {
            const grow = <T extends Float64Array | Int32Array>(a: T): T => {
              const g = new (a.constructor as new (n: number) => T)(2 * a.length);
              g.set(a);
              return g;
            };
            cand = grow(cand);
            cA = grow(cA);
            cB = grow(cB);
            cC = grow(cC);
            cw = grow(cw);
          }
          cand[nc] = s;
          cA[nc] = A;
          cB[nc] = B;
          cC[nc] = C;
          nc++;
          if (qc < qRef) qRef = qc;
        }
      }
      if (nc === 0 || !(qRef <= this.maxQ)) continue;
      // Each candidate's weight: IMF number x integral over t in [0, 1] of exp(-(Q(t) - qRef) / 2).
      let total = 0;
      for (let c = 0; c < nc; c++) {
        const A = cA[c];
        const s = cand[c];
        let w: number;
        if (A < 1e-12) w = Math.exp(lnW[s] - 0.5 * (cC[c] - qRef));
        else {
          const t0 = cB[c] / A;
          const sa = Math.sqrt(A);
          const qMin = cC[c] - cB[c] * t0;
          w = Math.exp(lnW[s] - 0.5 * (qMin - qRef)) * Math.sqrt((2 * Math.PI) / A) * normalMass(-t0 * sa, (1 - t0) * sa);
        }
        cw[c] = total += Number.isFinite(w) ? w : 0;
      }
      if (!(total > 0)) continue;
      const u = this.uniform() * total;
      let c = 0;
      while (c < nc - 1 && cw[c] <= u) c++;
      const A = cA[c];
      let t: number;
      if (A < 1e-12) t = this.uniform();
      else {
        const t0 = cB[c] / A;
        const sa = Math.sqrt(A);
        t = t0 + truncatedNormal(-t0 * sa, (1 - t0) * sa, this.uniform()) / sa;
        t = Math.min(1, Math.max(0, t));
      }
      const k = seg[cand[c]];
      this.samples[i * this.maxDraws + d] = mass[k] + t * (mass[k + 1] - mass[k]);
    }
  }

  /** Posterior median per star (NaN where fewer than half the draws gave a mass). */
  medians(): Float64Array {
    const out = new Float64Array(this.nStars).fill(Number.NaN);
    const buf = new Float64Array(this.maxDraws);
    for (let i = 0; i < this.nStars; i++) {
      let m = 0;
      for (let d = 0; d < this.nDraws; d++) {
        const v = this.samples[i * this.maxDraws + d];
        if (!Number.isNaN(v)) buf[m++] = v;
      }
      if (m === 0 || 2 * m < this.nDraws) continue;
      const s = buf.subarray(0, m).sort();
      out[i] = m % 2 ? s[(m - 1) / 2] : 0.5 * (s[m / 2 - 1] + s[m / 2]);
    }
    return out;
  }

  get draws(): number {
    return this.nDraws;
  }
}

/** Segments bucketed by the magnitude range they span in one band (CSR layout). */
class BucketIndex {
  readonly lo: number;
  readonly nBuckets: number;
  readonly start: Int32Array;
  readonly entries: Int32Array;

  constructor(seg: readonly number[], mu: Float64Array) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const k of seg) {
      lo = Math.min(lo, mu[k], mu[k + 1]);
      hi = Math.max(hi, mu[k], mu[k + 1]);
    }
    this.lo = Math.floor(lo / BUCKET_MAG);
    this.nBuckets = Math.floor(hi / BUCKET_MAG) - this.lo + 1;
    const count = new Int32Array(this.nBuckets + 1);
    const range = (k: number): [number, number] => [this.bucketOf(Math.min(mu[k], mu[k + 1])), this.bucketOf(Math.max(mu[k], mu[k + 1]))];
    for (const k of seg) {
      const [a, b] = range(k);
      for (let x = a; x <= b; x++) count[x + 1]++;
    }
    for (let x = 0; x < this.nBuckets; x++) count[x + 1] += count[x];
    this.start = count;
    this.entries = new Int32Array(count[this.nBuckets]);
    const fill = Int32Array.from(count.subarray(0, this.nBuckets));
    seg.forEach((k, s) => {
      const [a, b] = range(k);
      for (let x = a; x <= b; x++) this.entries[fill[x]++] = s;
    });
  }

  /** The bucket of a magnitude, clamped to the index. */
  bucketOf(m: number): number {
    const b = Math.floor(m / BUCKET_MAG) - this.lo;
    return b < 0 ? 0 : b >= this.nBuckets ? this.nBuckets - 1 : b;
  }
}

/** P(a < Z < b) for a standard normal, from the tail where it does not cancel. */
function normalMass(a: number, b: number): number {
  if (a >= 0) return 0.5 * (erfc(a / SQRT2) - erfc(b / SQRT2));
  if (b <= 0) return 0.5 * (erfc(-b / SQRT2) - erfc(-a / SQRT2));
  return 1 - 0.5 * (erfc(-a / SQRT2) + erfc(b / SQRT2));
}

/** A standard normal drawn on (a, b) by inverting its CDF with uniform u, from the tail that keeps precision. */
function truncatedNormal(a: number, b: number, u: number): number {
  if (a >= 0) {
    // Upper tail: Q(z) = erfc(z / sqrt 2) / 2 falls from Q(a) to Q(b).
    const qa = 0.5 * erfc(a / SQRT2);
    const qb = 0.5 * erfc(b / SQRT2);
    const q = qa - u * (qa - qb);
    return q > 0 ? SQRT2 * erfcinv(2 * q) : a;
  }
  if (b <= 0) return -truncatedNormal(-b, -a, 1 - u);
  const pa = 0.5 * erfc(-a / SQRT2);
  const pb = 0.5 * erfc(-b / SQRT2);
  const p = pa + u * (pb - pa);
  return p < 0.5 ? -SQRT2 * erfcinv(2 * p) : SQRT2 * erfcinv(2 * (1 - p));
}

/**
 * The single-star sequence of one isochrone as the likelihood sees it: a polyline in apparent-magnitude
 * space with exact IMF weights on each segment.
 *
 * The model. The isochrone's own nodes are interpolated linearly in log(initial mass). We then keep only
 * the nodes needed to stay within `toleranceMag` of that interpolation in every band at every original node
 * (a greedy forward scan), always keeping the first and last node, both nodes of every change of phase, and
 * a node at each IMF break (interpolated in log mass). Along each kept segment log(mass) is linear in the
 * segment coordinate t, so the IMF weight is exactly log-linear (power law) or log-quadratic (log-normal) in
 * t (imf.ts), and the Gaussian integral over each segment is exact (segmentIntegral.ts). The tolerance is a
 * stated model approximation (default 1e-4 mag, far below photometric errors and stellar-model systematics;
 * a star with errors sigma at distance d from the sequence sees its log-likelihood change by at most about
 * (2/3) d tolerance / sigma^2, i.e. below 1% for sigma = 0.01 mag);
 * the brute-force reference integrator integrates the same polyline.
 *
 * Extinction: A_b = R_b E(B-V) with R_b evaluated per isochrone node from the star's intrinsic log Teff and
 * log g (ExtinctionModel.ratios), so colour-dependent coefficients (Gaia bands) are applied node by node.
 * Apparent magnitude: mu_b = M_b + dm + A_b.
 */
import type { BandId } from '../core/bands.js';
import type { ExtinctionModel, Isochrone } from '../stellar/types.js';
import { segmentLogWeight, type Imf } from './imf.js';
import { SegmentSet } from './segmentSet.js';

export type PolylineStatus = 'ok' | 'isochrone-undefined';

export class ModelPolyline {
  /** Number of kept nodes. */
  n = 0;
  readonly nBands: number;
  lnMass = new Float64Array(0);
  /** mag[b][k]: apparent magnitude of kept node k in the likelihood's band b. */
  mag: Float64Array[] = [];
  /** 10^(-0.4 mag), for the flux sums of binaries. */
  flux: Float64Array[] = [];
  /** Per band, d mu / d ln M used to extend the sequence below its lowest mass (binary secondaries only). */
  faintSlope: Float64Array;
  /** Segment k joins node k to node k + 1. */
  readonly segments: SegmentSet;

  // scratch over the isochrone's own nodes
  private ratio: Float64Array[] = [];
  private rawMag: Float64Array[] = [];
  private rawLnM = new Float64Array(0);
  private rawForced = new Uint8Array(0);
  private rawCap = 0;
  private capacity = 0;

  constructor(nBands: number) {
    this.nBands = nBands;
    this.faintSlope = new Float64Array(nBands);
    this.segments = new SegmentSet(nBands);
  }

  private ensureRaw(n: number): void {
    if (n <= this.rawCap) return;
    const cap = Math.max(n, 2 * this.rawCap);
    this.ratio = Array.from({ length: this.nBands }, () => new Float64Array(cap));
    this.rawMag = Array.from({ length: this.nBands }, () => new Float64Array(cap));
    this.rawLnM = new Float64Array(cap);
    this.rawForced = new Uint8Array(cap);
    this.rawCap = cap;
  }

  private ensureKept(n: number): void {
    if (n <= this.capacity) return;
    const cap = Math.max(n, 2 * this.capacity);
    this.lnMass = new Float64Array(cap);
    this.mag = Array.from({ length: this.nBands }, () => new Float64Array(cap));
    this.flux = Array.from({ length: this.nBands }, () => new Float64Array(cap));
    this.capacity = cap;
  }

  /**
   * Build from an isochrone. `bandIndex[b]` is the index in `iso.bands` of the likelihood's band b.
   * Returns 'isochrone-undefined' when the isochrone has too few usable nodes or non-finite magnitudes.
   */
  build(
    iso: Isochrone,
    bands: readonly BandId[],
    bandIndex: Int32Array,
    extinction: ExtinctionModel,
    dm: number,
    ebv: number,
    imf: Imf,
    toleranceMag: number,
  ): PolylineStatus {
    const nIso = iso.massInitial.length;
    const maxRaw = nIso + imf.breaks.length;
    this.ensureRaw(maxRaw);
    extinction.ratios(bands, iso.logTeff, iso.logg, iso.feh, this.ratio, nIso);

    // 1. Apparent magnitudes at the isochrone's nodes with strictly increasing mass; IMF breaks inserted.
    let nr = 0;
    let prevLnM = -Infinity;
    let prevPhase = -1;
    for (let j = 0; j < nIso; j++) {
      const lnM = Math.log(iso.massInitial[j]);
      if (!(lnM > prevLnM + 1e-13)) continue;
      for (let b = 0; b < this.nBands; b++) {
        const v = iso.absMag[bandIndex[b]][j] + dm + this.ratio[b][j] * ebv;
        if (!Number.isFinite(v)) return 'isochrone-undefined';
        this.rawMag[b][nr] = v;
      }
      // An IMF break strictly between the previous node and this one gets its own node.
      if (nr > 0) {
        for (const mBreak of imf.breaks) {
          const lb = Math.log(mBreak);
          if (lb > prevLnM + 1e-9 && lb < lnM - 1e-9) {
            const t = (lb - prevLnM) / (lnM - prevLnM);
            for (let b = 0; b < this.nBands; b++) {
              const cur = this.rawMag[b][nr];
              this.rawMag[b][nr + 1] = cur;
              this.rawMag[b][nr] = this.rawMag[b][nr - 1] + t * (cur - this.rawMag[b][nr - 1]);
            }
            this.rawLnM[nr] = lb;
            this.rawForced[nr] = 1;
            nr++;
            prevLnM = lb;
          }
        }
      }
      this.rawLnM[nr] = lnM;
      const phase = iso.phase[j];
      this.rawForced[nr] = nr === 0 || phase !== prevPhase ? 1 : 0;
      if (phase !== prevPhase && nr > 0) this.rawForced[nr - 1] = 1;
      prevPhase = phase;
      prevLnM = lnM;
      nr++;
    }
    if (nr < 2) return 'isochrone-undefined';
    this.rawForced[nr - 1] = 1;

    // 2. Greedy simplification within the tolerance, in log-mass parametrisation.
    this.ensureKept(nr);
    let nk = 0;
    let a = 0;
    this.keep(nk++, a);
    while (a < nr - 1) {
      let best = a + 1;
      for (let cand = a + 2; cand < nr && !this.rawForced[cand - 1]; cand++) {
        if (cand - a > 400 || !this.withinTolerance(a, cand, toleranceMag)) break;
        best = cand;
      }
      this.keep(nk++, best);
      a = best;
    }
    this.n = nk;

    // 3. Segments with exact IMF weights.
    const seg = this.segments;
    seg.reset();
    const w = SCRATCH3;
    for (let k = 0; k + 1 < nk; k++) {
      segmentLogWeight(imf, this.lnMass[k], this.lnMass[k + 1], w[0], w[1], w[2], 0);
      seg.add(this.mag, k, this.mag, k + 1, w[0][0], w[1][0], w[2][0], -1);
    }

    for (let b = 0; b < this.nBands; b++) {
      const fl = this.flux[b];
      const mg = this.mag[b];
      for (let k = 0; k < nk; k++) fl[k] = Math.exp(-0.4 * Math.LN10 * mg[k]);
      // Below the lowest mass the sequence is continued along its first segment's slope, never less steep
      // than 1 mag per e-fold of mass, so that dim secondaries fade smoothly instead of vanishing.
      const slope = (mg[1] - mg[0]) / (this.lnMass[1] - this.lnMass[0]);
      this.faintSlope[b] = Math.min(slope, -1);
    }
    return 'ok';
  }

  private keep(k: number, raw: number): void {
    this.lnMass[k] = this.rawLnM[raw];
    for (let b = 0; b < this.nBands; b++) this.mag[b][k] = this.rawMag[b][raw];
  }

  private withinTolerance(a: number, c: number, tol: number): boolean {
    const la = this.rawLnM[a];
    const span = this.rawLnM[c] - la;
    for (let j = a + 1; j < c; j++) {
      const t = (this.rawLnM[j] - la) / span;
      for (let b = 0; b < this.nBands; b++) {
        const m = this.rawMag[b];
        if (Math.abs(m[j] - (m[a] + t * (m[c] - m[a]))) > tol) return false;
      }
    }
    return true;
  }

  /**
   * Apparent magnitude in band b at log mass lnM (interpolated on the kept polyline, or continued below its
   * lowest mass). `hint` is a segment index to start the search from; returns the segment used.
   */
  locate(lnM: number, hint: number): number {
    let k = hint < 0 ? 0 : hint;
    const last = this.n - 2;
    if (k > last) k = last;
    while (k < last && lnM > this.lnMass[k + 1]) k++;
    while (k > 0 && lnM < this.lnMass[k]) k--;
    return k;
  }

  magAt(b: number, lnM: number, k: number): number {
    const l0 = this.lnMass[0];
    if (lnM < l0) return this.mag[b][0] + this.faintSlope[b] * (lnM - l0);
    const t = (lnM - this.lnMass[k]) / (this.lnMass[k + 1] - this.lnMass[k]);
    return this.mag[b][k] + t * (this.mag[b][k + 1] - this.mag[b][k]);
  }
}

const SCRATCH3 = [new Float64Array(1), new Float64Array(1), new Float64Array(1)];

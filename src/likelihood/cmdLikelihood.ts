/**
 * The mixture likelihood over the colour-magnitude diagram (design.md sections 3 and 4).
 *
 * For star i with magnitudes m_i in the bands it has (pattern p_i), variances v_ib = s_ib^2 + sigmaExtra^2:
 *
 *   S_i = int phi(M) N(m_i | mu(M), v_i) dM                 (single-star sequence)
 *   B_i = int int phi(M) g(q) N(m_i | mu(M, q), v_i) dM dq  (unresolved binaries, flux-summed)
 *   Z_S, Z_B: the same integrals of the probability of selection (selection.ts), per band pattern
 *   cluster_i = [(1 - f) S_i + f B_i] / [(1 - f) Z_S + f Z_B]   with f = fBinary counting all systems
 *            (or (1 - f) S_i / Z_S + f B_i / Z_B when f counts catalogued systems)
 *   L_i = c(m_i) [ pi_i cluster_i W_i + (1 - pi_i) F_i V_i ]
 *
 * with c the completeness at the star's observed magnitude, pi_i its membership prior (or 1 - fField),
 * F_i the field density (fieldDensity.ts), and W_i, V_i the cluster and field parallax densities when
 * parallaxes are used. log L = sum_i log L_i, summed with Neumaier's compensation.
 *
 * S_i and B_i come from closed-form segment integrals (segmentIntegral.ts) over the model polyline
 * (polyline.ts) and the binary curves (binaryTerm.ts, binaryCurves.ts, qGrid.ts), pruned with a bucket index
 * (segmentIndex.ts): a segment is skipped when an upper bound on its contribution is below e^-14 (default) of the
 * largest bound among the star's candidates, and the index query radius is widened until no segment
 * outside it could pass that test.
 *
 * Outcomes are kept apart: `status` after each evaluation says 'ok' (a finite number, however small),
 * 'isochrone-undefined' (the stellar model has no isochrone at this age and [Fe/H]: -Infinity),
 * 'parameter-out-of-range' (a fraction outside [0, 1], negative E(B-V) or sigmaExtra, a NaN: -Infinity),
 * or 'cluster-outside-window' (no cluster star can be selected: the cluster terms are zero and only the
 * field remains, which may still be finite). NaN is never returned.
 */
import type { BandId } from '../core/bands.js';
import { InputError, ModelError } from '../core/errors.js';
import { logAddExp } from '../core/sum.js';
import type { ExtinctionModel, Isochrone, IsochroneSource } from '../stellar/types.js';
import { BinaryTerm, qGridForErrors } from './binaryTerm.js';
import { buildKde, logKdeField, logUniformField, type KdeField } from './fieldDensity.js';
import { makeImf, type Imf } from './imf.js';
import { withDefaults, type LikelihoodOptions } from './options.js';
import { ModelPolyline } from './polyline.js';
import type { QGrid } from './qGrid.js';
import { logSegmentIntegral, segmentMinQ } from './segmentIntegral.js';
import { SegmentIndex } from './segmentIndex.js';
import { segmentBounds, type SegmentSet } from './segmentSet.js';
import { completenessAt, Selection, type CompletenessTable, type ErrorLaw } from './selection.js';
import { parallaxMasFromDm, thetaObject, type ClusterParameters } from './theta.js';

/** The numeric part of a catalogue: what a worker needs (typed arrays on SharedArrayBuffers travel free). */
export interface CatalogArrays {
  bands: BandId[];
  nStars: number;
  mag: Float64Array[];
  err: Float64Array[];
  membership?: Float64Array;
  parallaxMas?: Float64Array;
  parallaxErrorMas?: Float64Array;
}

export type EvaluationStatus = 'ok' | 'isochrone-undefined' | 'parameter-out-of-range' | 'cluster-outside-window';

export interface Responsibilities {
  single: Float64Array;
  binary: Float64Array;
  field: Float64Array;
  /** Each star's log L_i. */
  logL: Float64Array;
}

const LN_2PI = Math.log(2 * Math.PI);
const HALF_LN_2PI = 0.5 * LN_2PI;

export class CmdLikelihood {
  readonly bands: BandId[];
  readonly nStars: number;
  readonly options: LikelihoodOptions;
  readonly imf: Imf;
  /** Outcome of the last evaluation. */
  status: EvaluationStatus = 'ok';
  /** Notes on choices made from the data (window, bandwidths, parallax field), for summaries. */
  readonly notes: string[] = [];

  /** @internal shared with the reference integrator */ readonly source: IsochroneSource;
  /** @internal */ readonly extinction: ExtinctionModel;
  /** @internal */ readonly data: CatalogArrays;
  /** @internal */ readonly selection: Selection;
  /** @internal */ readonly poly: ModelPolyline;
  /** @internal */ readonly qGrid: QGrid;
  /** @internal per star: bit b set when band b is present */ readonly mask: Int32Array;
  /** @internal */ readonly patterns: number[];
  /** @internal */ readonly patternOf: Uint8Array;
  /** @internal log c(m_i) */ readonly logCompleteness: Float64Array;
  /** @internal log F_i (field density / c) */ readonly logField: Float64Array;
  /** @internal log field parallax density, 0 without parallax */ readonly logFieldPlx: Float64Array;
  /** @internal */ readonly useParallax: boolean;

  private readonly nBands: number;
  private readonly bandIndex: Int32Array;
  /** The unresolved binaries: their curves, indices and per-star quadrature over q. */
  private readonly binary: BinaryTerm;
  private readonly singleIndex: (SegmentIndex | undefined)[];
  private readonly refBand: Uint8Array;
  /** The order in which the star loop visits the stars (see the constructor). */
  private readonly order: Int32Array;
  /** Per star: its q level (the qStepSigma rule). */
  private readonly level: Uint8Array;
  private readonly lnZs: Float64Array;
  private readonly lnZb: Float64Array;
  private readonly hasMembership: boolean;
  private readonly lnMember: Float64Array;
  private readonly lnNonMember: Float64Array;
  private readonly plxOk: Uint8Array;
  /** Per band: whether every star has it, and its largest squared error. */
  private readonly bandInAll: Uint8Array;
  private readonly maxErr2: Float64Array;
  private readonly singleBound = new Float64Array(2);

  // per-star scratch
  private readonly sm: Float64Array;
  private readonly siv: Float64Array;
  private cand = new Int32Array(1024);
  private cA = new Float64Array(1024);
  private cB = new Float64Array(1024);
  private cC = new Float64Array(1024);
  private cUb = new Float64Array(1024);
  private cSeg = new Int32Array(1024);

  constructor(data: CatalogArrays, source: IsochroneSource, extinction: ExtinctionModel, options: Partial<LikelihoodOptions> = {}) {
    this.options = withDefaults(options);
    const o = this.options;
    // A band that no star has carries no information: drop it, so that it cannot change the model polyline.
    const used = data.bands.map((_, b) => {
      for (let i = 0; i < data.nStars; i++) if (!Number.isNaN(data.mag[b][i])) return true;
      return false;
    });
    if (used.some((u) => !u)) {
      this.notes.push(`dropped band(s) ${data.bands.filter((_, b) => !used[b]).join(', ')}: no star has a magnitude there`);
      data = { ...data, bands: data.bands.filter((_, b) => used[b]), mag: data.mag.filter((_, b) => used[b]), err: data.err.filter((_, b) => used[b]) };
    }
    this.data = data;
    this.source = source;
    this.extinction = extinction;
    this.bands = [...data.bands];
    this.nBands = this.bands.length;
    this.nStars = data.nStars;
    this.imf = makeImf(o.imf);
    const nb = this.nBands;
    const n = this.nStars;
    if (nb < 2 || nb > 16) throw new InputError(`the likelihood needs 2 to 16 bands; the catalogue has ${nb}`, { hint: 'configure at least two bands under [photometry]' });
    for (const b of this.bands) {
      if (!source.bands.includes(b)) {
        throw new ModelError(`the stellar model "${source.provenance.model}" has no magnitudes in band ${b}`, {
          expected: `one of ${source.bands.join(', ')}`,
          hint: 'fit only bands that the model provides, or use an isochrone grid that has this band',
        });
      }
    }
    if (!(o.qMin > 0 && o.qMin < 1)) throw new InputError('the smallest binary mass ratio must lie in (0, 1)', { where: { key: 'likelihood.binaries.q_min' }, found: o.qMin });
    this.bandIndex = new Int32Array(nb);

    // Stars: present bands, errors, window.
    this.mask = new Int32Array(n);
    const seen = new Map<number, number>();
    this.patterns = [];
    this.patternOf = new Uint8Array(n);
    const catMin = new Float64Array(nb).fill(Infinity);
    const catMax = new Float64Array(nb).fill(-Infinity);
    for (let i = 0; i < n; i++) {
      let mask = 0;
      for (let b = 0; b < nb; b++) {
        const m = data.mag[b][i];
        const e = data.err[b][i];
        if (Number.isNaN(m)) continue;
        if (!Number.isFinite(m)) throw new InputError(`star ${i + 1} has a non-finite ${this.bands[b]} magnitude`, { where: { row: i + 1, field: this.bands[b] }, found: m });
        if (!(e > 0) || !Number.isFinite(e)) {
          throw new InputError(`star ${i + 1} has ${this.bands[b]} error ${e}; errors must be positive and finite`, {
            where: { row: i + 1, field: `${this.bands[b]} error` },
            found: e,
            expected: 'a 1-sigma error > 0 mag',
            hint: 'drop such stars with a cut, or mark the magnitude as missing',
          });
        }
        mask |= 1 << b;
        if (m < catMin[b]) catMin[b] = m;
        if (m > catMax[b]) catMax[b] = m;
      }
      if (mask === 0) throw new InputError(`star ${i + 1} has no magnitude in any fitted band`, { where: { row: i + 1 }, hint: 'drop stars without photometry before fitting' });
      this.mask[i] = mask;
      let p = seen.get(mask);
      if (p === undefined) {
        p = this.patterns.length;
        if (p > 255) throw new InputError('more than 256 distinct patterns of missing bands', { hint: 'cut stars that miss bands' });
        seen.set(mask, p);
        this.patterns.push(mask);
      }
      this.patternOf[i] = p;
    }
    const bright = new Float64Array(nb).fill(-Infinity);
    const faint = new Float64Array(nb).fill(Infinity);
    const fieldBright = new Float64Array(nb);
    const fieldFaint = new Float64Array(nb);
    for (let b = 0; b < nb; b++) {
      const lim = o.limits[this.bands[b]];
      if (lim?.bright !== undefined) bright[b] = lim.bright;
      if (lim?.faint !== undefined) faint[b] = lim.faint;
      if (bright[b] >= faint[b]) {
        throw new InputError(`the ${this.bands[b]} limits are inverted: bright ${bright[b]} is not brighter than faint ${faint[b]}`, {
          where: { key: `likelihood.limits.${this.bands[b]}` },
          hint: 'bright is the smaller magnitude',
        });
      }
      fieldBright[b] = Number.isFinite(bright[b]) ? bright[b] : catMin[b];
      fieldFaint[b] = Number.isFinite(faint[b]) ? faint[b] : catMax[b];
      if (!Number.isFinite(bright[b]) || !Number.isFinite(faint[b])) {
        this.notes.push(`${this.bands[b]}: no configured limit on one side; the field density spans the catalogue's range ${fieldBright[b].toFixed(3)}-${fieldFaint[b].toFixed(3)} and the cluster is not cut there`);
      }
      if (!(fieldFaint[b] > fieldBright[b])) fieldFaint[b] = fieldBright[b] + 1;
      for (let i = 0; i < n; i++) {
        const m = data.mag[b][i];
        if (m < bright[b] || m > faint[b]) {
          throw new InputError(`star ${i + 1} has ${this.bands[b]} = ${m}, outside the observed window ${bright[b]} to ${faint[b]}`, {
            where: { row: i + 1, field: this.bands[b] },
            hint: `widen likelihood.limits.${this.bands[b]} or cut the catalogue to the window`,
          });
        }
      }
    }

    // Completeness and typical errors.
    let completeness: CompletenessTable | undefined;
    if (o.completeness) {
      const cb = this.bands.indexOf(o.completeness.band);
      const { mag, fraction } = o.completeness;
      if (cb < 0) throw new InputError(`the completeness table is for band ${o.completeness.band}, which is not fitted`, { where: { key: 'likelihood.completeness.band' } });
      if (mag.length < 2 || mag.length !== fraction.length) throw new InputError('the completeness table needs at least two magnitudes and one fraction per magnitude', { where: { key: 'likelihood.completeness' } });
      for (let k = 0; k < mag.length; k++) {
        if (k > 0 && !(mag[k] > mag[k - 1])) throw new InputError('completeness magnitudes must increase', { where: { key: 'likelihood.completeness.magnitudes' } });
        if (!(fraction[k] >= 0 && fraction[k] <= 1)) throw new InputError('completeness fractions must lie in [0, 1]', { where: { key: 'likelihood.completeness.fractions' }, found: fraction[k] });
      }
      completeness = { band: cb, mag: Float64Array.from(mag), fraction: Float64Array.from(fraction) };
    }
    const errors: ErrorLaw[] = this.bands.map((band, b) => this.errorLaw(band, b));
    this.selection = new Selection(bright, faint, errors, completeness);

    // Per-star constants: completeness factor, field density, membership, parallax.
    this.logCompleteness = new Float64Array(n);
    this.logField = new Float64Array(n);
    this.logFieldPlx = new Float64Array(n);
    const fieldWindow = { bright: fieldBright, faint: fieldFaint, completeness };
    let kde: KdeField | undefined;
    if (o.field.kind === 'kde') {
      if (!o.field.comparisonMag || o.field.comparisonMag.length !== nb) throw new InputError('a KDE field needs comparison-field magnitudes in every fitted band', { where: { key: 'likelihood.field.comparison' } });
      kde = buildKde(o.field.comparisonMag, fieldWindow, this.patterns, o.field.bandwidthScale ?? 1);
      if (kde.nComparison < 10) throw new InputError(`the comparison field has ${kde.nComparison} stars with every band; at least 10 are needed`, { where: { key: 'likelihood.field.comparison' } });
      this.notes.push(`field: KDE of ${kde.nComparison} comparison stars, bandwidths ${Array.from(kde.bandwidth, (h, b) => `${this.bands[b]} ${h.toFixed(3)}`).join(', ')} mag (Scott's rule x ${o.field.bandwidthScale ?? 1})`);
    }
    const uniformByPattern = new Map<number, number>();
    const mBuf = new Float64Array(nb);
    for (let i = 0; i < n; i++) {
      const mask = this.mask[i];
      if (completeness && mask & (1 << completeness.band)) {
        const c = completenessAt(completeness, data.mag[completeness.band][i]);
        if (!(c > 0)) throw new InputError(`star ${i + 1} lies where the completeness is zero`, { where: { row: i + 1 }, hint: 'cut the catalogue where the completeness table reaches 0' });
        this.logCompleteness[i] = Math.log(c);
      }
      if (kde) {
        for (let b = 0; b < nb; b++) mBuf[b] = mask & (1 << b) ? data.mag[b][i] : 0;
        this.logField[i] = logKdeField(kde, mBuf, mask) - this.logCompleteness[i];
      } else {
        let u = uniformByPattern.get(mask);
        if (u === undefined) {
          u = logUniformField(fieldWindow, mask);
          uniformByPattern.set(mask, u);
        }
        this.logField[i] = u;
      }
    }
    this.hasMembership = data.membership !== undefined;
    this.lnMember = new Float64Array(n);
    this.lnNonMember = new Float64Array(n);
    if (data.membership) {
      for (let i = 0; i < n; i++) {
        const p = data.membership[i];
        if (!(p >= 0 && p <= 1)) throw new InputError(`star ${i + 1} has membership probability ${p}; it must lie in [0, 1]`, { where: { row: i + 1, field: 'membership' } });
        this.lnMember[i] = Math.log(p);
        this.lnNonMember[i] = Math.log1p(-p);
      }
      this.notes.push('membership: each star\'s prior membership probability replaces 1 - f_field (f_field is ignored)');
    }
    this.plxOk = new Uint8Array(n);
    this.useParallax = o.parallax.use && data.parallaxMas !== undefined && data.parallaxErrorMas !== undefined;
    if (this.useParallax) this.setupParallax();

    // Evaluation structures.
    this.poly = new ModelPolyline(nb);
    let sMax = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let b = 0; b < nb; b++) if (this.mask[i] & (1 << b)) s += 1 / (data.err[b][i] * data.err[b][i]);
      if (s > sMax) sMax = s;
    }
    this.qGrid = qGridForErrors(o.qMin, o.qGamma, o.qStepSigma, sMax);
    this.binary = new BinaryTerm(this.poly, this.qGrid, { prune: o.prune, pruneLogRatio: o.pruneLogRatio });
    this.singleIndex = new Array(nb).fill(undefined);
    this.refBand = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      let b = 0;
      while (!(this.mask[i] & (1 << b))) b++;
      this.refBand[i] = b;
    }
    // With binaries, stars are visited sorted by reference band, then magnitude there: neighbours in that
    // order query the same index cells and segments, which then stay in cache (the records of all q curves
    // take several MB).
    const order = Array.from({ length: n }, (_, i) => i);
    const key = (i: number) => data.mag[this.refBand[i]][i];
    order.sort((a, b) => this.refBand[a] - this.refBand[b] || key(a) - key(b) || a - b);
    this.order = Int32Array.from(order);
    this.level = new Uint8Array(n);
    this.lnZs = new Float64Array(this.patterns.length);
    this.lnZb = new Float64Array(this.patterns.length);
    this.sm = new Float64Array(nb);
    this.siv = new Float64Array(nb);
    this.bandInAll = new Uint8Array(nb);
    this.maxErr2 = new Float64Array(nb);
    for (let b = 0; b < nb; b++) {
      this.bandInAll[b] = this.patterns.every((m) => m & (1 << b)) ? 1 : 0;
      for (let i = 0; i < n; i++) {
        const e = data.err[b][i];
        if (e * e > this.maxErr2[b]) this.maxErr2[b] = e * e;
      }
    }
  }

  private errorLaw(band: BandId, b: number): ErrorLaw {
    const law = this.options.errorLaw?.[band];
    if (law) {
      // Tabulated every 0.02 mag (linear interpolation then errs by under 1e-4 of the exponential term).
      const mag = new Float64Array(2001);
      const sigma = new Float64Array(2001);
      for (let k = 0; k <= 2000; k++) {
        mag[k] = -10 + 0.02 * k;
        sigma[k] = law.a + law.b * Math.pow(10, 0.4 * (mag[k] - law.mRef));
      }
      return { mag, sigma };
    }
    // Medians of the catalogue's errors in 0.25 mag bins (each non-empty bin gives a node at its centre).
    // Fixed bins keep the law unchanged when the catalogue is permuted or duplicated.
    const bins = new Map<number, number[]>();
    for (let i = 0; i < this.nStars; i++) {
      const m = this.data.mag[b][i];
      if (Number.isNaN(m)) continue;
      const k = Math.floor(m / 0.25);
      let list = bins.get(k);
      if (!list) bins.set(k, (list = []));
      list.push(this.data.err[b][i]);
    }
    const keys = [...bins.keys()].sort((p, q) => p - q);
    if (keys.length === 0) return { mag: Float64Array.of(0, 1), sigma: Float64Array.of(Number.NaN, Number.NaN) };
    const mag = Float64Array.from(keys, (k) => 0.25 * (k + 0.5));
    const sigma = Float64Array.from(keys, (k) => {
      const e = (bins.get(k) as number[]).sort((p, q) => p - q);
      const h = e.length >> 1;
      return e.length % 2 ? e[h] : 0.5 * (e[h - 1] + e[h]);
    });
    if (keys.length === 1) return { mag: Float64Array.of(mag[0] - 1, mag[0] + 1), sigma: Float64Array.of(sigma[0], sigma[0]) };
    return { mag, sigma };
  }

  private setupParallax(): void {
    const plx = this.data.parallaxMas as Float64Array;
    const err = this.data.parallaxErrorMas as Float64Array;
    const o = this.options.parallax;
    let s = 0;
    let s2 = 0;
    let k = 0;
    for (let i = 0; i < this.nStars; i++) {
      if (Number.isFinite(plx[i]) && err[i] > 0) {
        this.plxOk[i] = 1;
        s += plx[i];
        s2 += plx[i] * plx[i];
        k++;
      }
    }
    const mean = o.fieldMeanMas ?? (k > 0 ? s / k : 0);
    const sd = o.fieldSdMas ?? (k > 1 ? Math.sqrt(Math.max(1e-6, s2 / k - (s / k) ** 2)) : 1);
    if (!(sd > 0)) throw new InputError('the field parallax spread must be positive', { where: { key: 'likelihood.parallax.field_sd_mas' }, found: sd });
    this.notes.push(`parallax: cluster zero point ${o.zeroPointMas} mas; field density normal, mean ${mean.toFixed(4)} mas, sd ${sd.toFixed(4)} mas${o.fieldMeanMas === undefined ? ' (from the catalogue)' : ''}`);
    for (let i = 0; i < this.nStars; i++) {
      if (!this.plxOk[i]) continue;
      const v = sd * sd + err[i] * err[i];
      const d = plx[i] - mean;
      this.logFieldPlx[i] = -0.5 * (LN_2PI + Math.log(v) + (d * d) / v);
    }
  }

  /** log L for theta (a Float64Array in THETA_NAMES order, or named parameters). Never NaN. */
  evaluate(theta: ArrayLike<number> | ClusterParameters): number {
    return this.run(isNamed(theta) ? theta : thetaObject(theta), undefined);
  }

  /** Each star's responsibilities (single, binary, field) and log L_i at theta. Not for the hot loop. */
  responsibilities(theta: ArrayLike<number> | ClusterParameters): Responsibilities {
    const n = this.nStars;
    const out: Responsibilities = { single: new Float64Array(n), binary: new Float64Array(n), field: new Float64Array(n), logL: new Float64Array(n) };
    this.run(isNamed(theta) ? theta : thetaObject(theta), out);
    return out;
  }

  /** @internal Build the model at theta; returns false (and sets status) when it is undefined. */
  prepare(p: ClusterParameters, needBinaries: boolean): boolean {
    const ok =
      Number.isFinite(p.logAgeYr) && Number.isFinite(p.feh) && Number.isFinite(p.dm) && p.ebv >= 0 && p.ebv < 100 &&
      p.fBinary >= 0 && p.fBinary <= 1 && p.fField >= 0 && p.fField <= 1 && p.sigmaExtra >= 0 && p.sigmaExtra < 100;
    if (!ok) {
      this.status = 'parameter-out-of-range';
      return false;
    }
    const d = this.source.domain;
    if (p.logAgeYr < d.logAgeYr[0] || p.logAgeYr > d.logAgeYr[1] || p.feh < d.feh[0] || p.feh > d.feh[1]) {
      this.status = 'isochrone-undefined';
      return false;
    }
    const iso: Isochrone | undefined = this.source.isochrone(p.logAgeYr, p.feh, { bands: this.bands });
    if (!iso || iso.massInitial.length < 2) {
      this.status = 'isochrone-undefined';
      return false;
    }
    for (let b = 0; b < this.nBands; b++) {
      const k = iso.bands.indexOf(this.bands[b]);
      if (k < 0) {
        this.status = 'isochrone-undefined';
        return false;
      }
      this.bandIndex[b] = k;
    }
    if (this.poly.build(iso, this.bands, this.bandIndex, this.extinction, p.dm, p.ebv, this.imf, this.options.polylineToleranceMag) !== 'ok') {
      this.status = 'isochrone-undefined';
      return false;
    }
    const sx2 = p.sigmaExtra * p.sigmaExtra;
    const grid = this.qGrid;
    if (needBinaries) {
      // Per star: the coarsest q level whose step (in the star's own sigma units, for a shift of all bands by
      // the offset) is <= qStepSigma, never coarser than 64 intervals (the coarser nested levels serve Z_B).
      const lvl64 = Math.max(0, grid.nLevels - 1 - 3);
      for (let i = 0; i < this.nStars; i++) {
        let s = 0;
        for (let b = 0; b < this.nBands; b++) {
          if (!(this.mask[i] & (1 << b))) continue;
          const e = this.data.err[b][i];
          s += 1 / (e * e + sx2);
        }
        const sq = Math.sqrt(s);
        let l = lvl64;
        while (l > 0 && grid.maxStepMag[l] * sq > this.options.qStepSigma) l--;
        this.level[i] = l;
      }
      // Binary curves and indices are built lazily: mark them stale.
      this.binary.reset(this.firstVisiblePrimary(sx2));
    }
    segmentBounds(this.poly.segments, undefined, 1, this.singleBound);
    for (let b = 0; b < this.nBands; b++) this.singleIndex[b] = undefined;
    // Selection normalisations per band pattern.
    for (let pi = 0; pi < this.patterns.length; pi++) {
      this.lnZs[pi] = this.selection.logNormalisation(this.poly.segments, undefined, this.patterns[pi], p.sigmaExtra);
      this.lnZb[pi] = needBinaries ? this.binary.normalisation(this.selection, this.patterns[pi], p.sigmaExtra) : -Infinity;
    }
    this.status = 'ok';
    return true;
  }

  /**
   * The first polyline node whose binaries could be seen: a binary is at most 0.753 mag brighter than its
   * primary, so primaries fainter than a band's faint limit + 0.76 mag + 12 times the largest error are
   * invisible to every star that has that band (their Gaussian factor is below e^-72).
   */
  private firstVisiblePrimary(sx2: number): number {
    let k = 0;
    for (let b = 0; b < this.nBands; b++) {
      if (!Number.isFinite(this.selection.faint[b]) || !this.bandInAll[b]) continue;
      const cut = this.selection.faint[b] + 0.76 + 12 * Math.sqrt(this.maxErr2[b] + sx2);
      let kb = 0;
      while (kb < this.poly.n - 2 && this.poly.mag[b][kb] > cut) kb++;
      k = Math.max(k, kb > 0 ? kb - 1 : 0);
    }
    return k;
  }

  /** The index of the single-star polyline in reference band `band`, built on first use. */
  private singleIndexFor(band: number): SegmentIndex {
    let ix = this.singleIndex[band];
    if (!ix) {
      ix = this.singleIndexPool[band] ?? new SegmentIndex();
      this.singleIndexPool[band] = ix;
      ix.build(this.poly.segments, band, 0.1, 1, false);
      this.singleIndex[band] = ix;
    }
    return ix;
  }
  private readonly singleIndexPool: SegmentIndex[] = [];


  private run(p: ClusterParameters, out: Responsibilities | undefined): number {
    const f = p.fBinary;
    const needBinaries = f > 0;
    if (!this.prepare(p, needBinaries)) {
      if (out) {
        out.logL.fill(-Infinity);
        out.single.fill(Number.NaN);
        out.binary.fill(Number.NaN);
        out.field.fill(Number.NaN);
      }
      return -Infinity;
    }
    const n = this.nStars;
    const nb = this.nBands;
    const sx2 = p.sigmaExtra * p.sigmaExtra;
    const needSingles = f < 1;
    const lnOneMinusF = Math.log1p(-f);
    const lnF = Math.log(f);
    const intrinsic = this.options.binaryFractionOf === 'all';
    const lnPiDefault = Math.log1p(-p.fField);
    const lnFieldDefault = Math.log(p.fField);
    const lnZc = new Float64Array(this.patterns.length);
    let anySelectable = false;
    for (let k = 0; k < this.patterns.length; k++) {
      lnZc[k] = logAddExp(needSingles ? lnOneMinusF + this.lnZs[k] : -Infinity, needBinaries ? lnF + this.lnZb[k] : -Infinity);
      if (lnZc[k] > -Infinity) anySelectable = true;
    }
    if (!anySelectable) this.status = 'cluster-outside-window';
    const plxC = this.useParallax ? parallaxMasFromDm(p.dm) + this.options.parallax.zeroPointMas : 0;
    const m = this.sm;
    const iv = this.siv;
    const polySet = this.poly.segments;

    let sum = 0;
    let comp = 0;
    // The sorted order pays only with binaries (their segment data is large); without them the catalogue
    // order reads the per-star arrays sequentially (measured: sorted was 20% slower at 10^5 singles).
    const order = needBinaries ? this.order : undefined;
    for (let ii = 0; ii < n; ii++) {
      const i = order === undefined ? ii : order[ii];
      const mask = this.mask[i];
      let lnNorm = 0;
      for (let b = 0; b < nb; b++) {
        if (mask & (1 << b)) {
          const e = this.data.err[b][i];
          const v = e * e + sx2;
          m[b] = this.data.mag[b][i];
          iv[b] = 1 / v;
          lnNorm -= HALF_LN_2PI + 0.5 * Math.log(v);
        } else {
          m[b] = 0;
          iv[b] = 0;
        }
      }
      const pat = this.patternOf[i];
      const lnPi = this.hasMembership ? this.lnMember[i] : lnPiDefault;
      const lnNotPi = this.hasMembership ? this.lnNonMember[i] : lnFieldDefault;
      let lnS = -Infinity;
      let lnB = -Infinity;
      let lnCluster = -Infinity;
      if (lnPi > -Infinity && lnZc[pat] > -Infinity) {
        const rb = this.refBand[i];
        // A component below e^-40 of the field term cannot change log L_i: it need not be integrated.
        const plxTerm = this.useParallax && this.plxOk[i] ? this.logClusterParallax(i, plxC) : 0;
        const lnFieldTerm = lnNotPi > -Infinity ? lnNotPi + this.logField[i] + this.logFieldPlx[i] : -Infinity;
        const negligible = lnFieldTerm - 40 - (lnPi + lnNorm + plxTerm);
        const zS = intrinsic ? lnZc[pat] : this.lnZs[pat];
        const zB = intrinsic ? lnZc[pat] : this.lnZb[pat];
        if (needSingles) lnS = lnNorm + this.logComponent(polySet, this.singleIndexFor(rb), undefined, this.singleBound, 1, negligible - lnOneMinusF + zS);
        if (needBinaries) {
          lnB = lnNorm + this.binary.logIntegral(m, iv, this.level[i], rb, negligible - lnF + zB);
        }
        let a: number;
        let c: number;
        if (intrinsic) {
          a = lnOneMinusF + lnS - lnZc[pat];
          c = lnF + lnB - lnZc[pat];
        } else {
          a = lnOneMinusF + lnS - this.lnZs[pat];
          c = lnF + lnB - this.lnZb[pat];
        }
        if (!needSingles) a = -Infinity;
        if (!needBinaries) c = -Infinity;
        a += plxTerm;
        c += plxTerm;
        lnS = lnPi + a;
        lnB = lnPi + c;
        lnCluster = logAddExp(lnS, lnB);
      }
      const lnFld = lnNotPi > -Infinity ? lnNotPi + this.logField[i] + this.logFieldPlx[i] : -Infinity;
      const lnTot = logAddExp(lnCluster, lnFld);
      const li = this.logCompleteness[i] + lnTot;
      if (out) {
        out.logL[i] = li;
        out.single[i] = lnTot > -Infinity ? Math.exp(lnS - lnTot) : Number.NaN;
        out.binary[i] = lnTot > -Infinity ? Math.exp(lnB - lnTot) : Number.NaN;
        out.field[i] = lnTot > -Infinity ? Math.exp(lnFld - lnTot) : Number.NaN;
      }
      // Neumaier-compensated sum over stars.
      const t = sum + li;
      if (Math.abs(sum) >= Math.abs(li)) comp += sum - t + li;
      else comp += li - t + sum;
      sum = t;
    }
    const total = sum + comp;
    return Number.isNaN(total) ? -Infinity : total;
  }

  private logClusterParallax(i: number, plxC: number): number {
    const pe = (this.data.parallaxErrorMas as Float64Array)[i];
    const d = (this.data.parallaxMas as Float64Array)[i] - plxC;
    return -0.5 * (LN_2PI + 2 * Math.log(pe) + (d * d) / (pe * pe));
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

  /**
   * log of the sum over segments of the closed-form integrals for the current star (in this.sm / this.siv),
   * without the Gaussian's normalising constant. `lnCW` adds each binary curve's quadrature weight; `bound`
   * holds the set's largest log weight per unit t and per unit magnitude length (see segmentBounds).
   * Returns -Infinity without integrating when even an upper bound on the result is below `negligible`.
   */
  private logComponent(set: SegmentSet, index: SegmentIndex | undefined, lnCW: Float64Array | undefined, bound: Float64Array, step: number, negligible: number): number {
    const nb = this.nBands;
    const m = this.sm;
    const iv = this.siv;
    const cut = this.options.pruneLogRatio;
    this.ensureCandidates(set.n);
    // Largest possible ub of any segment (see the ub formula below): a segment's peak weight per unit t,
    // or its weight per unit length times sqrt(2 pi / iv_min) when it is long against the star's errors.
    let ivMin = Infinity;
    let allBands = true;
    for (let b = 0; b < nb; b++) {
      if (iv[b] > 0) ivMin = Math.min(ivMin, iv[b]);
      else allBands = false;
    }
    const G = allBands ? Math.min(bound[0], bound[1] + 0.5 * Math.log((2 * Math.PI) / ivMin)) : bound[0];
    const lnCount = Math.log(set.n + 1);
    let R2 = 2 * cut + 9;
    let useIndex = index !== undefined && this.options.prune;
    let kept = 0;
    let maxUb = -Infinity;
    for (;;) {
      let nCand: number;
      if (useIndex) {
        const rb = (index as SegmentIndex).band;
        const half = Math.sqrt(R2 / iv[rb]);
        nCand = (index as SegmentIndex).query(m[rb] - half, m[rb] + half, this.cand);
      } else {
        nCand = 0;
        for (let s = 0; s < set.n; s++) {
          const c = set.curve[s];
          if (c < 0 || c % step === 0) this.cand[nCand++] = s;
        }
      }
      kept = 0;
      maxUb = -Infinity;
      for (let k = 0; k < nCand; k++) {
        const s = this.cand[k];
        if (useIndex) {
          let d2 = 0;
          for (let b = 0; b < nb && d2 <= R2; b++) {
            const x = m[b];
            const lo = set.lo[b][s];
            const hi = set.hi[b][s];
            const dd = x < lo ? lo - x : x > hi ? x - hi : 0;
            d2 += iv[b] * dd * dd;
          }
          if (d2 > R2) continue;
        }
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
        const lw = lnCW === undefined ? 0 : lnCW[set.curve[s]];
        // Upper bound on the segment's integral: peak weight x exp(-D^2/2) x min(1, sqrt(2 pi / A)).
        const ub = set.lnWmax[s] + lw - 0.5 * segmentMinQ(A, B, C) + (A > 2 * Math.PI ? 0.5 * Math.log((2 * Math.PI) / A) : 0);
        this.cA[kept] = A;
        this.cB[kept] = B;
        this.cC[kept] = C;
        this.cUb[kept] = ub;
        this.cSeg[kept] = s;
        kept++;
        if (ub > maxUb) maxUb = ub;
      }
      if (!useIndex) break;
      if (kept === 0) {
        // Every segment lies beyond Mahalanobis distance sqrt(R2): the sum is below this bound.
        if (G + lnCount - 0.5 * R2 < negligible) return -Infinity;
        R2 *= 4;
        if (R2 > 1e7) useIndex = false;
        continue;
      }
      // Complete when no segment outside the query could pass the cut.
      if (G - 0.5 * R2 < maxUb - cut) break;
      R2 = 2 * (G - maxUb + cut) + 1;
    }
    const floor = this.options.prune ? maxUb - cut : -Infinity;
    let mx = -Infinity;
    let acc = 0;
    for (let k = 0; k < kept; k++) {
      if (this.cUb[k] < floor) continue;
      const s = this.cSeg[k];
      const lw = lnCW === undefined ? 0 : lnCW[set.curve[s]];
      const l = logSegmentIntegral(this.cA[k], this.cB[k], this.cC[k], set.c0[s] + lw, set.c1[s], set.c2[s]);
      if (l > mx) {
        acc = acc * Math.exp(mx - l) + 1;
        mx = l;
      } else if (l > -Infinity) acc += Math.exp(l - mx);
    }
    return mx === -Infinity ? -Infinity : mx + Math.log(acc);
  }
}

function isNamed(t: ArrayLike<number> | ClusterParameters): t is ClusterParameters {
  return (t as ClusterParameters).logAgeYr !== undefined;
}

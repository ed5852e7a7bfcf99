/**
 * A one-dimensional bucket index of segments by their magnitude range in one reference band, for pruning:
 * a star only looks at segments whose bounding box in that band reaches within R sigma of it. Segments
 * span several buckets; a query reports each segment once, in the first bucket of the query range that the
 * segment occupies. Rebuilt for every parameter vector, in O(segments + buckets), without allocation once
 * warm.
 */
import type { SegmentSet } from './segmentSet.js';

export class SegmentIndex {
  private origin = 0;
  private invWidth = 1;
  private nCells = 0;
  private cellStart = new Int32Array(1);
  private items = new Int32Array(0);
  private firstCell = new Int32Array(0);
  private fill = new Int32Array(0);
  /**
   * With records (build's `records`): in item order, each item's first cell and a copy of its segment, so
   * that queryBox and the star loop read memory sequentially instead of visiting segments at random in a
   * set of several MB (the binary curves). Record layout, `stride` = 4 nBands + 5 values:
   * [lo_0, hi_0, ..., lo_(nb-1), hi_(nb-1), start_0..start_(nb-1), delta_0..delta_(nb-1), c0, c1, c2, lnWmax, curve].
   */
  private itemFirst = new Int32Array(0);
  rec = new Float64Array(0);
  stride = 0;
  private nBands = 0;
  band = 0;

  /**
   * Index the segments of `set` whose curve is -1 or a multiple of `step`, by band `band`, with buckets of
   * `widthMag`.
   */
  build(set: SegmentSet, band: number, widthMag: number, step: number, records = false): void {
    this.band = band;
    const lo = set.lo[band];
    const hi = set.hi[band];
    let mn = Infinity;
    let mx = -Infinity;
    for (let s = 0; s < set.n; s++) {
      if (lo[s] < mn) mn = lo[s];
      if (hi[s] > mx) mx = hi[s];
    }
    if (!(mx >= mn)) {
      mn = 0;
      mx = 0;
    }
    this.origin = mn;
    this.invWidth = 1 / widthMag;
    const nCells = Math.min(1 << 20, Math.floor((mx - mn) * this.invWidth) + 1);
    this.nCells = nCells;
    if (this.cellStart.length < nCells + 1) this.cellStart = new Int32Array(2 * nCells + 1);
    if (this.fill.length < nCells) this.fill = new Int32Array(2 * nCells);
    if (this.firstCell.length < set.n) this.firstCell = new Int32Array(2 * set.n);
    const cs = this.cellStart;
    cs.fill(0, 0, nCells + 1);
    let total = 0;
    const curve = set.curve;
    for (let s = 0; s < set.n; s++) {
      const c = curve[s];
      if (c >= 0 && c % step !== 0) {
        this.firstCell[s] = -1;
        continue;
      }
      const a = this.cell(lo[s]);
      const b = this.cell(hi[s]);
      this.firstCell[s] = a;
      for (let k = a; k <= b; k++) cs[k + 1]++;
      total += b - a + 1;
    }
    for (let k = 0; k < nCells; k++) cs[k + 1] += cs[k];
    if (this.items.length < total) this.items = new Int32Array(2 * total);
    const nb = set.nBands;
    this.nBands = nb;
    const stride = 4 * nb + 5;
    this.stride = stride;
    if (records) {
      if (this.itemFirst.length < total) this.itemFirst = new Int32Array(2 * total);
      if (this.rec.length < total * stride) this.rec = new Float64Array(2 * total * stride);
    }
    this.fill.set(cs.subarray(0, nCells));
    const rec = this.rec;
    for (let s = 0; s < set.n; s++) {
      const a = this.firstCell[s];
      if (a < 0) continue;
      const b = this.cell(hi[s]);
      for (let k = a; k <= b; k++) {
        const p = this.fill[k]++;
        this.items[p] = s;
        if (!records) continue;
        this.itemFirst[p] = a;
        const o = p * stride;
        for (let q = 0; q < nb; q++) {
          rec[o + 2 * q] = set.lo[q][s];
          rec[o + 2 * q + 1] = set.hi[q][s];
          rec[o + 2 * nb + q] = set.start[q][s];
          rec[o + 3 * nb + q] = set.delta[q][s];
        }
        rec[o + 4 * nb] = set.c0[s];
        rec[o + 4 * nb + 1] = set.c1[s];
        rec[o + 4 * nb + 2] = set.c2[s];
        rec[o + 4 * nb + 3] = set.lnWmax[s];
        rec[o + 4 * nb + 4] = set.curve[s];
      }
    }
  }

  /**
   * (Index built with records.) Write into `out` the record positions of the segments whose range in the index band overlaps [m[band] - half, m[band] + half]
   * and whose bounding box lies within squared Mahalanobis distance R2 of the point m (per-band inverse
   * variances iv, 0 for a missing band); returns their count.
   */
  queryBox(m: Float64Array, iv: Float64Array, R2: number, out: Int32Array): number {
    if (this.nCells === 0) return 0;
    const half = Math.sqrt(R2 / iv[this.band]);
    const mLo = m[this.band] - half;
    const mHi = m[this.band] + half;
    const lastCellEnd = this.origin + this.nCells / this.invWidth;
    if (mHi < this.origin || mLo > lastCellEnd) return 0;
    const a = this.cell(mLo);
    const b = this.cell(mHi);
    const nb = this.nBands;
    const stride = this.stride;
    let n = 0;
    const cs = this.cellStart;
    const first = this.itemFirst;
    const box = this.rec;
    for (let k = a; k <= b; k++) {
      const end = cs[k + 1];
      for (let p = cs[k]; p < end; p++) {
        const f = first[p];
        // Report each segment once: in its first cell, or in the query's first cell when it starts before.
        if (f !== k && !(k === a && f < a)) continue;
        let d2 = 0;
        const o = p * stride;
        for (let q = 0; q < nb && d2 <= R2; q++) {
          const x = m[q];
          const lo = box[o + 2 * q];
          const hi = box[o + 2 * q + 1];
          const dd = x < lo ? lo - x : x > hi ? x - hi : 0;
          d2 += iv[q] * dd * dd;
        }
        if (d2 <= R2) out[n++] = p;
      }
    }
    return n;
  }

  private cell(m: number): number {
    const c = Math.floor((m - this.origin) * this.invWidth);
    return c < 0 ? 0 : c >= this.nCells ? this.nCells - 1 : c;
  }

  /** Write into `out` the segments whose range in the index band overlaps [mLo, mHi]; returns their count. */
  query(mLo: number, mHi: number, out: Int32Array): number {
    if (this.nCells === 0) return 0;
    const lastCellEnd = this.origin + this.nCells / this.invWidth;
    if (mHi < this.origin || mLo > lastCellEnd) return 0;
    const a = this.cell(mLo);
    const b = this.cell(mHi);
    let n = 0;
    const cs = this.cellStart;
    const items = this.items;
    const first = this.firstCell;
    for (let k = a; k <= b; k++) {
      for (let p = cs[k]; p < cs[k + 1]; p++) {
        const s = items[p];
        const f = first[s];
        if (f === k || (k === a && f < a)) out[n++] = s;
      }
    }
    return n;
  }
}

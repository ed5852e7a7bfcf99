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
  band = 0;

  /**
   * Index the segments of `set` whose curve is -1 or a multiple of `step`, by band `band`, with buckets of
   * `widthMag`.
   */
  build(set: SegmentSet, band: number, widthMag: number, step: number): void {
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
    this.fill.set(cs.subarray(0, nCells));
    for (let s = 0; s < set.n; s++) {
      const a = this.firstCell[s];
      if (a < 0) continue;
      const b = this.cell(hi[s]);
      for (let k = a; k <= b; k++) this.items[this.fill[k]++] = s;
    }
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

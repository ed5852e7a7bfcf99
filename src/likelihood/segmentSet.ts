/**
 * A flat, growable store of polyline segments in magnitude space: start magnitudes, direction vectors,
 * bounding boxes, and the log-weight coefficients of each segment (segmentIntegral.ts). Singles and every
 * binary curve use the same layout, so one kernel integrates them all. Typed arrays, grown by doubling
 * (between evaluations, never per star).
 */
export class SegmentSet {
  n = 0;
  readonly nBands: number;
  start: Float64Array[];
  delta: Float64Array[];
  lo: Float64Array[];
  hi: Float64Array[];
  c0: Float64Array;
  c1: Float64Array;
  c2: Float64Array;
  /** max over t in [0, 1] of c0 + c1 t + c2 t^2: bounds the segment's contribution for pruning. */
  lnWmax: Float64Array;
  /** Which binary curve (q node) the segment belongs to; -1 for the single-star sequence. */
  curve: Int32Array;
  private capacity = 0;

  constructor(nBands: number, capacity = 256) {
    this.nBands = nBands;
    this.start = [];
    this.delta = [];
    this.lo = [];
    this.hi = [];
    this.c0 = new Float64Array(0);
    this.c1 = new Float64Array(0);
    this.c2 = new Float64Array(0);
    this.lnWmax = new Float64Array(0);
    this.curve = new Int32Array(0);
    this.grow(capacity);
  }

  reset(): void {
    this.n = 0;
  }

  private grow(cap: number): void {
    const copy = (a: Float64Array) => {
      const b = new Float64Array(cap);
      b.set(a.subarray(0, this.n));
      return b;
    };
    for (let b = 0; b < this.nBands; b++) {
      this.start[b] = copy(this.start[b] ?? new Float64Array(0));
      this.delta[b] = copy(this.delta[b] ?? new Float64Array(0));
      this.lo[b] = copy(this.lo[b] ?? new Float64Array(0));
      this.hi[b] = copy(this.hi[b] ?? new Float64Array(0));
    }
    this.c0 = copy(this.c0);
    this.c1 = copy(this.c1);
    this.c2 = copy(this.c2);
    this.lnWmax = copy(this.lnWmax);
    const c = new Int32Array(cap);
    c.set(this.curve.subarray(0, this.n));
    this.curve = c;
    this.capacity = cap;
  }

  /** Append a segment from node ia of magnitude arrays magA to node ib of magB (per band). */
  add(magA: Float64Array[], ia: number, magB: Float64Array[], ib: number, c0: number, c1: number, c2: number, curve: number): void {
    if (this.n === this.capacity) this.grow(this.capacity * 2);
    const k = this.n++;
    for (let b = 0; b < this.nBands; b++) {
      const a = magA[b][ia];
      const e = magB[b][ib] - a;
      this.start[b][k] = a;
      this.delta[b][k] = e;
      this.lo[b][k] = e < 0 ? a + e : a;
      this.hi[b][k] = e < 0 ? a : a + e;
    }
    this.c0[k] = c0;
    this.c1[k] = c1;
    this.c2[k] = c2;
    // Max of a quadratic on [0, 1]: at an end, or at the vertex when c2 < 0 and it lies inside.
    let m = Math.max(c0, c0 + c1 + c2);
    if (c2 < 0) {
      const tv = -c1 / (2 * c2);
      if (tv > 0 && tv < 1) m = Math.max(m, c0 + c1 * tv + c2 * tv * tv);
    }
    this.lnWmax[k] = m;
    this.curve[k] = curve;
  }
}

/**
 * [max over segments of lnWmax + lw, max over segments of lnWmax + lw - ln |e|]: the largest peak weight,
 * and the largest peak weight per unit magnitude length, of the segments in use (curve -1 or a multiple of
 * step). Used to bound what a segment outside a query radius could contribute.
 */
export function segmentBounds(set: SegmentSet, lnCW: Float64Array | undefined, step: number, out: Float64Array): void {
  let w = -Infinity;
  let d = -Infinity;
  for (let s = 0; s < set.n; s++) {
    const c = set.curve[s];
    if (c >= 0 && c % step !== 0) continue;
    const lw = set.lnWmax[s] + (lnCW === undefined ? 0 : lnCW[c]);
    let e2 = 0;
    for (let b = 0; b < set.nBands; b++) e2 += set.delta[b][s] * set.delta[b][s];
    if (lw > w) w = lw;
    const ld = lw - 0.5 * Math.log(Math.max(e2, 1e-300));
    if (ld > d) d = ld;
  }
  out[0] = w;
  out[1] = d;
}

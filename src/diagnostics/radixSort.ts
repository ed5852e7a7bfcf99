/**
 * Sorting of doubles by radix sort on their IEEE-754 bit patterns (most significant digit first, see
 * msdSort).
 *
 * The diagnostics rank and sort ~10^7 draws several times per parameter. The engine's comparison sort takes
 * over a second for that, cannot carry the original positions along (ranks need them), and ranking by
 * binary search into a sorted copy thrashes the cache. A radix pass is sequential and linear. Written here
 * because no standalone @stdlib package sorts typed arrays with an index payload.
 *
 * Each draw is one record of three 32-bit words (key high, key low, original position) in one array, so
 * that a radix pass writes one stream per bucket instead of three; the passes alternate between the array
 * and a scratch copy instead of copying back after each one.
 *
 * NaN must not be passed (callers check). -0 is keyed as +0, so equal values always have equal keys.
 */

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
const HI = LITTLE_ENDIAN ? 1 : 0;
const LO = 1 - HI;

/** Words per record: key high, key low, position. */
const REC = 3;

/**
 * Records of `values`: order-preserving unsigned keys (all bits of negatives flipped, the sign bit of the
 * rest) and the position.
 */
function recordsOf(parts: readonly Float64Array[]): Uint32Array {
  let total = 0;
  for (const p of parts) total += p.length;
  const rec = new Uint32Array(REC * total);
  let i = 0;
  for (const values of parts) {
    const words = new Uint32Array(values.buffer, values.byteOffset, 2 * values.length);
    for (let j = 0; j < values.length; j++, i++) {
      let w = words[2 * j + HI];
      let l = words[2 * j + LO];
      if (w === 0x80000000 && l === 0) w = 0; // -0 keyed as +0
      if (w & 0x80000000) {
        w = ~w;
        l = ~l;
      } else {
        w |= 0x80000000;
      }
      rec[REC * i] = w >>> 0;
      rec[REC * i + 1] = l >>> 0;
      rec[REC * i + 2] = i;
    }
  }
  return rec;
}

/** Buckets of fewer keys than this are finished by insertion sort. */
const SMALL = 24;
/** Widest digit: 2048 buckets fit the first-level caches' reach; smaller ranges use narrower digits. */
const MAX_DIGIT_BITS = 11;

function digitAt(hi: number, lo: number, b0: number, bits: number, mask: number): number {
  if (b0 >= 32) return (hi >>> (b0 - 32)) & mask;
  if (b0 + bits <= 32) return (lo >>> b0) & mask;
  return ((lo >>> b0) | (hi << (32 - b0))) & mask;
}

/**
 * Most-significant-digit radix sort of the records, in place (stable: equal keys keep their order).
 * Posterior draws of one parameter usually share sign, exponent and the leading mantissa bits, so the
 * first digit is taken just below the bits that all keys share; two 11-bit digits then leave buckets of a
 * few keys, which insertion sort finishes.
 */
function msdSort(rec: Uint32Array): void {
  const n = rec.length / REC;
  if (n < 2) return;
  let diffHi = 0;
  let diffLo = 0;
  const hi0 = rec[0];
  const lo0 = rec[1];
  for (let i = 1; i < n; i++) {
    diffHi |= rec[REC * i] ^ hi0;
    diffLo |= rec[REC * i + 1] ^ lo0;
  }
  const top = diffHi !== 0 ? 63 - Math.clz32(diffHi) : diffLo !== 0 ? 31 - Math.clz32(diffLo) : -1;
  if (top < 0) return; // all keys equal
  const sorter = new Sorter(rec);
  sorter.sortRange(rec, new Uint32Array(rec.length), 0, n, top, 0);
}

class Sorter {
  /** Bucket counts per recursion depth, reused by siblings. */
  private readonly counts: Uint32Array[] = [];
  private readonly next: Uint32Array[] = [];

  constructor(private readonly main: Uint32Array) {}

  /**
   * Sort records [start, end) of `src` (which is `main` or the scratch array) into `main`, using `dst`
   * (the other one) as scratch.
   */
  sortRange(src: Uint32Array, dst: Uint32Array, start: number, end: number, top: number, depth: number): void {
    const main = this.main;
    if (end - start <= SMALL || top < 0) {
      if (src !== main) main.set(src.subarray(REC * start, REC * end), REC * start);
      insertionSort(main, start, end);
      return;
    }
    // About four keys per bucket for small ranges, 2048 buckets at most.
    const bits = Math.min(MAX_DIGIT_BITS, Math.max(4, Math.ceil(Math.log2((end - start) / 4))), top + 1);
    const buckets = 1 << bits;
    const mask = buckets - 1;
    const b0 = top - bits + 1;
    if (!this.counts[depth]) {
      this.counts[depth] = new Uint32Array((1 << MAX_DIGIT_BITS) + 1);
      this.next[depth] = new Uint32Array(1 << MAX_DIGIT_BITS);
    }
    const counts = this.counts[depth];
    const next = this.next[depth];
    counts.fill(0, 0, buckets + 1);
    for (let i = start; i < end; i++) counts[digitAt(src[REC * i], src[REC * i + 1], b0, bits, mask) + 1]++;
    for (let d = 0; d < buckets; d++) counts[d + 1] += counts[d];
    for (let d = 0; d < buckets; d++) next[d] = counts[d];
    for (let i = start; i < end; i++) {
      const h = src[REC * i];
      const l = src[REC * i + 1];
      const at = REC * (start + next[digitAt(h, l, b0, bits, mask)]++);
      dst[at] = h;
      dst[at + 1] = l;
      dst[at + 2] = src[REC * i + 2];
    }
    if (b0 === 0) {
      // Every bit used: buckets hold equal keys, already in stable order.
      if (dst !== main) main.set(dst.subarray(REC * start, REC * end), REC * start);
      return;
    }
    for (let d = 0; d < buckets; d++) {
      const a = start + counts[d];
      const b = start + counts[d + 1];
      if (b - a > 1) this.sortRange(dst, src, a, b, b0 - 1, depth + 1);
      else if (b - a === 1 && dst !== main) {
        main[REC * a] = dst[REC * a];
        main[REC * a + 1] = dst[REC * a + 1];
        main[REC * a + 2] = dst[REC * a + 2];
      }
    }
  }
}

function insertionSort(r: Uint32Array, start: number, end: number): void {
  for (let a = start + 1; a < end; a++) {
    const h = r[REC * a];
    const l = r[REC * a + 1];
    const v = r[REC * a + 2];
    let b = a - 1;
    while (b >= start && (r[REC * b] > h || (r[REC * b] === h && r[REC * b + 1] > l))) {
      r[REC * b + 3] = r[REC * b];
      r[REC * b + 4] = r[REC * b + 1];
      r[REC * b + 5] = r[REC * b + 2];
      b--;
    }
    r[REC * b + 3] = h;
    r[REC * b + 4] = l;
    r[REC * b + 5] = v;
  }
}

/** Sorted values and the order that sorts them: sorted[k] = values[order[k]] (except -0, returned as +0). */
export interface Sorted {
  order: Uint32Array;
  sorted: Float64Array;
}

/** Sorted records of `values` (several arrays are taken as one, one after the other). */
function sortedRecords(values: Float64Array | readonly Float64Array[]): Uint32Array {
  const rec = recordsOf(values instanceof Float64Array ? [values] : values);
  msdSort(rec);
  return rec;
}

/**
 * Indices that sort `values` ascending (stable), with the sorted values. Several arrays (chains) are
 * sorted as if pooled into one, one after the other, without the pooled copy. The sorted values go into
 * `sortedOut` when given (a view of its first values.length entries is returned).
 */
export function argsortWithValues(values: Float64Array | readonly Float64Array[], sortedOut?: Float64Array): Sorted {
  const rec = sortedRecords(values);
  const order = new Uint32Array(rec.length / REC);
  for (let i = 0; i < order.length; i++) order[i] = rec[REC * i + 2];
  return { order, sorted: valuesOfRecords(rec, sortedOut) };
}

/** Indices that sort `values` ascending (stable). */
export function argsort(values: Float64Array): Uint32Array {
  return argsortWithValues(values).order;
}

/** A sorted copy of `values` (-0 comes back as +0). */
export function sortedCopy(values: Float64Array): Float64Array {
  return valuesOfRecords(sortedRecords(values));
}

/** The values the records' keys stand for. */
function valuesOfRecords(rec: Uint32Array, into?: Float64Array): Float64Array {
  const n = rec.length / REC;
  if (into && into.length < n) throw new RangeError(`the output holds ${into.length} values, fewer than ${n}`);
  const out = into ? into.subarray(0, n) : new Float64Array(n);
  const words = new Uint32Array(out.buffer, out.byteOffset, 2 * n);
  for (let i = 0; i < out.length; i++) {
    const hi = rec[REC * i];
    const lo = rec[REC * i + 1];
    if (hi & 0x80000000) {
      words[2 * i + HI] = hi & 0x7fffffff;
      words[2 * i + LO] = lo;
    } else {
      words[2 * i + HI] = ~hi >>> 0;
      words[2 * i + LO] = ~lo >>> 0;
    }
  }
  return out;
}

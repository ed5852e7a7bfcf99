/**
 * Sorting of doubles by radix sort on their IEEE-754 bit patterns (most significant digit first, see
 * msdSort).
 *
 * The diagnostics rank and sort ~10^7 draws several times per parameter. The engine's comparison sort takes
 * over a second for that, cannot carry the original positions along (ranks need them), and ranking by
 * binary search into a sorted copy thrashes the cache. A radix pass is sequential and linear. Written here
 * because no standalone @stdlib package sorts typed arrays with an index payload.
 *
 * NaN must not be passed (callers check). -0 is keyed as +0, so equal values always have equal keys.
 */

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
const HI = LITTLE_ENDIAN ? 1 : 0;
const LO = 1 - HI;

/** Order-preserving unsigned keys: flip all bits of negatives, the sign bit of the rest. */
function keysOf(values: Float64Array): { hi: Uint32Array<ArrayBuffer>; lo: Uint32Array<ArrayBuffer> } {
  const n = values.length;
  const words = new Uint32Array(values.buffer, values.byteOffset, 2 * n);
  const hi = new Uint32Array(n);
  const lo = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    let w = words[2 * i + HI];
    let l = words[2 * i + LO];
    if (w === 0x80000000 && l === 0) w = 0; // -0 keyed as +0
    if (w & 0x80000000) {
      w = ~w;
      l = ~l;
    } else {
      w |= 0x80000000;
    }
    hi[i] = w >>> 0;
    lo[i] = l >>> 0;
  }
  return { hi, lo };
}

/** The value a key stands for. */
function valueOfKey(hi: number, lo: number, words: Uint32Array, i: number): void {
  if (hi & 0x80000000) {
    words[2 * i + HI] = hi & 0x7fffffff;
    words[2 * i + LO] = lo;
  } else {
    words[2 * i + HI] = ~hi >>> 0;
    words[2 * i + LO] = ~lo >>> 0;
  }
}

type U32 = Uint32Array<ArrayBuffer>;

/** Buckets of fewer keys than this are finished by insertion sort. */
const SMALL = 24;
/** Widest digit: 2048 buckets fit the first-level caches' reach; smaller ranges use narrower digits. */
const MAX_DIGIT_BITS = 11;

/**
 * Most-significant-digit radix sort of keys (hi, lo) with a payload, in place. Posterior draws of one
 * parameter usually share sign, exponent and the leading mantissa bits, so the first digit is taken just
 * below the bits that all keys share; two 11-bit digits then leave buckets of a few keys, which insertion
 * sort finishes. Stable: equal keys keep their order.
 */
function msdSort(hi: U32, lo: U32, payload: U32): void {
  const n = hi.length;
  if (n < 2) return;
  let diffHi = 0;
  let diffLo = 0;
  for (let i = 1; i < n; i++) {
    diffHi |= hi[i] ^ hi[0];
    diffLo |= lo[i] ^ lo[0];
  }
  const top = diffHi !== 0 ? 63 - Math.clz32(diffHi) : diffLo !== 0 ? 31 - Math.clz32(diffLo) : -1;
  if (top < 0) return; // all keys equal
  const scratch = { hi: new Uint32Array(n), lo: new Uint32Array(n), p: new Uint32Array(n) };
  sortRange(hi, lo, payload, scratch, 0, n, top);
}

function digitAt(hi: number, lo: number, b0: number, bits: number, mask: number): number {
  if (b0 >= 32) return (hi >>> (b0 - 32)) & mask;
  if (b0 + bits <= 32) return (lo >>> b0) & mask;
  return ((lo >>> b0) | (hi << (32 - b0))) & mask;
}

function sortRange(hi: U32, lo: U32, p: U32, s: { hi: U32; lo: U32; p: U32 }, start: number, end: number, top: number): void {
  if (end - start <= SMALL || top < 0) {
    insertionSort(hi, lo, p, start, end);
    return;
  }
  // About four keys per bucket for small ranges, 2048 buckets at most.
  const bits = Math.min(MAX_DIGIT_BITS, Math.max(4, Math.ceil(Math.log2((end - start) / 4))), top + 1);
  const buckets = 1 << bits;
  const mask = buckets - 1;
  const b0 = top - bits + 1;
  const counts = new Uint32Array(buckets + 1);
  for (let i = start; i < end; i++) counts[digitAt(hi[i], lo[i], b0, bits, mask) + 1]++;
  for (let d = 0; d < buckets; d++) counts[d + 1] += counts[d];
  const next = counts.slice(0, buckets);
  for (let i = start; i < end; i++) {
    const dest = start + next[digitAt(hi[i], lo[i], b0, bits, mask)]++;
    s.hi[dest] = hi[i];
    s.lo[dest] = lo[i];
    s.p[dest] = p[i];
  }
  hi.set(s.hi.subarray(start, end), start);
  lo.set(s.lo.subarray(start, end), start);
  p.set(s.p.subarray(start, end), start);
  if (b0 === 0) return; // every bit used: buckets hold equal keys, already in stable order
  for (let d = 0; d < buckets; d++) {
    const a = start + counts[d];
    const b = start + counts[d + 1];
    if (b - a > 1) sortRange(hi, lo, p, s, a, b, b0 - 1);
  }
}

function insertionSort(hi: U32, lo: U32, p: U32, start: number, end: number): void {
  for (let a = start + 1; a < end; a++) {
    const h = hi[a];
    const l = lo[a];
    const v = p[a];
    let b = a - 1;
    while (b >= start && (hi[b] > h || (hi[b] === h && lo[b] > l))) {
      hi[b + 1] = hi[b];
      lo[b + 1] = lo[b];
      p[b + 1] = p[b];
      b--;
    }
    hi[b + 1] = h;
    lo[b + 1] = l;
    p[b + 1] = v;
  }
}

/** Sort keys (hi, lo) and a payload; returns the arrays that hold the result. */
function radix(hi: U32, lo: U32, payload: U32 | undefined): { hi: U32; lo: U32; payload: U32 | undefined } {
  const p = payload ?? new Uint32Array(hi.length);
  msdSort(hi, lo, p);
  return { hi, lo, payload };
}

/** Sorted values and the order that sorts them: sorted[k] = values[order[k]] (except -0, returned as +0). */
export interface Sorted {
  order: Uint32Array;
  sorted: Float64Array;
}

/** Indices that sort `values` ascending (stable), with the sorted values. */
export function argsortWithValues(values: Float64Array): Sorted {
  const k = keysOf(values);
  const idx = new Uint32Array(values.length);
  for (let i = 0; i < idx.length; i++) idx[i] = i;
  const { hi, lo, payload } = radix(k.hi, k.lo, idx);
  return { order: payload as Uint32Array, sorted: valuesOfKeys(hi, lo) };
}

/** Indices that sort `values` ascending (stable). */
export function argsort(values: Float64Array): Uint32Array {
  return argsortWithValues(values).order;
}

/** A sorted copy of `values` (-0 comes back as +0). */
export function sortedCopy(values: Float64Array): Float64Array {
  const k = keysOf(values);
  const { hi, lo } = radix(k.hi, k.lo, undefined);
  return valuesOfKeys(hi, lo);
}

function valuesOfKeys(hi: Uint32Array, lo: Uint32Array): Float64Array {
  const out = new Float64Array(hi.length);
  const words = new Uint32Array(out.buffer);
  for (let i = 0; i < out.length; i++) valueOfKey(hi[i], lo[i], words, i);
  return out;
}

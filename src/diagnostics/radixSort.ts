/**
 * Sorting of doubles by least-significant-digit radix sort on their IEEE-754 bit patterns: six stable
 * counting passes of 11, 11 and 10 bits over the low and then the high 32-bit word, each skipped when every
 * key has the same digit there.
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

const DIGITS: readonly [number, number][] = [
  [0, 0x7ff],
  [11, 0x7ff],
  [22, 0x3ff],
];
const counts = new Uint32Array(2048);

/** Start offsets of each digit value; false when all keys share the digit (the pass can be skipped). */
function offsets(key: Uint32Array, shift: number, mask: number): boolean {
  const n = key.length;
  counts.fill(0);
  for (let i = 0; i < n; i++) counts[(key[i] >>> shift) & mask]++;
  let sum = 0;
  for (let d = 0; d <= mask; d++) {
    const c = counts[d];
    if (c === n) return false;
    counts[d] = sum;
    sum += c;
  }
  return true;
}

type U32 = Uint32Array<ArrayBuffer>;

/** Stable LSD passes over the digits of `key`, moving `other` and the payload along. */
function passes(key: U32, other: U32, payload: U32 | undefined, key2: U32, other2: U32, payload2: U32 | undefined): { key: U32; other: U32; payload: U32 | undefined; key2: U32; other2: U32; payload2: U32 | undefined } {
  const n = key.length;
  for (const [shift, mask] of DIGITS) {
    if (!offsets(key, shift, mask)) continue;
    if (payload && payload2) {
      for (let i = 0; i < n; i++) {
        const k = key[i];
        const dest = counts[(k >>> shift) & mask]++;
        key2[dest] = k;
        other2[dest] = other[i];
        payload2[dest] = payload[i];
      }
      [payload, payload2] = [payload2, payload];
    } else {
      for (let i = 0; i < n; i++) {
        const k = key[i];
        const dest = counts[(k >>> shift) & mask]++;
        key2[dest] = k;
        other2[dest] = other[i];
      }
    }
    [key, key2] = [key2, key];
    [other, other2] = [other2, other];
  }
  return { key, other, payload, key2, other2, payload2 };
}

/** Longest run of equal keys that insertion sort may finish; longer runs make us do the full radix sort. */
const MAX_RUN = 64;

/**
 * Sorts by (hi, lo) with a payload. The high word holds the sign, the exponent and 20 bits of mantissa,
 * which nearly always tell ~10^7 posterior draws apart; so it is radix-sorted first, and the short runs of
 * equal high words are finished by insertion sort on the low word. Only if some run is long (draws packed
 * into a relative width below ~1e-6) are the low words radix-sorted too.
 */
function radix(hi: U32, lo: U32, payload: U32 | undefined): { hi: U32; lo: U32; payload: U32 | undefined } {
  const n = hi.length;
  const scratchA = new Uint32Array(n);
  const scratchB = new Uint32Array(n);
  const scratchP = payload ? new Uint32Array(n) : undefined;
  const byHi = passes(hi, lo, payload, scratchA, scratchB, scratchP);
  hi = byHi.key;
  lo = byHi.other;
  payload = byHi.payload;
  let i = 0;
  let short = true;
  while (i < n && short) {
    let j = i;
    while (j + 1 < n && hi[j + 1] === hi[i]) j++;
    if (j - i + 1 > MAX_RUN) short = false;
    i = j + 1;
  }
  if (!short) {
    // Full LSD order: low word first, then the high word (stable passes keep the low-word order).
    const byLo = passes(lo, hi, payload, byHi.other2, byHi.key2, byHi.payload2);
    const again = passes(byLo.other, byLo.key, byLo.payload, byLo.other2, byLo.key2, byLo.payload2);
    return { hi: again.key, lo: again.other, payload: again.payload };
  }
  for (let start = 0; start < n; ) {
    let end = start + 1;
    while (end < n && hi[end] === hi[start]) end++;
    for (let a = start + 1; a < end; a++) {
      const l = lo[a];
      const p = payload ? payload[a] : 0;
      let b = a - 1;
      while (b >= start && lo[b] > l) {
        lo[b + 1] = lo[b];
        if (payload) payload[b + 1] = payload[b];
        b--;
      }
      lo[b + 1] = l;
      if (payload) payload[b + 1] = p;
    }
    start = end;
  }
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

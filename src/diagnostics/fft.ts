/**
 * A complex fast Fourier transform of power-of-two length (iterative radix-2 Cooley-Tukey, decimation in
 * time).
 *
 * Written by hand because no standalone @stdlib package provides an FFT (only the umbrella package does,
 * which the project does not install), and the diagnostics need nothing more: every FFT here computes an
 * autocovariance, whose input is zero-padded anyway, so the length can always be a power of two and no
 * mixed-radix or Bluestein transform is needed.
 *
 * Speed matters (diagnostics of a 10^7-draw run transform thousands of series), hence plans cached per
 * length, twiddle factors stored contiguously per stage, and the first two stages (twiddles 1 and -i)
 * done without multiplications.
 */

interface Plan {
  n: number;
  /** Pairs (i, j), i < j, to swap for the bit-reversal permutation. */
  swaps: Uint32Array;
  /** Twiddles of stage s (half-size h = 2^s, s >= 2) at offset h - 4 .. 2h - 4: cos and sin of -2 pi k / (2h). */
  cos: Float64Array;
  sin: Float64Array;
}

const plans = new Map<number, Plan>();

function plan(n: number): Plan {
  let p = plans.get(n);
  if (p) return p;
  if (n < 1 || (n & (n - 1)) !== 0) throw new RangeError(`FFT length must be a power of two, got ${n}`);
  const bits = Math.round(Math.log2(n));
  const swapList: number[] = [];
  for (let i = 0; i < n; i++) {
    let r = 0;
    for (let b = 0, v = i; b < bits; b++, v >>= 1) r = (r << 1) | (v & 1);
    if (r > i) swapList.push(i, r);
  }
  const size = Math.max(n - 4, 0);
  const cos = new Float64Array(size);
  const sin = new Float64Array(size);
  for (let h = 4; h < n; h <<= 1) {
    for (let k = 0; k < h; k++) {
      const angle = (-Math.PI * k) / h;
      cos[h - 4 + k] = Math.cos(angle);
      sin[h - 4 + k] = Math.sin(angle);
    }
  }
  p = { n, swaps: Uint32Array.from(swapList), cos, sin };
  plans.set(n, p);
  return p;
}

/** Smallest power of two >= n (1 for n <= 1). */
export function nextPowerOfTwo(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/**
 * In-place DFT of (re, im), both of power-of-two length n: X_k = sum_j x_j exp(-2 pi i j k / n).
 * With `inverse`, the sign of the exponent flips; no 1/n factor is applied in either direction.
 */
export function fftInPlace(re: Float64Array, im: Float64Array, inverse = false): void {
  const n = re.length;
  if (im.length !== n) throw new RangeError('real and imaginary parts must have the same length');
  if (n <= 1) return;
  const { swaps, cos, sin } = plan(n);
  for (let s = 0; s < swaps.length; s += 2) {
    const i = swaps[s];
    const j = swaps[s + 1];
    let t = re[i];
    re[i] = re[j];
    re[j] = t;
    t = im[i];
    im[i] = im[j];
    im[j] = t;
  }
  // Stage of size 2: twiddle 1.
  for (let a = 0; a < n; a += 2) {
    const xr = re[a + 1];
    const xi = im[a + 1];
    re[a + 1] = re[a] - xr;
    im[a + 1] = im[a] - xi;
    re[a] += xr;
    im[a] += xi;
  }
  if (n === 2) return;
  // Stage of size 4: twiddles 1 and -i (or +i for the inverse).
  const sg = inverse ? -1 : 1;
  for (let a = 0; a < n; a += 4) {
    let xr = re[a + 2];
    let xi = im[a + 2];
    re[a + 2] = re[a] - xr;
    im[a + 2] = im[a] - xi;
    re[a] += xr;
    im[a] += xi;
    // (re + i im) * (-i sg) = sg (im - i re)
    xr = sg * im[a + 3];
    xi = -sg * re[a + 3];
    re[a + 3] = re[a + 1] - xr;
    im[a + 3] = im[a + 1] - xi;
    re[a + 1] += xr;
    im[a + 1] += xi;
  }
  // Remaining stages two at a time (radix 2^2): stages of half-size h and 2h in one sweep through memory.
  // For the four points a, a+h, a+2h, a+3h: the first stage uses twiddle w1 = exp(-i pi k / h) on both
  // pairs, the second w2 = exp(-i pi k / 2h) and w2 times -i (+i inverse).
  let h = 4;
  for (; 2 * h < n; h <<= 2) {
    const h2 = h << 1;
    const size = h << 2;
    const off1 = h - 4;
    const off2 = h2 - 4;
    for (let start = 0; start < n; start += size) {
      for (let k = 0; k < h; k++) {
        const w1r = cos[off1 + k];
        const w1i = sg * sin[off1 + k];
        const w2r = cos[off2 + k];
        const w2i = sg * sin[off2 + k];
        const a0 = start + k;
        const a1 = a0 + h;
        const a2 = a1 + h;
        const a3 = a2 + h;
        const x1r = re[a1] * w1r - im[a1] * w1i;
        const x1i = re[a1] * w1i + im[a1] * w1r;
        const x3r = re[a3] * w1r - im[a3] * w1i;
        const x3i = re[a3] * w1i + im[a3] * w1r;
        const t0r = re[a0] + x1r;
        const t0i = im[a0] + x1i;
        const t1r = re[a0] - x1r;
        const t1i = im[a0] - x1i;
        const t2r = re[a2] + x3r;
        const t2i = im[a2] + x3i;
        const t3r = re[a2] - x3r;
        const t3i = im[a2] - x3i;
        const c2r = t2r * w2r - t2i * w2i;
        const c2i = t2r * w2i + t2i * w2r;
        // t3 w2 (-i sg) = sg (Im(t3 w2) - i Re(t3 w2))
        const u3r = t3r * w2r - t3i * w2i;
        const u3i = t3r * w2i + t3i * w2r;
        const c3r = sg * u3i;
        const c3i = -sg * u3r;
        re[a0] = t0r + c2r;
        im[a0] = t0i + c2i;
        re[a2] = t0r - c2r;
        im[a2] = t0i - c2i;
        re[a1] = t1r + c3r;
        im[a1] = t1i + c3i;
        re[a3] = t1r - c3r;
        im[a3] = t1i - c3i;
      }
    }
  }
  // A last single stage when the number of stages left was odd.
  if (h < n) {
    const off = h - 4;
    for (let a = 0; a < h; a++) {
      const wr = cos[off + a];
      const wi = sg * sin[off + a];
      const b = a + h;
      const br = re[b];
      const bi = im[b];
      const xr = br * wr - bi * wi;
      const xi = br * wi + bi * wr;
      re[b] = re[a] - xr;
      im[b] = im[a] - xi;
      re[a] += xr;
      im[a] += xi;
    }
  }
}

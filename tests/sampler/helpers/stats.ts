/**
 * Test-side statistics for checking the sampler against exact answers: autocorrelation times, Monte Carlo
 * standard errors, and the Kolmogorov–Smirnov test. Kept in the tests (not src/) because the real
 * estimators belong to src/diagnostics; the τ estimator here is checked against emcee's
 * `autocorr.integrated_time` in emcee.test.ts.
 */

const twiddles = new Map<number, { cos: Float64Array; sin: Float64Array }>();

/** In-place iterative radix-2 complex FFT (Cooley & Tukey 1965); n must be a power of two. */
function fft(re: Float64Array, im: Float64Array, inverse: boolean): void {
  const n = re.length;
  let tw = twiddles.get(n);
  if (!tw) {
    tw = { cos: new Float64Array(n / 2), sin: new Float64Array(n / 2) };
    for (let k = 0; k < n / 2; k++) {
      tw.cos[k] = Math.cos((2 * Math.PI * k) / n);
      tw.sin[k] = Math.sin((2 * Math.PI * k) / n);
    }
    twiddles.set(n, tw);
  }
  const sign = inverse ? 1 : -1;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i];
      re[i] = re[j];
      re[j] = t;
      t = im[i];
      im[i] = im[j];
      im[j] = t;
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const half = len >> 1;
    const stride = n / len;
    for (let i = 0; i < n; i += len) {
      for (let k = 0; k < half; k++) {
        const wr = tw.cos[k * stride];
        const wi = sign * tw.sin[k * stride];
        const a = i + k + half;
        const tr = re[a] * wr - im[a] * wi;
        const ti = re[a] * wi + im[a] * wr;
        re[a] = re[i + k] - tr;
        im[a] = im[i + k] - ti;
        re[i + k] += tr;
        im[i + k] += ti;
      }
    }
  }
}

/** Normalised autocorrelation ρ(0..n-1) of a series, the 1/n-biased estimator, via zero-padded FFT. */
export function autocorrelation(x: Float64Array): Float64Array {
  return autocorrelationPair(x, x)[0];
}

/**
 * Autocorrelations of two real series of one length with one complex FFT each way: transform x + i y,
 * split the spectrum into the two real transforms by conjugate symmetry, and invert |X|^2 + i |Y|^2
 * (both real and even, so their inverses come out as the real and imaginary parts).
 */
export function autocorrelationPair(x: Float64Array, y: Float64Array): [Float64Array, Float64Array] {
  const n = x.length;
  let m = 1;
  while (m < 2 * n) m <<= 1;
  const re = new Float64Array(m);
  const im = new Float64Array(m);
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  for (let i = 0; i < n; i++) {
    re[i] = x[i] - mx;
    im[i] = y[i] - my;
  }
  fft(re, im, false);
  const px = new Float64Array(m);
  const py = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const j = (m - k) & (m - 1);
    // X_k = (Z_k + conj Z_j) / 2, Y_k = (Z_k - conj Z_j) / (2i)
    const xr = (re[k] + re[j]) / 2;
    const xi = (im[k] - im[j]) / 2;
    const yr = (im[k] + im[j]) / 2;
    const yi = -(re[k] - re[j]) / 2;
    px[k] = xr * xr + xi * xi;
    py[k] = yr * yr + yi * yi;
  }
  fft(px, py, true);
  const ax = new Float64Array(n);
  const ay = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    ax[i] = px[i] / px[0];
    ay[i] = py[i] / py[0];
  }
  return [ax, ay];
}

/**
 * Integrated autocorrelation time from an averaged autocorrelation function, with Sokal's (1997) automatic
 * window: τ(M) = 1 + 2 Σ_{t=1..M} ρ(t), M the smallest lag with M >= c τ(M), c = 5.
 */
export function tauFromAcf(rho: Float64Array, c = 5): number {
  let tau = 1;
  for (let m = 1; m < rho.length; m++) {
    tau += 2 * rho[m];
    if (m >= c * tau) return tau;
  }
  return tau;
}

/** τ per parameter of one ensemble's chain (rows x walkers x ndim), the walker-averaged ACF as in emcee. */
export function integratedTime(chain: Float64Array, nRows: number, nWalkers: number, ndim: number, c = 5): Float64Array {
  const out = new Float64Array(ndim);
  const a = new Float64Array(nRows);
  const b = new Float64Array(nRows);
  for (let j = 0; j < ndim; j++) {
    const avg = new Float64Array(nRows);
    for (let w = 0; w < nWalkers; w += 2) {
      const w2 = Math.min(w + 1, nWalkers - 1);
      for (let t = 0; t < nRows; t++) {
        a[t] = chain[(t * nWalkers + w) * ndim + j];
        b[t] = chain[(t * nWalkers + w2) * ndim + j];
      }
      const [ra, rb] = autocorrelationPair(a, b);
      for (let t = 0; t < nRows; t++) avg[t] += ra[t] / nWalkers;
      if (w2 !== w) for (let t = 0; t < nRows; t++) avg[t] += rb[t] / nWalkers;
    }
    out[j] = tauFromAcf(avg, c);
  }
  return out;
}

/**
 * The estimate of E[g] from K ensembles, with its Monte Carlo standard error. For each ensemble the
 * series y_t = mean over walkers of g at step t is formed; its variance times its integrated
 * autocorrelation time over N steps is the variance of that ensemble's estimate (the usual MCSE,
 * e.g. Sokal 1997 eq. 2.20), which counts the correlation between walkers of one ensemble as well as
 * along the chain. The ACF is averaged over the K ensembles (independent), so the window is stable.
 * The K estimates are averaged; their variances add in quadrature.
 */
export function meanWithMcse(series: Float64Array[]): { mean: number; mcse: number; tau: number } {
  const K = series.length;
  const n = series[0].length;
  const acf = new Float64Array(n);
  const means: number[] = [];
  const vars: number[] = [];
  for (const y of series) {
    let m = 0;
    for (let t = 0; t < n; t++) m += y[t];
    m /= n;
    let v = 0;
    for (let t = 0; t < n; t++) v += (y[t] - m) ** 2;
    v /= n;
    means.push(m);
    vars.push(v);
    const r = autocorrelation(y);
    for (let t = 0; t < n; t++) acf[t] += r[t] / K;
  }
  const tau = tauFromAcf(acf);
  const mean = means.reduce((a, b) => a + b, 0) / K;
  const varMean = vars.reduce((a, v) => a + (v * tau) / n, 0) / (K * K);
  return { mean, mcse: Math.sqrt(varMean), tau };
}

/**
 * Survival function of the Kolmogorov distribution, Q(λ) = 2 Σ_{k>=1} (-1)^(k-1) exp(-2 k^2 λ^2)
 * (Kolmogorov 1933), evaluated at λ = (sqrt(n) + 0.12 + 0.11 / sqrt(n)) D, Stephens' (1970) finite-n
 * correction: the p-value of the one-sample KS statistic D for n draws.
 */
export function ksPValue(d: number, n: number): number {
  const sn = Math.sqrt(n);
  const lambda = (sn + 0.12 + 0.11 / sn) * d;
  return kolmogorovQ(lambda);
}

export function kolmogorovQ(lambda: number): number {
  if (lambda < 0.2) return 1;
  let sum = 0;
  for (let k = 1; k <= 100; k++) {
    const term = Math.exp(-2 * k * k * lambda * lambda);
    sum += (k % 2 === 1 ? 1 : -1) * term;
    if (term < 1e-16) break;
  }
  return Math.min(1, Math.max(0, 2 * sum));
}

/** One-sample KS statistic of `xs` against the CDF `cdf`. */
export function ksStatistic(xs: Float64Array, cdf: (x: number) => number): number {
  const s = Float64Array.from(xs).sort();
  const n = s.length;
  let d = 0;
  for (let i = 0; i < n; i++) {
    const f = cdf(s[i]);
    d = Math.max(d, (i + 1) / n - f, f - i / n);
  }
  return d;
}

/** Standard normal CDF via erfc (stdlib). */
import erfc from '@stdlib/math-base-special-erfc';
export function normalCdf(x: number, mean = 0, sd = 1): number {
  return 0.5 * erfc(-(x - mean) / (sd * Math.SQRT2));
}

/**
 * Autocovariances through the FFT, for the ESS (posterior's convention) and for tau (emcee's convention).
 *
 * Both references zero-pad each centred series to at least twice its length, transform, take the squared
 * modulus and transform back. The result at lag t is then exactly sum_i y_i y_{i+t}. Padding to any length
 * M >= n + maxLag gives the same sums for lags 0..maxLag (the circular wrap-around only reaches lags above
 * M - n), so we pad to the next power of two above n + maxLag and let callers ask for only the lags they
 * use. Two real series share one complex transform (x + iy), which halves the work.
 */
import { fftInterleaved, nextPowerOfTwo } from './fft.js';
import { mean, sumSquaredDeviations } from './moments.js';

/**
 * The weighted sum over series of their lag sums sum_j y_j y_{j+t} (y = series minus its mean), for
 * t = 0..maxLag. The inverse transform is linear, so the series' power spectra are summed first and
 * transformed back once.
 */
function weightedLagSums(series: readonly Float64Array[], weights: Float64Array, maxLag: number): Float64Array {
  const n = series[0].length;
  const m = nextPowerOfTwo(n + maxLag);
  // Complex values interleaved (re, im): x in the real part, y in the imaginary part, zero-padded.
  const z = new Float64Array(2 * m);
  const power = new Float64Array(2 * m);
  const half = m >> 1;
  for (let s = 0; s < series.length; s += 2) {
    const x = series[s];
    const y = s + 1 < series.length ? series[s + 1] : undefined;
    const wx = weights[s];
    const wy = y ? weights[s + 1] : 0;
    const mx = mean(x);
    if (y) {
      const my = mean(y);
      for (let i = 0; i < n; i++) {
        z[2 * i] = x[i] - mx;
        z[2 * i + 1] = y[i] - my;
      }
    } else {
      for (let i = 0; i < n; i++) {
        z[2 * i] = x[i] - mx;
        z[2 * i + 1] = 0;
      }
    }
    z.fill(0, 2 * n);
    fftInterleaved(z);
    // Separate the two spectra: X_k = (Z_k + conj Z_{m-k}) / 2, Y_k = (Z_k - conj Z_{m-k}) / 2i.
    power[0] += wx * z[0] * z[0] + wy * z[1] * z[1];
    if (m > 1) power[2 * half] += wx * z[2 * half] * z[2 * half] + wy * z[2 * half + 1] * z[2 * half + 1];
    for (let k = 1; k < half; k++) {
      const ar = z[2 * k];
      const ai = z[2 * k + 1];
      const br = z[2 * (m - k)];
      const bi = z[2 * (m - k) + 1];
      const px = (ar + br) * (ar + br) + (ai - bi) * (ai - bi);
      const py = (ar - br) * (ar - br) + (ai + bi) * (ai + bi);
      const p = 0.25 * (wx * px + wy * py);
      power[2 * k] += p;
      power[2 * (m - k)] += p;
    }
  }
  fftInterleaved(power, true);
  const out = new Float64Array(maxLag + 1);
  for (let t = 0; t <= maxLag; t++) out[t] = power[2 * t] / m;
  return out;
}

function checkLag(n: number, maxLag: number): void {
  if (!(Number.isInteger(maxLag) && maxLag >= 0 && maxLag < n)) throw new RangeError(`maxLag must be an integer in [0, ${n - 1}], got ${maxLag}`);
}

/**
 * Biased autocovariance of one series (divided by n), lags 0..maxLag, as posterior's `autocovariance`
 * computes it; all zeros when the series is constant.
 */
export function autocovariance(x: Float64Array, maxLag: number = x.length - 1): Float64Array {
  return meanAutocovariance([x], maxLag);
}

/**
 * Mean over chains of each chain's biased autocovariance, lags 0..maxLag (posterior's `rowMeans2(acov)`).
 * posterior scales each chain's FFT sums by var(x) (n - 1) / n over their lag-0 value, i.e. by 1/n up to
 * rounding, which is what lets the spectra be summed before one inverse transform.
 */
export function meanAutocovariance(chains: readonly Float64Array[], maxLag: number): Float64Array {
  const n = chains[0]?.length ?? 0;
  checkLag(n, maxLag);
  const weights = new Float64Array(chains.length).fill(1 / (n * chains.length));
  return weightedLagSums(chains, weights, maxLag);
}

/**
 * Mean over chains of each chain's normalised autocorrelation (1 at lag 0), lags 0..maxLag, as emcee's
 * `integrated_time` averages `function_1d` over walkers. Each chain is weighted by its own sum of squares;
 * a constant chain makes the result NaN, as in emcee.
 */
export function meanAutocorrelation(chains: readonly Float64Array[], maxLag: number): Float64Array {
  const n = chains[0]?.length ?? 0;
  checkLag(n, maxLag);
  const weights = new Float64Array(chains.length);
  for (let c = 0; c < chains.length; c++) {
    const ss = sumSquaredDeviations(chains[c], mean(chains[c]));
    if (ss === 0) return new Float64Array(maxLag + 1).fill(NaN);
    weights[c] = 1 / (ss * chains.length);
  }
  return weightedLagSums(chains, weights, maxLag);
}

/**
 * Runs `attempt(maxLag)` with growing lag ranges until it returns a result. Estimators whose window is
 * usually short (tau's, the ESS's Geyer truncation) ask for all lags only when they need them.
 */
export function withGrowingLags<T>(n: number, attempt: (maxLag: number) => T | undefined): T {
  // Start with every lag that the smallest FFT above 9n/8 gives exactly.
  let maxLag = Math.min(n - 1, nextPowerOfTwo(n + Math.ceil(n / 8)) - n);
  for (;;) {
    const r = attempt(maxLag);
    if (r !== undefined) return r;
    if (maxLag >= n - 1) throw new Error('estimator asked for lags beyond the series length');
    maxLag = Math.min(n - 1, nextPowerOfTwo(n + 2 * maxLag + 1) - n);
  }
}

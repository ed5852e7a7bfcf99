/**
 * The shared statistical checks of a run against a Gaussian target with known mean and covariance:
 * every mean and every covariance element within 4 Monte Carlo standard errors, and every marginal
 * passing a KS test. Each move's test calls these on its own runs.
 *
 * Tolerances. The MCSE of each estimate comes from the run itself (meanWithMcse: the variance of the
 * walker-averaged series times its integrated autocorrelation time over the run length). For a correct
 * sampler the standardised error is close to N(0, 1), so 4 MCSE is exceeded with probability 6e-5 per
 * quantity, under 0.5% for the 65 quantities of a 10-D check, allowing for the noise in the MCSE itself.
 * Covariances are checked as E[(x_i - μ_i)(x_j - μ_j)] = C_ij with the known mean, which keeps the
 * estimator a plain average.
 *
 * KS: draws are thinned to one every 3 τ per walker (autocorrelation left at lag 3τ: about e^-6 for an
 * exponential decay), pooled over walkers and ensembles, and compared with the exact marginal CDF; each
 * marginal must give p > 1e-3, so a correct sampler fails one of 10 marginals with probability about 1%.
 */
import { expect } from 'vitest';
import { walkerMeanSeries, type RunResultForTests } from './run.js';
import { integratedTime, ksPValue, ksStatistic, meanWithMcse, normalCdf } from './stats.js';

export interface GaussianCheckReport {
  /** Largest |estimate - truth| / MCSE over means and covariance elements. */
  worstZ: number;
  /** Smallest KS p-value over the marginals. */
  worstKsP: number;
  /** τ per ensemble, averaged over parameters. */
  tauByEnsemble: number[];
}

export function checkGaussian(r: RunResultForTests, mean: ArrayLike<number>, cov: Float64Array, label: string): GaussianCheckReport {
  const { ndim } = r;
  let worstZ = 0;
  const failures: string[] = [];
  for (let i = 0; i < ndim; i++) {
    const m = meanWithMcse(walkerMeanSeries(r, (c, o) => c[o + i]));
    const z = Math.abs(m.mean - mean[i]) / m.mcse;
    worstZ = Math.max(worstZ, z);
    if (!(z < 4)) failures.push(`mean[${i}] = ${m.mean} vs ${mean[i]}: ${z.toFixed(2)} MCSE (MCSE ${m.mcse.toPrecision(3)})`);
    for (let j = 0; j <= i; j++) {
      const c = meanWithMcse(walkerMeanSeries(r, (ch, o) => (ch[o + i] - mean[i]) * (ch[o + j] - mean[j])));
      const zc = Math.abs(c.mean - cov[i * ndim + j]) / c.mcse;
      worstZ = Math.max(worstZ, zc);
      if (!(zc < 4)) failures.push(`cov[${i}][${j}] = ${c.mean} vs ${cov[i * ndim + j]}: ${zc.toFixed(2)} MCSE (MCSE ${c.mcse.toPrecision(3)})`);
    }
  }
  const taus = r.chains.map((c) => integratedTime(c, r.nRows, r.nWalkers, ndim));
  const tauMax = Math.max(...taus.flatMap((t) => Array.from(t)));
  const every = Math.ceil(3 * tauMax);
  let worstKsP = 1;
  for (let j = 0; j < ndim; j++) {
    const xs: number[] = [];
    for (const c of r.chains) for (let t = every - 1; t < r.nRows; t += every) for (let w = 0; w < r.nWalkers; w++) xs.push(c[(t * r.nWalkers + w) * ndim + j]);
    const sd = Math.sqrt(cov[j * ndim + j]);
    const d = ksStatistic(Float64Array.from(xs), (x) => normalCdf(x, mean[j], sd));
    const p = ksPValue(d, xs.length);
    worstKsP = Math.min(worstKsP, p);
    if (!(p > 1e-3)) failures.push(`KS on marginal ${j}: D = ${d.toFixed(4)} with ${xs.length} draws, p = ${p.toExponential(2)}`);
  }
  const tauByEnsemble = taus.map((t) => t.reduce((a, b) => a + b, 0) / ndim);
  expect(failures, `${label}: ${failures.join('; ')}`).toEqual([]);
  return { worstZ, worstKsP, tauByEnsemble };
}

/** Mean and standard error of a small set of independent estimates (one per ensemble). */
export function meanAndSe(xs: number[]): { mean: number; se: number } {
  const n = xs.length;
  const mean = xs.reduce((a, b) => a + b, 0) / n;
  const v = xs.reduce((a, x) => a + (x - mean) ** 2, 0) / (n - 1);
  return { mean, se: Math.sqrt(v / n) };
}

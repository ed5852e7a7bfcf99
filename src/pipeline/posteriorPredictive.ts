/**
 * A posterior-predictive catalogue: as many stars as the fit used (or `maxStars`), drawn with the
 * likelihood's own forward model (likelihood/simulate.ts, `simulateCatalog`) at a few posterior draws,
 * each draw contributing an equal share, so that the parameters' uncertainty shows in the spread. The
 * selection window, IMF, binaries and completeness come from the run's config ([likelihood], as the fit
 * used them); each band's photometric errors follow sigma(m) = a + b 10^(0.4 (m - m_ref)), from the
 * config's [likelihood.errors] or fitted to the catalogue's own errors. With per-star membership priors,
 * the field share is their complement's mean. The forward model's field is uniform over the window, so a
 * KDE field (likelihood.field.model = "kde") is not reproduced.
 */
import type { BandId } from '../core/bands.js';
import type { ClusterParameterName } from '../core/parameters.js';
import { likelihoodSection, type LikelihoodConfig } from '../config/index.js';
import type { StarsTable } from '../io/index.js';
import { simulateCatalog, type SimulationSpec } from '../likelihood/index.js';
import { likelihoodOptionsFromConfig } from './likelihoodOptions.js';
import { parameterAt, type RunPosterior } from './runPosterior.js';
import type { StellarSetup } from './stellarModel.js';

export interface ErrorLawParameters {
  a: number;
  b: number;
  mRef: number;
}

export interface PredictiveCatalogue {
  bands: BandId[];
  /** mag[b][i], in `bands` order; NaN where a band is missing (as often as in the observed catalogue). */
  mag: Float64Array[];
  nStars: number;
  /** Posterior draws used, and the stars each contributed. */
  nDraws: number;
  /** 0 single, 1 binary, 2 field (the forward model's labels). */
  component: Uint8Array;
  /** Where each band's error law came from. */
  errorLaws: Partial<Record<BandId, ErrorLawParameters & { source: 'config' | 'fitted' }>>;
  /** Where the window came from. */
  limitsSource: 'config' | 'catalogue';
  /** The config asks for a KDE field, which the forward model does not draw (it draws a uniform one). */
  kdeField: boolean;
}

/**
 * a, b >= 0 of sigma = a + b 10^(0.4 (m - mRef)) fitted to the stars' magnitudes and errors, with mRef the
 * faint limit, by least squares in relative terms (each residual divided by the star's sigma). Relative
 * residuals let the bright stars set a and the faint ones b; plain residuals let the many faint stars,
 * whose observed magnitudes scatter by their large errors, pull b down and a up (regression dilution).
 * Used for the predictive catalogue only, where the typical error at each magnitude is what matters.
 */
export function fitErrorLaw(mag: ArrayLike<number>, err: ArrayLike<number>, mRef: number): ErrorLawParameters {
  // Weighted normal equations for sigma ~ a + b e with weights w = 1 / sigma^2.
  let sw = 0;
  let swe = 0;
  let swee = 0;
  let sws = 0;
  let swse = 0;
  for (let i = 0; i < mag.length; i++) {
    if (!Number.isFinite(mag[i]) || !Number.isFinite(err[i]) || err[i] <= 0) continue;
    const e = Math.pow(10, 0.4 * (mag[i] - mRef));
    const w = 1 / (err[i] * err[i]);
    sw += w;
    swe += w * e;
    swee += w * e * e;
    sws += w * err[i];
    swse += w * err[i] * e;
  }
  if (sw === 0) return { a: 0.01, b: 0, mRef };
  const det = sw * swee - swe * swe;
  let a = det > 0 ? (sws * swee - swe * swse) / det : sws / sw;
  let b = det > 0 ? (sw * swse - swe * sws) / det : 0;
  if (a < 0) [a, b] = [0, swee > 0 ? swse / swee : 0];
  if (b < 0) [a, b] = [sws / sw, 0];
  return { a, b, mRef };
}

function finiteRange(a: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < a.length; i++) {
    if (!Number.isFinite(a[i])) continue;
    lo = Math.min(lo, a[i]);
    hi = Math.max(hi, a[i]);
  }
  return [lo, hi];
}

export function posteriorPredictiveCatalogue(p: RunPosterior, stars: StarsTable, setup: StellarSetup, o: { seed: number; nDraws?: number; maxStars?: number }): PredictiveCatalogue {
  const fit = p.fit!;
  const bands = fit.bands;
  // The section as the fit resolved it; a manifest written before [likelihood] existed gets its defaults.
  const lc: LikelihoodConfig = (fit.config as { likelihood?: LikelihoodConfig }).likelihood ?? likelihoodSection.parse({});
  // The window: the config's limits where given, else the catalogue's own range (as the likelihood does).
  const limits: Partial<Record<BandId, { bright: number; faint: number }>> = {};
  let limitsSource: PredictiveCatalogue['limitsSource'] = 'config';
  const errorLaws: PredictiveCatalogue['errorLaws'] = {};
  const missingFraction: Partial<Record<BandId, number>> = {};
  for (const b of bands) {
    const m = stars.mag[b] as Float64Array;
    const [lo, hi] = finiteRange(m);
    const given = lc.limits?.[b];
    if (given?.bright === undefined || given?.faint === undefined) limitsSource = 'catalogue';
    limits[b] = { bright: given?.bright ?? lo, faint: given?.faint ?? hi };
    const e = lc.errors?.[b];
    errorLaws[b] = e ? { a: e.a, b: e.b, mRef: e.m_ref, source: 'config' } : { ...fitErrorLaw(m, stars.err[b] as Float64Array, limits[b]!.faint), source: 'fitted' };
    let missing = 0;
    for (let i = 0; i < m.length; i++) if (!Number.isFinite(m[i])) missing++;
    missingFraction[b] = missing / Math.max(1, m.length);
  }
  const { imf, binaryFractionOf, qMin, qGamma, completeness } = likelihoodOptionsFromConfig(lc);
  const likelihood: SimulationSpec['likelihood'] = { imf, binaryFractionOf, qMin, qGamma, completeness, limits };
  // With membership priors the likelihood uses them instead of f_field: the expected field share is 1 - mean(p).
  let priorSum = 0;
  let priorN = 0;
  for (const v of stars.membershipPrior) {
    if (!Number.isFinite(v)) continue;
    priorSum += v;
    priorN++;
  }
  const fieldFromPriors = priorN > 0 ? 1 - priorSum / priorN : undefined;

  const total = p.nChains * p.nDraws;
  const k = Math.max(1, Math.min(o.nDraws ?? 20, total, stars.nStars));
  const n = Math.min(stars.nStars, o.maxStars ?? Infinity);
  const mag = bands.map(() => new Float64Array(n));
  const component = new Uint8Array(n);
  let filled = 0;
  const value = (name: ClusterParameterName, i: number, fallback: number): number => parameterAt(p, name, i) ?? fallback;
  for (let j = 0; j < k; j++) {
    // Draws spread evenly through the pooled kept draws (chains in turn), stars split as evenly as possible.
    const i = Math.floor(((j + 0.5) * total) / k);
    const share = Math.floor(((j + 1) * n) / k) - Math.floor((j * n) / k);
    if (share === 0) continue;
    const sim = simulateCatalog(
      {
        seed: ((o.seed * 7919 + j) >>> 0) || 1,
        nStars: share,
        bands,
        theta: {
          logAgeYr: value('log_age', i, NaN),
          feh: value('feh', i, NaN),
          dm: value('dm', i, NaN),
          ebv: value('ebv', i, NaN),
          fBinary: value('f_binary', i, 0),
          fField: fieldFromPriors ?? value('f_field', i, 0),
          sigmaExtra: value('sigma_extra', i, 0),
        },
        errorLaw: Object.fromEntries(bands.map((b) => [b, { a: errorLaws[b]!.a, b: errorLaws[b]!.b, mRef: errorLaws[b]!.mRef }])),
        likelihood,
        missingFraction,
      },
      setup.source,
      setup.extinction,
    );
    bands.forEach((_, bi) => mag[bi].set(sim.catalog.mag[bi].subarray(0, share), filled));
    component.set(sim.truth.component.subarray(0, share), filled);
    filled += share;
  }
  return { bands, mag, nStars: filled, nDraws: k, component, errorLaws, limitsSource, kdeField: lc.field.model === 'kde' };
}

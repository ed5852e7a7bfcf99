import { describe, expect, it } from 'vitest';
import { builtinPhotometry, PHOTOMETRY_BANDS, type PhotometryBand } from '../../../src/stellar/photometry/index.js';
import { gaiaTwoMassBcs, johnsonCousinsBcs } from '../../../src/stellar/photometry/bolometricCorrections.js';

/*
 * Continuity: a magnitude must never jump as a function of any input (the sampler would see a cliff). The
 * scans below cross every join: dwarf/giant in log g, the pieces of BC_V and BC_G in Teff, the ends of
 * each relation's colour and temperature range, the [Fe/H] bins of Ramirez & Melendez, the holds at the
 * [Fe/H] and log g limits, and the edges of the table.
 *
 * Jump detector: sample at step h; the intervals whose signed change differs most from the mean of their
 * neighbours' (a jump up or down, a kink, a curved stretch) are bisected BISECTIONS times, each time keeping
 * the half with the larger change. Over the final interval a continuous function changes at its local slope,
 * while a jump (or a ramp too steep to matter, such as a blend a nanodex wide) keeps a finite change and
 * reads as an enormous slope. The test requires that slope, and the slope everywhere on the sampling grid, to
 * stay below a bound: 100 mag per dex in log Teff (the coolest giants' BC_B reach about 80), 10 mag per dex
 * in log g and [Fe/H] (twice that at the bisected points, which see the local maximum). Checked by mutation:
 * replacing the blend of Flower's BC_V pieces at log Teff 3.70 by a hard switch (a 0.022 mag jump), or
 * narrowing it to 1e-9 dex, fails these scans; so does the 0.003 mag mismatch at 3.90.
 */
const BANDS = PHOTOMETRY_BANDS;
const SLOPE_BOUND = { logTeff: 100, logg: 10, feh: 10 };
const CANDIDATES = 6;
/** Bisections: the final width, about 1e-9 of the scan, is wide enough that the root-finders' 1e-11 noise
 * reads as a slope below 0.01, and narrow enough that a jump of 1e-6 mag reads as a slope above 1000. */
const BISECTIONS = 20;

const jc = new Float64Array(4);
const gaia = new Float64Array(6);

/** Direct evaluation (the calibration itself, no table) of all ten BCs. */
function directBcs(logTeff: number, logg: number, feh: number, out: Float64Array): void {
  johnsonCousinsBcs(logTeff, logg, feh, jc);
  gaiaTwoMassBcs(logTeff, logg, feh, gaia);
  out.set(jc, 0);
  out.set(gaia, 4);
}
const DIRECT_ORDER: PhotometryBand[] = ['B', 'V', 'R', 'I', 'G', 'BP', 'RP', 'J', 'H', 'Ks'];

type Vector = (x: number, out: Float64Array) => void;

/** |change| / width of component b over [a, c] after BISECTIONS bisections towards the larger change. */
function localSlope(f: Vector, b: number, a: number, c: number): number {
  const va = new Float64Array(10);
  const vc = new Float64Array(10);
  const vm = new Float64Array(10);
  f(a, va);
  f(c, vc);
  let fa = va[b];
  let fc = vc[b];
  for (let k = 0; k < BISECTIONS; k++) {
    const m = 0.5 * (a + c);
    f(m, vm);
    const fm = vm[b];
    if (Math.abs(fm - fa) >= Math.abs(fc - fm)) {
      c = m;
      fc = fm;
    } else {
      a = m;
      fa = fm;
    }
  }
  return Math.abs(fc - fa) / (c - a);
}

function expectContinuous(label: string, f: Vector, lo: number, hi: number, n: number, slopeBound: number): void {
  const h = (hi - lo) / n;
  const values = Array.from({ length: 10 }, () => new Float64Array(n + 1));
  const v = new Float64Array(10);
  for (let i = 0; i <= n; i++) {
    f(lo + h * i, v);
    for (let b = 0; b < 10; b++) values[b][i] = v[b];
  }
  DIRECT_ORDER.forEach((band, b) => {
    const y = values[b];
    const signed = new Float64Array(n);
    for (let i = 0; i < n; i++) signed[i] = y[i + 1] - y[i];
    const d = signed.map(Math.abs);
    let steepest = 0;
    let where = lo;
    for (let i = 0; i < n; i++) {
      if (!(d[i] <= steepest)) {
        steepest = d[i];
        where = lo + h * i;
      }
    }
    expect(Number.isFinite(steepest), `${label}, ${band}: not finite near ${where}`).toBe(true);
    expect(steepest / h, `${label}, ${band}: slope ${(steepest / h).toFixed(1)} near ${where.toFixed(4)}`).toBeLessThanOrEqual(slopeBound);
    // Intervals whose change departs most from the mean of their neighbours' changes.
    const outlier = Array.from(signed, (di, i) => Math.abs(di - 0.5 * ((i > 0 ? signed[i - 1] : di) + (i < n - 1 ? signed[i + 1] : di))));
    const order = Array.from(outlier.keys()).sort((p, q) => outlier[q] - outlier[p]).slice(0, CANDIDATES);
    for (const i of order) {
      const slope = localSlope(f, b, lo + h * i, lo + h * (i + 1));
      expect(slope, `${label}, ${band}: a jump or cliff (slope ${slope.toExponential(2)} per unit) near ${(lo + h * i).toFixed(5)}`).toBeLessThanOrEqual(2 * slopeBound);
    }
  });
}

describe('the calibration is continuous in every input (direct evaluation)', () => {
  for (const [logg, feh] of [
    [4.5, 0.0],
    [3.3, -1.5],
    [1.5, -0.5],
  ]) {
    it(`in log Teff over 3.35-4.70 at log g ${logg}, [Fe/H] ${feh}`, () => {
      expectContinuous(`log g ${logg}, [Fe/H] ${feh}`, (lt, out) => directBcs(lt, logg, feh, out), 3.35, 4.7, 675, SLOPE_BOUND.logTeff);
    });
  }
  for (const [lt, feh] of [
    [Math.log10(3500), 0.0],
    [Math.log10(5000), -1.0],
    [Math.log10(9000), -2.0],
  ]) {
    it(`in log g over -1 to 5.5 at ${Math.round(10 ** lt)} K, [Fe/H] ${feh}`, () => {
      expectContinuous(`${Math.round(10 ** lt)} K, [Fe/H] ${feh}`, (g, out) => directBcs(lt, g, feh, out), -1, 5.5, 325, SLOPE_BOUND.logg);
    });
  }
  for (const [lt, logg] of [
    [Math.log10(3600), 1.0],
    [Math.log10(4800), 2.5],
    [Math.log10(6000), 4.3],
    [Math.log10(3300), 4.9],
  ]) {
    it(`in [Fe/H] over -3.0 to +0.6 at ${Math.round(10 ** lt)} K, log g ${logg}`, () => {
      expectContinuous(`${Math.round(10 ** lt)} K, log g ${logg}`, (f, out) => directBcs(lt, logg, f, out), -3, 0.6, 180, SLOPE_BOUND.feh);
    });
  }
});

describe('the model (tabulated calibration) is continuous in every input', () => {
  const model = builtinPhotometry();
  const one = BANDS.map(() => new Float64Array(1));
  const lt = new Float64Array(1);
  const g = new Float64Array(1);
  const logL = new Float64Array(1);
  function at(logTeff: number, logg: number, feh: number, out: Float64Array): void {
    lt[0] = logTeff;
    g[0] = logg;
    model.absoluteMagnitudes(BANDS, logL, lt, g, feh, one, 1);
    for (let b = 0; b < BANDS.length; b++) out[b] = one[b][0];
  }
  it('in log Teff over 3.30-4.80, past both table edges', () => {
    expectContinuous('model, log Teff', (x, out) => at(x, 4.4, -0.3, out), 3.3, 4.8, 3000, SLOPE_BOUND.logTeff);
    expectContinuous('model, log Teff (giant)', (x, out) => at(x, 3.3, -1.6, out), 3.3, 4.8, 3000, SLOPE_BOUND.logTeff);
  });
  it('in log g over -1.5 to 6', () => {
    expectContinuous('model, log g', (x, out) => at(Math.log10(4500), x, -1.0, out), -1.5, 6, 1500, SLOPE_BOUND.logg);
  });
  it('in [Fe/H] over -3.5 to +1', () => {
    expectContinuous('model, [Fe/H]', (x, out) => at(Math.log10(5200), 3.4, x, out), -3.5, 1, 900, SLOPE_BOUND.feh);
  });
});

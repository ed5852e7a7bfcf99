/**
 * Invariances and bad input. Invariances are exact properties of a sum over stars (common practice):
 * permuting stars, adding a band no star has, and duplicating the catalogue.
 */
import { describe, expect, it } from 'vitest';
import { sharedFloat64 } from '../../src/catalog/types.js';
import { CoevalError, InputError, ModelError } from '../../src/core/errors.js';
import { CmdLikelihood, type CatalogArrays } from '../../src/likelihood/cmdLikelihood.js';
import { simulateCatalog } from '../../src/likelihood/simulate.js';
import { THETA_NAMES, thetaVector, type ClusterParameters } from '../../src/likelihood/theta.js';
import { SyntheticIsochrones, TestExtinction } from '../helpers/syntheticIsochrones.js';

const src = new SyntheticIsochrones();
const ext = new TestExtinction();
const limits = { B: { bright: 8, faint: 22 }, V: { bright: 8, faint: 21 }, I: { bright: 7, faint: 20.5 } };
const errorLaw = { B: { a: 0.006, b: 0.05, mRef: 22 }, V: { a: 0.006, b: 0.05, mRef: 21 }, I: { a: 0.006, b: 0.05, mRef: 20.5 } };
const theta: ClusterParameters = { logAgeYr: 9.9, feh: -1.0, dm: 12, ebv: 0.05, fBinary: 0.3, fField: 0.1, sigmaExtra: 0.01 };
const sim = simulateCatalog({ seed: 31, nStars: 600, bands: ['B', 'V', 'I'], theta, errorLaw, likelihood: { limits }, missingFraction: { B: 0.1 } }, src, ext);
const cat = sim.catalog;

function reorder(c: CatalogArrays, order: number[]): CatalogArrays {
  const pick = (a: Float64Array) => {
    const o = sharedFloat64(order.length);
    order.forEach((i, k) => (o[k] = a[i]));
    return o;
  };
  return { bands: c.bands, nStars: order.length, mag: c.mag.map(pick), err: c.err.map(pick) };
}

describe('invariances', () => {
  const lik = new CmdLikelihood(cat, src, ext, { limits });
  const base = lik.evaluate(theta);
  it('permuting the stars changes log L by less than 1e-9 relative', () => {
    const order = Array.from({ length: cat.nStars }, (_, i) => (i * 7919) % cat.nStars);
    const l = new CmdLikelihood(reorder(cat, order), src, ext, { limits }).evaluate(theta);
    expect(Math.abs(l - base) / Math.abs(base)).toBeLessThan(1e-9);
  });
  it('a band missing for every star changes nothing', () => {
    const withJ: CatalogArrays = { bands: [...cat.bands, 'J'], nStars: cat.nStars, mag: [...cat.mag, sharedFloat64(cat.nStars)], err: [...cat.err, sharedFloat64(cat.nStars)] };
    const l = new CmdLikelihood(withJ, src, ext, { limits }).evaluate(theta);
    expect(Math.abs(l - base)).toBeLessThan(1e-9 * Math.abs(base));
  });
  it('duplicating the catalogue doubles log L', () => {
    const order = [...Array.from({ length: cat.nStars }, (_, i) => i), ...Array.from({ length: cat.nStars }, (_, i) => i)];
    const l = new CmdLikelihood(reorder(cat, order), src, ext, { limits }).evaluate(theta);
    expect(Math.abs(l - 2 * base)).toBeLessThan(1e-9 * Math.abs(base));
  });
  it('accepts theta by name or as a vector in THETA_NAMES order', () => {
    expect(THETA_NAMES).toEqual(['log_age', 'feh', 'dm', 'ebv', 'f_binary', 'f_field', 'sigma_extra']);
    expect(lik.evaluate(thetaVector(theta))).toBe(base);
  });
});

describe('bad input and parameters outside the model', () => {
  const lik = new CmdLikelihood(cat, src, ext, { limits });
  it('a star outside the window is a clear input error', () => {
    const bad = reorder(cat, Array.from({ length: 20 }, (_, i) => i));
    bad.mag[1][3] = 21.7;
    expect(() => new CmdLikelihood(bad, src, ext, { limits })).toThrow(InputError);
    expect(() => new CmdLikelihood(bad, src, ext, { limits })).toThrow(/star 4 has V = 21.7, outside the observed window/);
  });
  it('an error of zero is a clear input error', () => {
    const bad = reorder(cat, Array.from({ length: 20 }, (_, i) => i));
    bad.err[0][5] = 0;
    bad.mag[0][5] = 18;
    try {
      new CmdLikelihood(bad, src, ext, { limits });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CoevalError);
      expect((e as CoevalError).describe()).toMatch(/row 6.*B error[\s\S]*errors must be positive/);
    }
  });
  it('inverted limits are refused', () => {
    expect(() => new CmdLikelihood(cat, src, ext, { limits: { ...limits, V: { bright: 21, faint: 8 } } })).toThrow(/limits are inverted/);
  });
  it('a band the model lacks is a model error', () => {
    const c: CatalogArrays = { ...cat, bands: ['B', 'V', 'H'] };
    expect(() => new CmdLikelihood(c, src, ext, { limits })).toThrow(ModelError);
  });
  it('theta outside the model gives -Infinity with a status, never NaN', () => {
    const cases: [Partial<ClusterParameters>, string][] = [
      [{ logAgeYr: 11 }, 'isochrone-undefined'],
      [{ feh: -4 }, 'isochrone-undefined'],
      [{ fBinary: 1.2 }, 'parameter-out-of-range'],
      [{ fField: -0.1 }, 'parameter-out-of-range'],
      [{ ebv: -0.01 }, 'parameter-out-of-range'],
      [{ sigmaExtra: -1 }, 'parameter-out-of-range'],
      [{ dm: Number.NaN }, 'parameter-out-of-range'],
    ];
    for (const [change, status] of cases) {
      const l = lik.evaluate({ ...theta, ...change });
      expect(l).toBe(-Infinity);
      expect(lik.status).toBe(status);
    }
    // Legitimately tiny is finite, with status ok: a wildly wrong distance.
    const far = lik.evaluate({ ...theta, dm: 10.5, fField: 0.001 });
    expect(Number.isFinite(far)).toBe(true);
    expect(lik.status).toBe('ok');
  });
  it('a cluster pushed out of the window leaves only the field (finite with a field, -Infinity without)', () => {
    const l = lik.evaluate({ ...theta, dm: 40 });
    expect(lik.status).toBe('cluster-outside-window');
    expect(Number.isFinite(l)).toBe(true);
    expect(lik.evaluate({ ...theta, dm: 40, fField: 0 })).toBe(-Infinity);
  });
  it('responsibilities sum to one and are never NaN at valid theta', () => {
    const r = lik.responsibilities(theta);
    for (let i = 0; i < cat.nStars; i++) {
      expect(r.single[i] + r.binary[i] + r.field[i]).toBeCloseTo(1, 12);
      expect(Number.isNaN(r.logL[i])).toBe(false);
    }
  });
});

describe('outliers', () => {
  it('blue stragglers, which no sequence explains, fall to the field term', () => {
    const t = { ...theta, fField: 0.05 };
    const s = simulateCatalog({ seed: 33, nStars: 400, bands: ['B', 'V', 'I'], theta: t, errorLaw, likelihood: { limits }, blueStragglerFraction: 0.05 }, src, ext);
    const r = new CmdLikelihood(s.catalog, src, ext, { limits }).responsibilities(t);
    let sum = 0;
    let count = 0;
    let members = 0;
    let memberCount = 0;
    for (let i = 0; i < s.catalog.nStars; i++) {
      const c = s.truth.component[i];
      if (c === 3) {
        sum += r.field[i];
        count++;
      } else if (c < 2) {
        members += r.field[i];
        memberCount++;
      }
    }
    expect(count).toBeGreaterThan(5);
    // Stragglers just above the turnoff overlap the binary sequence and are partly claimed by it, so "most",
    // not all, of their weight goes to the field term; cluster members keep almost none of it.
    expect(sum / count).toBeGreaterThan(0.8);
    expect(members / memberCount).toBeLessThan(0.05);
  }, 120_000);
});

describe('membership priors and parallaxes', () => {
  const t = { ...theta, fField: 0.3 };
  const s = simulateCatalog(
    { seed: 35, nStars: 300, bands: ['B', 'V', 'I'], theta: t, errorLaw, likelihood: { limits }, membership: true, parallax: { errorMas: 0.05, fieldMeanMas: 0.8, fieldSdMas: 0.6 } },
    src,
    ext,
  );
  const lik = new CmdLikelihood(s.catalog, src, ext, { limits });
  it("each star's membership prior replaces 1 - f_field, which then has no effect", () => {
    expect(lik.evaluate(t)).toBe(lik.evaluate({ ...t, fField: 0.9 }));
    expect(lik.notes.join('\n')).toMatch(/membership/);
  });
  it('the parallax term pulls towards the distance that matches the parallaxes', () => {
    // Parallaxes alone (photometry held fixed by comparing with and without them) prefer the true dm.
    const noPlx = new CmdLikelihood({ ...s.catalog, parallaxMas: undefined, parallaxErrorMas: undefined }, src, ext, { limits });
    const gain = (dm: number) => lik.evaluate({ ...t, dm }) - noPlx.evaluate({ ...t, dm });
    expect(gain(t.dm)).toBeGreaterThan(gain(t.dm + 0.3));
    expect(gain(t.dm)).toBeGreaterThan(gain(t.dm - 0.3));
  });
});

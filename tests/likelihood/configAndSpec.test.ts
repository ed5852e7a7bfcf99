/**
 * The [likelihood] config section (defaults, validation, mapping onto the likelihood's options) and the
 * construction of the likelihood from a structured-cloneable spec, as a worker thread does it.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseConfigText } from '../../src/config/index.js';
import { ConfigError } from '../../src/core/errors.js';
import { CmdLikelihood } from '../../src/likelihood/cmdLikelihood.js';
import { BinaryCurveBuilder } from '../../src/likelihood/binaryCurves.js';
import { makeImf } from '../../src/likelihood/imf.js';
import { ModelPolyline } from '../../src/likelihood/polyline.js';
import { QGrid } from '../../src/likelihood/qGrid.js';
import { SegmentSet } from '../../src/likelihood/segmentSet.js';
import { simulateCatalog } from '../../src/likelihood/simulate.js';
import { catalogArrays, createLikelihoodFromSpec, type LikelihoodSpec } from '../../src/likelihood/spec.js';
import { likelihoodOptionsFromConfig } from '../../src/pipeline/likelihoodOptions.js';
import { SyntheticIsochrones, TestExtinction } from '../helpers/syntheticIsochrones.js';

const BASE = `
[catalogue]
path = "stars.csv"

[photometry.V]
mag = "Vmag"
err = "e_Vmag"

[photometry.I]
mag = "Imag"
err = "e_Imag"
`;

function configError(text: string): ConfigError {
  try {
    parseConfigText(text, { file: 'test.toml' });
  } catch (e) {
    if (e instanceof ConfigError) return e;
    throw e;
  }
  throw new Error('expected a ConfigError');
}

describe('[likelihood] config section', () => {
  it('has defaults when omitted (Kroupa IMF, uniform q from 0.1, uniform field, zero point -0.017 mas)', () => {
    const { config } = parseConfigText(BASE);
    expect(config.likelihood.imf).toBe('kroupa2001');
    expect(config.likelihood.binaries).toEqual({ q_min: 0.1, q_slope: 0 });
    expect(config.likelihood.field.model).toBe('uniform');
    expect(config.likelihood.parallax.zero_point_mas).toBe(-0.017);
  });
  it('maps onto the likelihood options', () => {
    const { config } = parseConfigText(`${BASE}
[likelihood]
imf = "chabrier2003"
[likelihood.binaries]
q_min = 0.2
q_slope = 0.5
[likelihood.limits.V]
bright = 12
faint = 21
[likelihood.completeness]
band = "V"
magnitudes = [19, 20, 21]
fractions = [1, 0.8, 0.4]
[likelihood.errors.V]
a = 0.005
b = 0.03
m_ref = 21
`);
    const o = likelihoodOptionsFromConfig(config.likelihood);
    expect(o.imf).toBe('chabrier2003');
    expect(o.qMin).toBe(0.2);
    expect(o.qGamma).toBe(0.5);
    expect(o.limits).toEqual({ V: { bright: 12, faint: 21 } });
    expect(o.completeness).toEqual({ band: 'V', mag: [19, 20, 21], fraction: [1, 0.8, 0.4] });
    expect(o.errorLaw).toEqual({ V: { a: 0.005, b: 0.03, mRef: 21 } });
  });
  it('rejects inverted limits with the key', () => {
    const e = configError(`${BASE}\n[likelihood.limits.V]\nbright = 21\nfaint = 12\n`);
    expect(e.where?.key).toMatch(/^likelihood\.limits\.V/);
    expect(e.message).toMatch(/inverted/);
  });
  it('rejects a completeness table whose magnitudes do not increase, or fractions above 1', () => {
    expect(configError(`${BASE}\n[likelihood.completeness]\nband = "V"\nmagnitudes = [20, 19]\nfractions = [1, 0.5]\n`).message).toMatch(/increase/);
    expect(configError(`${BASE}\n[likelihood.completeness]\nband = "V"\nmagnitudes = [19, 20]\nfractions = [1, 1.5]\n`).where?.key).toMatch(/fractions/);
  });
  it('asks for a comparison catalogue when the field model is a KDE', () => {
    expect(configError(`${BASE}\n[likelihood.field]\nmodel = "kde"\n`).message).toMatch(/comparison/);
  });
  it('suggests the nearest key for a misspelt one', () => {
    const e = configError(`${BASE}\n[likelihood.binaries]\nqmin = 0.2\n`);
    expect(e.describe()).toMatch(/q_min/);
  });
});

const helper = fileURLToPath(new URL('../helpers/syntheticIsochrones.ts', import.meta.url));
const limits = { B: { bright: 8, faint: 22 }, V: { bright: 8, faint: 21 }, I: { bright: 7, faint: 20.5 } };
const errorLaw = { B: { a: 0.006, b: 0.05, mRef: 22 }, V: { a: 0.006, b: 0.05, mRef: 21 }, I: { a: 0.006, b: 0.05, mRef: 20.5 } };
const theta = { logAgeYr: 9.9, feh: -1.0, dm: 12, ebv: 0.05, fBinary: 0.3, fField: 0.1, sigmaExtra: 0.02 };

describe('construction from a structured-cloneable spec', () => {
  it('survives structuredClone, shares the SharedArrayBuffers, and gives the same log L', async () => {
    const src = new SyntheticIsochrones();
    const ext = new TestExtinction();
    const sim = simulateCatalog({ seed: 41, nStars: 150, bands: ['B', 'V', 'I'], theta, errorLaw, likelihood: { limits } }, src, ext);
    const spec: LikelihoodSpec = {
      catalog: catalogArrays(sim.catalog),
      options: { limits },
      isochrones: { modulePath: helper, exportName: 'syntheticIsochrones', args: [{}] },
      extinction: { modulePath: helper, exportName: 'testExtinction', args: [0] },
    };
    const cloned = structuredClone(spec);
    expect(cloned.catalog.mag[0].buffer).toBeInstanceOf(SharedArrayBuffer);
    // The clone views the same memory: a write through one is seen by the other.
    const keep = sim.catalog.mag[0][0];
    sim.catalog.mag[0][0] = 99;
    expect(cloned.catalog.mag[0][0]).toBe(99);
    sim.catalog.mag[0][0] = keep;
    const fromSpec = await createLikelihoodFromSpec(cloned);
    const direct = new CmdLikelihood(sim.catalog, src, ext, { limits });
    expect(fromSpec.evaluate(theta)).toBe(direct.evaluate(theta));
  });
  it('names a missing export', async () => {
    const spec: LikelihoodSpec = { catalog: { bands: ['B', 'V'], nStars: 0, mag: [], err: [] }, options: {}, isochrones: { modulePath: helper, exportName: 'nope' }, extinction: { modulePath: helper, exportName: 'testExtinction' } };
    await expect(createLikelihoodFromSpec(spec)).rejects.toThrow(/no export "nope"/);
  });
});

describe('unresolved binaries (common practice: equal-mass binaries sit 2.5 log10 2 = 0.753 mag above the single sequence)', () => {
  it('the q = 1 binary curve lies 0.7526 mag above the single-star polyline in every band', () => {
    const src = new SyntheticIsochrones();
    const iso = src.isochrone(9.5, -0.5, { bands: ['B', 'V', 'I'] });
    const poly = new ModelPolyline(3);
    expect(poly.build(iso!, ['B', 'V', 'I'], Int32Array.of(0, 1, 2), new TestExtinction(), 10, 0.1, makeImf('kroupa2001'), 1e-4)).toBe('ok');
    const grid = new QGrid({ qMin: 0.1, gamma: 0 }, 1);
    const set = new SegmentSet(3);
    new BinaryCurveBuilder(3).build(poly, grid, 1, set);
    const top = grid.n0;
    expect(grid.q[top]).toBe(1);
    let checked = 0;
    for (let s = 0; s < set.n; s++) {
      if (set.curve[s] !== top) continue;
      // Each q = 1 segment starts at a primary node of the polyline (no secondary crossings at q = 1).
      for (let b = 0; b < 3; b++) {
        let k = 0;
        let best = Infinity;
        for (let j = 0; j < poly.n; j++) {
          const d = Math.abs(poly.mag[b][j] - 0.75257498916 - set.start[b][s]);
          if (d < best) {
            best = d;
            k = j;
          }
        }
        expect(best).toBeLessThan(1e-9);
        void k;
      }
      checked++;
    }
    expect(checked).toBe(poly.n - 1);
  });
});

import { describe, expect, it } from 'vitest';
import { ModelError } from '../../../src/core/errors.js';
import { extinctionModel, gaiaExtinctionRatioCod } from '../../../src/stellar/extinction/index.js';

describe('extinction model: Johnson-Cousins and 2MASS ratios', () => {
  it('E(B-V) comes back as A_B - A_V: R_B - R_V = 1 for CCM89 at R_V = 3.1 (3.1 x 0.32258 from the CCM89 Table 3 values, references.md)', () => {
    const m = extinctionModel({ law: 'ccm89', rv: 3.1 });
    expect((m.fixedRatio('B') as number) - (m.fixedRatio('V') as number)).toBeCloseTo(1, 4);
    expect(m.fixedRatio('V')).toBe(3.1);
  });

  it('R_V of the V band is R_V itself for the CCM-type laws, at any R_V', () => {
    for (const rv of [2.5, 3.1, 4.5]) {
      expect(extinctionModel({ law: 'odonnell94', rv }).fixedRatio('V')).toBeCloseTo(rv, 12);
    }
  });

  it('Cousins Ic is evaluated at its own wavenumber: E(V-Ic)/E(B-V) = 1.22-1.32 for R_V = 3.1 (common practice: 1.24-1.30 is quoted)', () => {
    const m = extinctionModel();
    const eVI = (m.fixedRatio('V') as number) - (m.fixedRatio('I') as number);
    expect(eVI).toBeGreaterThan(1.22);
    expect(eVI).toBeLessThan(1.32);
  });

  it('refuses an R_V outside 2-6 and an unknown law', () => {
    expect(() => extinctionModel({ rv: 1.5 })).toThrow(ModelError);
    expect(() => extinctionModel({ rv: Number.NaN })).toThrow(ModelError);
    expect(() => extinctionModel({ law: 'cardelli' as never })).toThrow(ModelError);
  });

  it('states its law and R_V in the provenance', () => {
    expect(extinctionModel({ law: 'fitzpatrick99', rv: 3.6 }).provenance).toMatch(/Fitzpatrick 1999, R_V = 3\.6/);
    expect(extinctionModel().provenance).toMatch(/O'Donnell 1994 in the optical, R_V = 3\.1/);
  });
});

describe('extinction model: Gaia ratios depend on the star', () => {
  /*
   * The Casagrande et al. 2021 polynomials (CCM89 + O'Donnell, R_V = 3.1), evaluated by hand from their
   * published coefficients at (BP-RP)_0 = 1: R_G = 3.071 - 0.511 + 0.058 = 2.618,
   * R_BP = 3.526 - 0.168 - 0.170 + 0.060 = 3.248, R_RP = 2.062 - 0.072 = 1.990.
   */
  it('reproduces the published polynomials inside their colour range', () => {
    expect(gaiaExtinctionRatioCod('G', 1)).toBeCloseTo(2.618, 12);
    expect(gaiaExtinctionRatioCod('BP', 1)).toBeCloseTo(3.248, 12);
    expect(gaiaExtinctionRatioCod('RP', 1)).toBeCloseTo(1.99, 12);
    const m = extinctionModel();
    expect(m.gaiaRatio('G', 1)).toBeCloseTo(2.618, 12); // the default law is the one the polynomials assume
  });

  it('holds the coefficients outside 0.2-2.55 (smoothly): hot and very red stars take the edge values', () => {
    expect(gaiaExtinctionRatioCod('G', -0.3)).toBe(gaiaExtinctionRatioCod('G', 0.14));
    expect(gaiaExtinctionRatioCod('G', 0.3)).toBeCloseTo(3.071 - 0.511 * 0.3 + 0.058 * 0.09, 12);
    expect(gaiaExtinctionRatioCod('BP', 4)).toBe(gaiaExtinctionRatioCod('BP', 2.61));
  });

  it('gives a star-dependent A_G from its (log Teff, log g, [Fe/H]): cooler stars have smaller R_G (their G-band light is redder)', () => {
    const m = extinctionModel();
    const logTeff = Float64Array.of(Math.log10(7000), Math.log10(5772), Math.log10(4500), NaN);
    const logg = Float64Array.of(4.2, 4.44, 4.6, 4.4);
    const out = [new Float64Array(4), new Float64Array(4), new Float64Array(4), new Float64Array(4)];
    m.ratios(['G', 'V', 'BP', 'RP'], logTeff, logg, 0, out, 4);
    const [g, v, bp, rp] = out;
    expect(g[0]).toBeGreaterThan(g[1]);
    expect(g[1]).toBeGreaterThan(g[2]);
    expect(v[0]).toBe(3.1);
    expect(v[3]).toBe(3.1);
    expect(Number.isNaN(g[3])).toBe(true); // a NaN star stays NaN
    // Ordering of the broad bands' ratios by wavelength: BP > G > RP (common practice).
    for (let k = 0; k < 3; k++) {
      expect(bp[k]).toBeGreaterThan(g[k]);
      expect(g[k]).toBeGreaterThan(rp[k]);
    }
  });

  it('for another law, scales the ratios by the law ratio at the pivot wavelength', () => {
    const cod = extinctionModel();
    const f99 = extinctionModel({ law: 'fitzpatrick99' });
    const ratio = f99.gaiaRatio('G', 0.8) / cod.gaiaRatio('G', 0.8);
    expect(ratio).toBeGreaterThan(0.9);
    expect(ratio).toBeLessThan(1.1);
    expect(f99.gaiaRatio('G', 0.8) / f99.gaiaRatio('G', 1.5)).toBeCloseTo(cod.gaiaRatio('G', 0.8) / cod.gaiaRatio('G', 1.5), 12);
  });
});

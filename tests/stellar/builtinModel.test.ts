/**
 * The built-in model as an IsochroneSource, and the [Fe/H] -> Z conversion of Salaris, Chieffi &
 * Straniero 1993 (ApJ 414, 580): [M/H] = [Fe/H] + log10(0.638 f + 0.362), f = 10^[alpha/Fe], with the
 * model's solar Z = 0.02 (Hurley, Pols & Tout 2000).
 */
import { describe, expect, it } from 'vitest';
import { builtinModel } from '../../src/stellar/isochrone/builtinModel.js';
import { fehToZ, metallicityMH, zToFeh } from '../../src/stellar/evolution/metallicity.js';
import { bolometricPhotometry } from '../helpers/bolometricPhotometry.js';

describe('[Fe/H] to Z', () => {
  it('is the identity in [M/H] for scaled-solar mixtures, and Z = 0.02 at [Fe/H] = 0', () => {
    expect(metallicityMH(-1.3, 0)).toBeCloseTo(-1.3, 14);
    expect(fehToZ(0)).toBeCloseTo(0.02, 15);
  });

  it('adds log10(0.638 f + 0.362) for alpha enhancement (Salaris et al. 1993): +0.2933 dex at [alpha/Fe] = +0.4', () => {
    // 0.638 * 10^0.4 + 0.362 = 0.638 * 2.511886 + 0.362 = 1.964583; log10 = 0.293271 (hand calculation).
    expect(metallicityMH(-2, 0.4) + 2).toBeCloseTo(0.293271, 5);
  });

  it('round-trips through zToFeh', () => {
    expect(zToFeh(fehToZ(-1.7, 0.3), 0.3)).toBeCloseTo(-1.7, 12);
  });
});

describe('builtinModel', () => {
  const src = builtinModel({ photometry: bolometricPhotometry, alphaFe: 0.3 });

  it('states its domain: ages 10^8-10^10.15 yr and the [Fe/H] that maps onto Z = 1e-4 .. 0.0317', () => {
    expect(src.domain.logAgeYr).toEqual([8, 10.15]);
    expect(fehToZ(src.domain.feh[0], 0.3)).toBeGreaterThanOrEqual(1e-4);
    expect(fehToZ(src.domain.feh[0], 0.3)).toBeLessThan(1.0001e-4);
    expect(fehToZ(src.domain.feh[1], 0.3)).toBeLessThanOrEqual(0.02 * 10 ** 0.2);
  });

  it('returns undefined outside its domain and an isochrone in the requested bands inside it', () => {
    expect(src.isochrone(7.9, -1, { bands: ['V'] })).toBeUndefined();
    expect(src.isochrone(9, src.domain.feh[1] + 0.01, { bands: ['V'] })).toBeUndefined();
    const iso = src.isochrone(9.5, -1, { bands: ['G', 'BP'] })!;
    expect(iso.bands).toEqual(['G', 'BP']);
    expect(iso.absMag).toHaveLength(2);
    expect(iso.provenance.alphaFe).toBe(0.3);
    expect(iso.provenance.bands.G).toBe(bolometricPhotometry.provenance.G);
  });

  it('builds at the corners of its domain', () => {
    for (const a of src.domain.logAgeYr) for (const f of src.domain.feh) expect(src.isochrone(a, f, { bands: ['V'] })!.logL.length).toBeGreaterThan(100);
  });
});

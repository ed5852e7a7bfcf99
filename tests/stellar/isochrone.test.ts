/**
 * The isochrone builder: node placement, phase coordinate, purity, the turnoff of an old metal-poor
 * population, and agreement of every node with a direct evaluation of the same star (`evolveStar`).
 * Photometry is the test-only bolometric model (M_bol in every band) until the calibrations land.
 */
import { describe, expect, it } from 'vitest';
import { Phase } from '../../src/stellar/types.js';
import { isochrone } from '../../src/stellar/isochrone/isochrone.js';
import { evolveStar } from '../../src/stellar/evolution/star.js';
import { fehToZ } from '../../src/stellar/evolution/metallicity.js';
import { ModelError } from '../../src/core/errors.js';
import { bolometricPhotometry } from '../helpers/bolometricPhotometry.js';

const opts = { photometry: bolometricPhotometry, bands: ['B', 'V', 'I'] as const };
const old = isochrone(Math.log10(12e9), -1.5, opts);

/** Index range of nodes of one phase. */
function phaseNodes(iso: typeof old, phase: Phase): number[] {
  const out: number[] = [];
  for (let i = 0; i < iso.phase.length; i++) if (iso.phase[i] === phase) out.push(i);
  return out;
}

describe('isochrone structure', () => {
  it('has finite values, non-decreasing initial mass, non-decreasing phase and a strictly rising phase coordinate', () => {
    const n = old.massInitial.length;
    for (let i = 0; i < n; i++) {
      for (const a of [old.massInitial, old.massCurrent, old.logL, old.logTeff, old.logg, old.phaseCoord, ...old.absMag]) expect(Number.isFinite(a[i])).toBe(true);
      if (i > 0) {
        expect(old.massInitial[i]).toBeGreaterThanOrEqual(old.massInitial[i - 1]);
        expect(old.phase[i]).toBeGreaterThanOrEqual(old.phase[i - 1]);
        expect(old.phaseCoord[i]).toBeGreaterThan(old.phaseCoord[i - 1]);
      }
    }
  });

  it('covers the main sequence from 0.1 Msun to the end of the early AGB', () => {
    expect(old.massInitial[0]).toBe(0.1);
    for (const p of [Phase.MainSequence, Phase.HertzsprungGap, Phase.GiantBranch, Phase.CoreHeliumBurning, Phase.EarlyAGB]) {
      expect(phaseNodes(old, p).length).toBeGreaterThan(5);
    }
  });

  it('places adjacent nodes within 0.01 mag in every band from the turnoff through the horizontal branch', () => {
    // "Turnoff" here: the main sequence within 1 mag (bolometric) of its end; then gap, GB and CHeB.
    const msEnd = phaseNodes(old, Phase.MainSequence).at(-1)!;
    const mbolTO = 4.74 - 2.5 * old.logL[msEnd];
    let worst = 0;
    for (let i = 1; i < old.phase.length; i++) {
      const p = old.phase[i];
      if (old.phase[i - 1] !== p) continue; // the helium flash is a jump between phases
      const inTO = p === Phase.MainSequence && 4.74 - 2.5 * old.logL[i] < mbolTO + 1;
      if (!(inTO || p === Phase.HertzsprungGap || p === Phase.GiantBranch || p === Phase.CoreHeliumBurning)) continue;
      for (const m of old.absMag) worst = Math.max(worst, Math.abs(m[i] - m[i - 1]));
    }
    expect(worst).toBeLessThanOrEqual(0.01);
  });

  it('is pure: the same inputs give identical arrays, whatever was built in between', () => {
    isochrone(8.3, 0.1, opts);
    const again = isochrone(Math.log10(12e9), -1.5, opts);
    expect(Array.from(again.logL)).toEqual(Array.from(old.logL));
    expect(Array.from(again.massCurrent)).toEqual(Array.from(old.massCurrent));
    expect(Array.from(again.absMag[1])).toEqual(Array.from(old.absMag[1]));
  });

  it('states its provenance: solar Z, [alpha/Fe], and that pre-main-sequence stars are not modelled', () => {
    expect(old.provenance.solarZ).toBe(0.02);
    expect(old.provenance.alphaFe).toBe(0);
    expect(old.provenance.caveats.some((c) => /pre-main-sequence/i.test(c))).toBe(true);
  });

  it('refuses ages and metallicities outside the model with a ModelError', () => {
    expect(() => isochrone(7.5, 0, opts)).toThrow(ModelError);
    expect(() => isochrone(9, 0.5, opts)).toThrow(ModelError);
    expect(() => isochrone(9, -3, opts)).toThrow(ModelError);
  });
});

describe('old metal-poor population (12 Gyr, [Fe/H] = -1.5)', () => {
  it('turns off at 0.75-0.90 Msun (globular-cluster turnoff masses, common practice; references.md)', () => {
    const msEnd = phaseNodes(old, Phase.MainSequence).at(-1)!;
    expect(old.massInitial[msEnd]).toBeGreaterThanOrEqual(0.75);
    expect(old.massInitial[msEnd]).toBeLessThanOrEqual(0.9);
  });

  it('tip of the giant branch: M_bol within 0.25 of -0.19 [Fe/H] - 3.81 for [Fe/H] = -2.0 .. -1.0 (Lee, Freedman & Madore 1993; from memory)', () => {
    for (const feh of [-2.0, -1.5, -1.0]) {
      const iso = isochrone(Math.log10(12e9), feh, opts);
      let tip = 0;
      for (const i of phaseNodes(iso, Phase.GiantBranch)) if (iso.logL[i] > iso.logL[tip]) tip = i;
      expect(Math.abs(4.74 - 2.5 * iso.logL[tip] - (-0.19 * feh - 3.81)), `[Fe/H] = ${feh}`).toBeLessThanOrEqual(0.25);
    }
  });

  it('loses mass on the giant branch, so that horizontal-branch stars are lighter than the turnoff', () => {
    const he = phaseNodes(old, Phase.CoreHeliumBurning);
    expect(old.massCurrent[he[0]]).toBeLessThan(old.massInitial[he[0]] - 0.05);
  });
});

describe('every node agrees with a direct evaluation of the same star (internal consistency)', () => {
  // evolveStar integrates the winds per star with 64 RK4 steps per segment; the isochrone interpolates them
  // from reference tracks. Tolerances: 3e-4 Msun in mass, 1e-4 dex in L and Teff (about 0.00025 mag). On the
  // early AGB the Vassiliadis & Wood superwind switches on steeply, which makes the mass near its top a steep
  // function of initial mass; there the tolerance is 0.2 per cent of the mass (its effect on the radius,
  // R ~ M^-0.3, is below 1e-3 dex).
  const cases: [number, number][] = [
    [Math.log10(12e9), -1.5],
    [9.0, 0.0],
    [8.0, -2.3],
    [9.6, 0.15],
  ];
  for (const [logAge, feh] of cases) {
    it(`log age ${logAge.toFixed(2)}, [Fe/H] ${feh}`, () => {
      const iso = isochrone(logAge, feh, opts);
      const Z = fehToZ(feh);
      const tMyr = 10 ** (logAge - 6);
      let worstMass = 0;
      let worstAgb = 0;
      let worstL = 0;
      let worstT = 0;
      const n = iso.massInitial.length;
      for (let i = 0; i < n; i += 7) {
        const s = evolveStar(iso.massInitial[i], Z, tMyr);
        // Nodes on a phase boundary may sit a rounding error on the other side of it.
        if (!s || s.phase !== iso.phase[i]) continue;
        if (iso.phase[i] === Phase.EarlyAGB) worstAgb = Math.max(worstAgb, Math.abs(s.mass / iso.massCurrent[i] - 1));
        else worstMass = Math.max(worstMass, Math.abs(s.mass - iso.massCurrent[i]));
        worstL = Math.max(worstL, Math.abs(s.logL - iso.logL[i]));
        worstT = Math.max(worstT, Math.abs(s.logTeff - iso.logTeff[i]));
      }
      expect(worstMass).toBeLessThanOrEqual(3e-4);
      expect(worstAgb).toBeLessThanOrEqual(2e-3);
      expect(worstL).toBeLessThanOrEqual(1e-4);
      expect(worstT).toBeLessThanOrEqual(1e-4);
    });
  }
});

/**
 * The analytic evolution model against the authors' own SSE code (Hurley, Pols & Tout 2000), as recorded
 * in amusecode/amuse, src/amuse/community/sse/tests/test_sse.py (references.md, "ref"), and against the
 * Sun (IAU 2015 Resolution B3). Each SSE value is checked to the precision at which it is printed: the
 * tolerance is half a unit in its last printed digit.
 */
import { describe, expect, it } from 'vitest';
import { Phase } from '../../src/stellar/types.js';
import { evolutionModel } from '../../src/stellar/evolution/model.js';
import { zamsLuminosity, zamsRadius } from '../../src/stellar/evolution/zams.js';
import { tBGB, tMainSequence } from '../../src/stellar/evolution/mainSequence.js';
import { evolveStar, phaseEnds } from '../../src/stellar/evolution/star.js';

function toPrinted(value: number, printed: number, decimals: number): void {
  expect(Math.abs(value - printed), `value ${value} vs printed ${printed}`).toBeLessThanOrEqual(0.5 * 10 ** -decimals);
}

describe('Hurley, Pols & Tout 2000 at Z = 0.02 against the authors\' SSE values', () => {
  const model = evolutionModel(0.02);

  it('ZAMS luminosity and radius (Tout et al. 1996)', () => {
    toPrinted(zamsLuminosity(model.coef, 1), 0.697717, 6);
    toPrinted(zamsRadius(model.coef, 1), 0.888249, 6);
    toPrinted(zamsRadius(model.coef, 2), 1.61021, 6);
    toPrinted(zamsRadius(model.coef, 3), 1.979134, 6);
  });

  it('1 Msun: main-sequence lifetime and time to the base of the giant branch', () => {
    toPrinted(tMainSequence(model, 1), 11003.13, 2);
    toPrinted(tBGB(model, 1), 11582.2, 1);
  });

  it('5 Msun: start of the Hertzsprung gap, giant branch, core helium burning and early AGB', () => {
    const e = phaseEnds(5, 0.02);
    toPrinted(e.tMS, 104.0, 1);
    toPrinted(e.tBGB, 104.4, 1);
    toPrinted(e.tHeI, 104.7, 1);
    toPrinted(e.tBAGB, 120.1, 1);
  });
});

describe('the Sun at 4.57 Gyr (age: common practice) with the model\'s solar Z = 0.02', () => {
  const sun = evolveStar(1, 0.02, 4570)!;
  it('is on the main sequence', () => expect(sun.phase).toBe(Phase.MainSequence));
  it('L within 5% of 1 Lsun (IAU 2015 B3 nominal luminosity)', () => {
    expect(Math.abs(10 ** sun.logL - 1)).toBeLessThanOrEqual(0.05);
  });
  it('Teff within 2% of 5772 K (IAU 2015 B3 nominal effective temperature)', () => {
    expect(Math.abs(10 ** sun.logTeff / 5772 - 1)).toBeLessThanOrEqual(0.02);
  });
});

describe('evolveStar', () => {
  it('refuses masses outside 0.1-100 Msun and metallicities outside the fits', () => {
    expect(() => evolveStar(0.05, 0.02, 100)).toThrow(RangeError);
    expect(() => evolveStar(1, 0.05, 100)).toThrow(RangeError);
  });

  it('gives finite states and ordered phase ends from 0.1 to 100 Msun and Z = 1e-4 to 0.03 (robustness)', () => {
    let checked = 0;
    for (const Z of [1e-4, 1e-3, 0.004, 0.02, 0.03]) {
      for (let lm = -1; lm <= 2 + 1e-9; lm += 0.1) {
        const m = Math.min(100, 10 ** lm);
        const e = phaseEnds(m, Z, { steps: 16 });
        expect(e.tMS <= e.tBGB && e.tBGB <= e.tHeI && e.tHeI <= e.tBAGB && e.tBAGB <= e.tEnd, `ends of ${m} Msun at Z = ${Z}`).toBe(true);
        for (const t of [0.5 * e.tMS, 0.5 * (e.tMS + e.tBGB), 0.5 * (e.tBGB + e.tHeI), 0.5 * (e.tHeI + e.tBAGB), 0.5 * (e.tBAGB + e.tEnd)]) {
          const st = evolveStar(m, Z, t, { steps: 16 });
          if (!st) continue;
          checked++;
          for (const v of [st.logL, st.logR, st.logTeff, st.logg, st.mass, st.coreMass]) expect(Number.isFinite(v), `${m} Msun, Z = ${Z}, t = ${t}`).toBe(true);
          expect(st.mass).toBeGreaterThan(st.coreMass);
        }
      }
    }
    expect(checked).toBeGreaterThan(600);
  });

  it('walks a 1 Msun star through every modelled phase in order, losing mass only after the main sequence', () => {
    const e = phaseEnds(1, 0.02);
    const ages = [0.5 * e.tMS, 0.5 * (e.tMS + e.tBGB), 0.5 * (e.tBGB + e.tHeI), 0.5 * (e.tHeI + e.tBAGB), 0.5 * (e.tBAGB + e.tEnd)];
    const phases = ages.map((t) => evolveStar(1, 0.02, t)!.phase);
    expect(phases).toEqual([Phase.MainSequence, Phase.HertzsprungGap, Phase.GiantBranch, Phase.CoreHeliumBurning, Phase.EarlyAGB]);
    expect(evolveStar(1, 0.02, ages[0])!.mass).toBe(1);
    expect(evolveStar(1, 0.02, e.tEnd * 1.001)).toBeUndefined();
  });
});

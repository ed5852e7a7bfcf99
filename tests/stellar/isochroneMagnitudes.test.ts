/**
 * The built-in model end to end (evolution + built-in photometric calibration) against published
 * magnitudes and colours (issue 3; sources in references.md):
 *  - the Sun at 4.57 Gyr (age: common practice) with the model's solar Z: M_V within 0.10 of 4.81 (Willmer
 *    2018, from memory), B-V within 0.05 of 0.653 (Ramirez et al. 2012), BP-RP within 0.05 of 0.82
 *    (Casagrande & VandenBerg 2018);
 *  - the mean dwarf sequence of Pecaut & Mamajek 2013 (as updated; the fixture committed with the photometry
 *    tests) from 4000 to 7500 K: the main sequence of a 1 Gyr solar isochrone within 0.15 mag of each row,
 *    in (B-V, M_V) and in (BP-RP, M_G). "Within" is the distance in the colour-magnitude plane from the
 *    row to the isochrone's polyline; the vertical offset at the row's colour is printed too;
 *  - 12 Gyr, [Fe/H] = -1.5: turnoff (the main sequence's bluest point) at M_V +3.5 to +4.5 (globular
 *    clusters, common practice); horizontal branch within 0.3 of M_V = 0.23 [Fe/H] + 0.93 (Chaboyer 1999,
 *    from memory), the horizontal-branch level being the median M_V of its stars (a single-age population
 *    has equal numbers per equal step in initial mass over so narrow a range, so each segment counts by
 *    the initial mass it spans);
 *  - tip of the red giant branch at M_I = -4.05 +- 0.2 for [Fe/H] between -2.0 and -1.0 (Lee, Freedman &
 *    Madore 1993). Known failure: it holds from -2.0 to -1.3 but not at -1.2 to -1.0, where the published
 *    giant-branch radius makes the tip cooler than 3400 K (figures at the failing test; model caveats).
 *
 * Why the tip fails at [Fe/H] = -1.0 (checked against the HPT2000 Appendix, not a defect of ours): the tip's
 * luminosity is right (log L = 3.386, M_bol = -3.73, within 0.11 of Lee, Freedman & Madore's bolometric
 * relation as recalled in isochrone.test.ts), its temperature is not. At Z = 0.0020 eq. (46) with the
 * Appendix's b1-b7 gives R_GB = 193 Rsun at the tip (current mass 0.565 Msun), Teff = 2917 K, in a separate
 * evaluation outside this code with b4-b7 read against the authors' own data arrays (SSE zdata) and b1-b3
 * against the Appendix's formulae; the isochrone has 2918 K. Code and coefficient data are as published. The cause is the Appendix's b2 = min(max(10^(-4.6739 -
 * 0.9394 sigma), -0.04167 + 55.67 Z), ...): the linear floor takes over at Z = 0.00100 ([Fe/H] = -1.30) and
 * grows five-fold by Z = 0.0020 (0.0140 -> 0.0697; the power law alone would give 0.0073), while b3 is still
 * near its maximum (0.971 at Z = 0.00103, 0.925 at 0.0020, 0.792 at 0.004). The term b2 L^b3 grows from 27 to
 * 94 (29% -> 58% of the bracket) at the same L and mass, and the winds, which scale with R, take the mass down
 * from 0.865 to 0.565 Msun, which raises A by 8% (without winds the tip would be at 3028 K). Above Z = 0.00277
 * b1 leaves its 0.54 cap and b3 falls, so the tip warms again: 12 Gyr tips at [Fe/H] -1.3, -1.2, -1.1, -1.0,
 * -0.9, -0.7, -0.6 lie at 3876, 3405, 3090, 2918, 2871, 3497, 3962 K, and this check fails at every [Fe/H]
 * sampled every 0.05 dex from -1.25 to -0.70 (M_I -3.65 at -1.25, -0.76 at -0.9, -3.55 at -0.7; -3.98 at -0.65
 * passes). The bump sits between two metallicities of the tracks the fits were made to (Z = 0.001 and
 * 0.004; from memory), where the fit was not constrained. At the same luminosity but 3876 K (the tip's Teff
 * at -1.3) the built-in photometry would give BC_I = +0.32 and M_I = -4.05.
 *
 * The photometry adds to the miss but does not cause it: at 2918 K, [Fe/H] = -1, every Johnson-Cousins giant
 * colour is an extension (Ramirez & Melendez 2005 giants end at V-Ic = 1.524, about 4006 K, and B-V = 1.558,
 * 3820 K, at this [Fe/H]; Flower's BC_V ends at 3162 K), and it gives BC_V = -5.52, V-Ic = 2.79, BC_I = -2.74,
 * so M_I = -0.99. Real M giants are redder in V-Ic at such temperatures (V-Ic near 4 at 3000 K, and BC_I of
 * late M giants near or below zero; both from memory), so our extensions make I too faint there; but the
 * check would need BC_I >= +0.13 at M_bol = -3.73, which late M giants do not have, so a better M-giant
 * calibration alone would not make it pass. Of the passing tips, -2.0 (4323 K) is inside the V-Ic range
 * (edge 4287 K) and -1.7 to -1.3 lie 200-350 K beyond it (edges 4196, 4136, 4079 K), on its extension.
 */
import { describe, expect, it } from 'vitest';
import { Phase, type Isochrone } from '../../src/stellar/types.js';
import { isochrone } from '../../src/stellar/isochrone/isochrone.js';
import { evolveStar } from '../../src/stellar/evolution/star.js';
import { builtinPhotometry } from '../../src/stellar/photometry/index.js';
import { loadDwarfSequence } from './photometry/pecautMamajek.js';

const photometry = builtinPhotometry();
const OLD = Math.log10(12e9);

function nodesOf(iso: Isochrone, phase: Phase): number[] {
  const out: number[] = [];
  for (let i = 0; i < iso.phase.length; i++) if (iso.phase[i] === phase) out.push(i);
  return out;
}

describe('the Sun at 4.57 Gyr, Z = 0.02, with the built-in photometry', () => {
  const sun = evolveStar(1, 0.02, 4570)!;
  const bands = ['V', 'B', 'BP', 'RP'] as const;
  const out = bands.map(() => new Float64Array(1));
  photometry.absoluteMagnitudes(bands, Float64Array.of(sun.logL), Float64Array.of(sun.logTeff), Float64Array.of(sun.logg), 0, out, 1);
  const [V, B, BP, RP] = out.map((a) => a[0]);
  it('M_V within 0.10 of 4.81 (Willmer 2018; from memory)', () => expect(Math.abs(V - 4.81)).toBeLessThanOrEqual(0.1));
  it('B-V within 0.05 of 0.653 (Ramirez et al. 2012)', () => expect(Math.abs(B - V - 0.653)).toBeLessThanOrEqual(0.05));
  it('BP-RP within 0.05 of 0.82 (Casagrande & VandenBerg 2018)', () => expect(Math.abs(BP - RP - 0.82)).toBeLessThanOrEqual(0.05));
});

describe('main sequence of a 1 Gyr solar isochrone against the Pecaut & Mamajek dwarf sequence, 4000-7500 K', () => {
  const iso = isochrone(9.0, 0, { photometry, bands: ['B', 'V', 'G', 'BP', 'RP'] });
  const [B, V, G, BP, RP] = iso.absMag;
  const ms = nodesOf(iso, Phase.MainSequence);
  const rows = loadDwarfSequence().filter((r) => r.teff >= 4000 && r.teff <= 7500);

  /** Distance in the colour-magnitude plane from (c0, m0) to the main-sequence polyline. */
  function distance(colour: (i: number) => number, mag: (i: number) => number, c0: number, m0: number): number {
    let best = Infinity;
    for (let j = 1; j < ms.length; j++) {
      const ax = colour(ms[j - 1]);
      const ay = mag(ms[j - 1]);
      const dx = colour(ms[j]) - ax;
      const dy = mag(ms[j]) - ay;
      const l2 = dx * dx + dy * dy;
      const s = l2 > 0 ? Math.min(1, Math.max(0, ((c0 - ax) * dx + (m0 - ay) * dy) / l2)) : 0;
      best = Math.min(best, Math.hypot(ax + s * dx - c0, ay + s * dy - m0));
    }
    return best;
  }

  /** Magnitude of the faintest crossing of colour c0 (the unevolved main sequence), or NaN. */
  function magAtColour(colour: (i: number) => number, mag: (i: number) => number, c0: number): number {
    let best = NaN;
    for (let j = 1; j < ms.length; j++) {
      const ca = colour(ms[j - 1]);
      const cb = colour(ms[j]);
      if ((ca - c0) * (cb - c0) <= 0 && ca !== cb) {
        const m = mag(ms[j - 1]) + ((c0 - ca) / (cb - ca)) * (mag(ms[j]) - mag(ms[j - 1]));
        if (!(m <= best)) best = m;
      }
    }
    return best;
  }

  it('covers 4000-7500 K with 16 rows', () => expect(rows.length).toBe(16));

  it('(B-V, M_V) and (BP-RP, M_G) within 0.15 mag of every row', () => {
    const lines: string[] = [];
    let worst = 0;
    for (const r of rows) {
      const dV = distance((i) => B[i] - V[i], (i) => V[i], r.bv, r.mv);
      const dG = distance((i) => BP[i] - RP[i], (i) => G[i], r.bpRp, r.mg);
      const vV = magAtColour((i) => B[i] - V[i], (i) => V[i], r.bv) - r.mv;
      const vG = magAtColour((i) => BP[i] - RP[i], (i) => G[i], r.bpRp) - r.mg;
      lines.push(`${r.spt}: distance ${dV.toFixed(3)} (V) ${dG.toFixed(3)} (G); vertical ${vV.toFixed(3)} (M_V) ${vG.toFixed(3)} (M_G)`);
      worst = Math.max(worst, dV, dG);
    }
    process.stdout.write(`[dwarf sequence] ${lines.join('; ')}\n`);
    expect(worst).toBeLessThanOrEqual(0.15);
  });
});

describe('old metal-poor population, 12 Gyr', () => {
  const iso = isochrone(OLD, -1.5, { photometry, bands: ['V', 'I'] });
  const [V] = iso.absMag;

  it('turnoff (bluest main-sequence point) at M_V +3.5 to +4.5 ([Fe/H] = -1.5; common practice)', () => {
    let to = 0;
    for (const i of nodesOf(iso, Phase.MainSequence)) if (iso.logTeff[i] > iso.logTeff[to]) to = i;
    expect(V[to]).toBeGreaterThanOrEqual(3.5);
    expect(V[to]).toBeLessThanOrEqual(4.5);
  });

  it('horizontal branch: median M_V within 0.3 of 0.23 [Fe/H] + 0.93 ([Fe/H] = -1.5; Chaboyer 1999, from memory)', () => {
    const seg: [number, number][] = [];
    for (let i = 1; i < iso.phase.length; i++) {
      if (iso.phase[i] === Phase.CoreHeliumBurning && iso.phase[i - 1] === Phase.CoreHeliumBurning) {
        seg.push([iso.massInitial[i] - iso.massInitial[i - 1], 0.5 * (V[i] + V[i - 1])]);
      }
    }
    seg.sort((a, b) => a[1] - b[1]);
    const total = seg.reduce((s, x) => s + x[0], 0);
    let acc = 0;
    let median = NaN;
    for (const [w, mv] of seg) {
      acc += w;
      if (acc >= total / 2) {
        median = mv;
        break;
      }
    }
    expect(Math.abs(median - (0.23 * -1.5 + 0.93))).toBeLessThanOrEqual(0.3);
  });

  const tipMI = (feh: number): number => {
    const iso2 = isochrone(OLD, feh, { photometry, bands: ['I'] });
    let tip = -1;
    for (const i of nodesOf(iso2, Phase.GiantBranch)) if (tip < 0 || iso2.logL[i] > iso2.logL[tip]) tip = i;
    const mI = iso2.absMag[0][tip];
    process.stdout.write(
      `[tip] [Fe/H] ${feh}: M_I ${mI.toFixed(3)}, Teff ${(10 ** iso2.logTeff[tip]).toFixed(0)} K, log L ${iso2.logL[tip].toFixed(3)}, current mass ${iso2.massCurrent[tip].toFixed(3)}\n`,
    );
    return mI;
  };
  for (const feh of [-2.0, -1.7, -1.5, -1.3]) {
    it(`tip of the red giant branch at M_I = -4.05 +- 0.2, [Fe/H] = ${feh} (Lee, Freedman & Madore 1993)`, () => {
      expect(Math.abs(tipMI(feh) + 4.05)).toBeLessThanOrEqual(0.2);
    });
  }
  // Known failure, kept visible: at [Fe/H] = -1.0 the published giant-branch radius (HPT2000 eq. 46, b2's
  // floor in Z; see the header) puts the tip at 2918 K, and M_I comes out at -0.99 (M_bol -3.73, BC_I -2.74).
  // When the model improves, this test starts to fail and must be turned around.
  it.fails('tip of the red giant branch at M_I = -4.05 +- 0.2, [Fe/H] = -1.0 (known failure: the published R_GB makes the tip 2918 K)', () => {
    expect(Math.abs(tipMI(-1.0) + 4.05)).toBeLessThanOrEqual(0.2);
  });
});

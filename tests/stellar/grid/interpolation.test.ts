/**
 * GridSource: exact at the grid's nodes, continuous between them, and, on a grid whose isochrones share
 * their phase coordinates, equal to scipy's bilinear RegularGridInterpolator applied column by column at
 * fixed phase (an outside reference for the arithmetic of the interpolation).
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { ModelError } from '../../../src/core/errors.js';
import { buildGrid, GridSource, prepareCurve, type GridTable } from '../../../src/stellar/grid/index.js';
import type { Isochrone } from '../../../src/stellar/types.js';
import { describeWithReference, REFERENCES, SYSTEM_PYTHON } from '../../helpers/reference.js';
import { toySource } from './toyIsochrones.js';

const AGES = [9.0, 9.05, 9.1, 9.15];
const FEHS = [-1.0, -0.75, -0.5];
const BANDS = ['B', 'V', 'I'] as const;

function eepGrid(): GridTable {
  return buildGrid(toySource, AGES, FEHS, [...BANDS]);
}
/** The same grid without its phase column: the phase coordinate is derived from the curves' shapes. */
function derivedGrid(): GridTable {
  const g = eepGrid();
  return { ...g, phaseValue: undefined, meta: { ...g.meta, phaseKind: undefined, eepEncodesPhase: undefined } };
}

/** Linear interpolation of a column at phase coordinate u. */
function at(iso: Isochrone, col: Float64Array, u: number): number {
  const pc = iso.phaseCoord;
  let k = 0;
  while (k < pc.length - 2 && pc[k + 1] < u) k++;
  const t = (u - pc[k]) / (pc[k + 1] - pc[k]);
  return col[k] + Math.min(1, Math.max(0, t)) * (col[k + 1] - col[k]);
}

function maxDiff(a: Isochrone, b: Isochrone): number {
  let m = 0;
  const lo = Math.max(a.phaseCoord[0], b.phaseCoord[0]);
  const hi = Math.min(a.phaseCoord[a.phaseCoord.length - 1], b.phaseCoord[b.phaseCoord.length - 1]);
  for (let k = 0; k <= 400; k++) {
    const u = lo + ((hi - lo) * k) / 400;
    for (let j = 0; j < a.absMag.length; j++) m = Math.max(m, Math.abs(at(a, a.absMag[j], u) - at(b, b.absMag[j], u)));
    m = Math.max(m, Math.abs(at(a, a.massInitial, u) - at(b, b.massInitial, u)));
  }
  return m;
}

for (const [label, make] of [
  ['EEP column', eepGrid],
  ['derived phase', derivedGrid],
] as const) {
  describe(`GridSource with the ${label}`, () => {
    const grid = make();
    const src = new GridSource(grid);

    it('gives the grid\'s own isochrones at the nodes, row for row', () => {
      grid.isochrones.forEach((info) => {
        const iso = src.isochrone(info.logAgeYr, info.feh, { bands: [...BANDS] })!;
        const rows = (a: Float64Array) => Array.from(a.subarray(info.start, info.start + info.count));
        // A row repeats only at a zero-length phase segment (same row twice in a row): drop such repeats.
        const keep = Array.from(iso.massInitial, (_, k) => k).filter((k) => k === 0 || iso.massInitial[k] !== iso.massInitial[k - 1] || iso.logL[k] !== iso.logL[k - 1]);
        const pick = (a: Float64Array) => keep.map((k) => a[k]);
        expect(pick(iso.massInitial)).toEqual(rows(grid.massInitial));
        expect(pick(iso.logTeff)).toEqual(rows(grid.logTeff));
        expect(pick(iso.logg)).toEqual(rows(grid.logg));
        expect(pick(iso.logL)).toEqual(rows(grid.logL));
        BANDS.forEach((_, b) => expect(pick(iso.absMag[b])).toEqual(rows(grid.mag[b])));
      });
    });

    it('is continuous: approaching a node, and across cell edges', () => {
      const node = src.isochrone(9.05, -0.75, { bands: [...BANDS] })!;
      for (const d of [1e-3, 1e-5, 1e-7]) {
        for (const [da, df] of [[d, 0], [-d, 0], [0, d], [d, -d]]) {
          const near = src.isochrone(9.05 + da, -0.75 + df, { bands: [...BANDS] })!;
          // The change is at most (slope) x (step): magnitudes move by < 10 mag per unit of log age or [Fe/H].
          expect(maxDiff(near, node)).toBeLessThan(10 * d + 1e-12);
        }
      }
      // Across the edge log age = 9.1 inside the [Fe/H] interval (-0.75, -0.5).
      const below = src.isochrone(9.1 - 1e-9, -0.6, { bands: [...BANDS] })!;
      const above = src.isochrone(9.1 + 1e-9, -0.6, { bands: [...BANDS] })!;
      expect(maxDiff(below, above)).toBeLessThan(1e-7);
    });

    it('keeps the initial mass ordered and the phase coordinate rising', () => {
      for (const [a, f] of [[9.025, -0.9], [9.12, -0.55], [9.149, -0.999]]) {
        const iso = src.isochrone(a, f, { bands: ['V'] })!;
        for (let k = 1; k < iso.massInitial.length; k++) {
          expect(iso.massInitial[k]).toBeGreaterThanOrEqual(iso.massInitial[k - 1]);
          expect(iso.phaseCoord[k]).toBeGreaterThan(iso.phaseCoord[k - 1]);
        }
        expect(iso.absMag[0].every(Number.isFinite)).toBe(true);
      }
    });

    it('says undefined outside the grid, and refuses a band it lacks', () => {
      expect(src.isochrone(8.99, -0.75, { bands: ['V'] })).toBeUndefined();
      expect(src.isochrone(9.05, -0.4, { bands: ['V'] })).toBeUndefined();
      expect(src.isochrone(Number.NaN, -0.75, { bands: ['V'] })).toBeUndefined();
      expect(() => src.isochrone(9.05, -0.75, { bands: ['G'] })).toThrow(ModelError);
      expect(src.domain).toEqual({ logAgeYr: [9.0, 9.15], feh: [-1.0, -0.5] });
    });
  });
}

describe('derived phase coordinate', () => {
  it('finds the turnoff and the giant-branch tip where the curve says so', () => {
    const g = derivedGrid();
    const c = prepareCurve(g, 0);
    const info = g.isochrones[0];
    const rowAt = (u: number) => c.src[c.u.indexOf(u)] - info.start;
    // Turnoff (u = 2): the hottest main-sequence row; tip (u = 6): the brightest giant-branch row.
    let hottest = 0;
    let brightest = 0;
    for (let i = 0; i < info.count; i++) {
      if (g.logTeff[info.start + i] > g.logTeff[info.start + hottest] && i < 50) hottest = i;
      if (g.logL[info.start + i] > g.logL[info.start + brightest] && i < 90) brightest = i;
    }
    expect(rowAt(2)).toBe(hottest);
    expect(rowAt(6)).toBe(brightest);
  });
});

describeWithReference('bilinear interpolation at fixed phase agrees with scipy', REFERENCES.scipy, () => {
  it('RegularGridInterpolator(method="linear") on every column', () => {
    const grid = eepGrid();
    const src = new GridSource(grid);
    // The toy isochrones share their phase coordinates, so fixed-phase values form a regular (age, feh) grid.
    const n = grid.isochrones[0].count;
    const cube = FEHS.map((f) => AGES.map((a) => {
      const iso = grid.isochrones.find((i) => i.logAgeYr === a && i.feh === f)!;
      return Array.from(grid.mag[1].subarray(iso.start, iso.start + n));
    }));
    const queries = [[9.013, -0.97], [9.07, -0.6], [9.149, -0.501], [9.1, -0.9]];
    const script = `
import json, sys, numpy as np
from scipy.interpolate import RegularGridInterpolator
d = json.load(sys.stdin)
v = np.array(d['cube'])  # [feh][age][k]
out = []
for a, f in d['q']:
    r = RegularGridInterpolator((np.array(d['feh']), np.array(d['ages'])), v, method='linear')
    out.append(r([[f, a]])[0].tolist())
print(json.dumps(out))`;
    const r = spawnSync(SYSTEM_PYTHON, ['-c', script], { input: JSON.stringify({ cube, feh: FEHS, ages: AGES, q: queries }), encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const ref = JSON.parse(r.stdout) as number[][];
    queries.forEach(([a, f], j) => {
      const iso = src.isochrone(a, f, { bands: ['V'] })!;
      expect(iso.absMag[0].length).toBe(n);
      // Same sums of the same doubles in another order: agreement to 1e-12 mag.
      iso.absMag[0].forEach((m, k) => expect(Math.abs(m - ref[j][k])).toBeLessThan(1e-12));
    });
  });
});

describe('grids whose isochrones cover different phases', () => {
  // One node's isochrone stops before the horizontal branch (an EEP table that ends earlier there).
  function unevenGrid(): GridTable {
    const g = eepGrid();
    const k = g.isochrones.findIndex((i) => i.logAgeYr === 9.1 && i.feh === -0.75);
    const keep = g.isochrones[k].count - 20;
    const drop = new Set(Array.from({ length: 20 }, (_, i) => g.isochrones[k].start + keep + i));
    const rows = Array.from({ length: g.nRows }, (_, r) => r).filter((r) => !drop.has(r));
    const pick = (a: Float64Array) => Float64Array.from(rows, (r) => a[r]);
    let start = 0;
    const isochrones = g.isochrones.map((iso, j) => {
      const count = j === k ? keep : iso.count;
      const out = { ...iso, start, count };
      start += count;
      return out;
    });
    return {
      ...g,
      nRows: rows.length,
      massInitial: pick(g.massInitial),
      massCurrent: pick(g.massCurrent),
      phaseValue: pick(g.phaseValue!),
      logTeff: pick(g.logTeff),
      logg: pick(g.logg),
      logL: pick(g.logL),
      mag: g.mag.map(pick),
      rowSource: Int32Array.from(rows, (r) => g.rowSource[r]),
      rowLine: Int32Array.from(rows, (r) => g.rowLine[r]),
      isochrones,
    };
  }

  it('is exact at the short node, continuous next to it, and spans the weighted extent between', () => {
    const g = unevenGrid();
    const src = new GridSource(g);
    const node = src.isochrone(9.1, -0.75, { bands: ['V'] })!;
    const info = g.isochrones.find((i) => i.logAgeYr === 9.1 && i.feh === -0.75)!;
    expect(Array.from(node.absMag[0])).toEqual(Array.from(g.mag[1].subarray(info.start, info.start + info.count)));
    const near = src.isochrone(9.1 - 1e-7, -0.75, { bands: ['V'] })!;
    // The far end moves with the weights: by (1e-7 / 0.05) of the other node's extra extent.
    const extra = src.isochrone(9.05, -0.75, { bands: ['V'] })!.phaseCoord.at(-1)! - node.phaseCoord.at(-1)!;
    expect(near.phaseCoord.at(-1)! - node.phaseCoord.at(-1)!).toBeCloseTo((1e-7 / 0.05) * extra, 12);
    expect(Math.abs(near.absMag[0].at(-1)! - node.absMag[0].at(-1)!)).toBeLessThan(1e-4);
    const mid = src.isochrone(9.075, -0.75, { bands: ['V'] })!;
    for (let k = 1; k < mid.massInitial.length; k++) expect(mid.massInitial[k]).toBeGreaterThanOrEqual(mid.massInitial[k - 1]);
  });
});

describe('stage-labelled grids', () => {
  it('interpolates the hand-made fixture between its ages, keeping the stages in order', async () => {
    const { loadGridMap } = await import('../../../src/config/index.js');
    const { gridImportSpec } = await import('../../../src/pipeline/gridModel.js');
    const { importGrid } = await import('../../../src/stellar/grid/index.js');
    const { resolve, join } = await import('node:path');
    const { mkdtempSync, readFileSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const fix = resolve(import.meta.dirname, 'fixtures');
    const lines = readFileSync(join(fix, 'quirky-stacked.dat'), 'utf8').split('\n');
    const last = lines.findIndex((l) => l.includes('age = 1.9952623e+09'));
    const dir = mkdtempSync(join(tmpdir(), 'coeval-stage-'));
    writeFileSync(join(dir, 'q.dat'), `${lines.slice(0, last - 1).join('\n')}\n`);
    const { grid: section } = loadGridMap(join(fix, 'quirky-map.toml'));
    const g = (await importGrid(gridImportSpec(section, dir, 'grid', [join(dir, 'q.dat')]))).grid;
    const src = new GridSource(g);
    const feh = g.isochrones[0].feh;
    const iso = src.isochrone(9.05, feh, { bands: ['V'] })!;
    for (let k = 1; k < iso.phase.length; k++) {
      expect(iso.phase[k]).toBeGreaterThanOrEqual(iso.phase[k - 1]);
      expect(iso.massInitial[k]).toBeGreaterThanOrEqual(iso.massInitial[k - 1]);
    }
    // Stage boundaries sit at integer phase coordinates: 0 MS, 1 SGB, 2 RGB, the last row at 3.
    expect(iso.phaseCoord[0]).toBe(0);
    expect(iso.phaseCoord.at(-1)).toBe(3);
    expect(new Set(iso.phase)).toEqual(new Set([1, 2, 3]));
  });
});

/**
 * `GridSource`: isochrones at any (log age, [Fe/H]) inside a user's grid, behind the same `IsochroneSource`
 * interface as the built-in model.
 *
 * Interpolation. The grid's isochrones are arranged in rows of equal [Fe/H], each row sorted by age (rows
 * may hold different ages). A query between rows i and i+1 interpolates linearly in log age within each row
 * and then linearly in [Fe/H] between the rows: bilinear on a rectangular grid, and the same scheme where
 * the rows' ages differ. The (up to) four corner isochrones are combined at equal phase coordinate
 * (phaseCoordinate.ts), with constant, non-negative weights, so every column (initial mass, log Teff, log g,
 * log L, magnitudes) is the weighted mean of the corners' values at the same evolutionary point, and the
 * initial mass stays ordered along the result.
 *
 * The phase coordinates at which the result is given are the union of the corners' own vertex coordinates.
 * Each corner is piecewise linear in u between its vertices, so the result is exactly the weighted mean of
 * the corners' polylines, with no resampling error. Hence:
 *  - at a grid node the result is that isochrone itself (its rows, in order; a row repeats only where a
 *    zero-length phase segment sits), and
 *  - the result is continuous in (log age, [Fe/H]): across a cell edge the two cells' results are the same
 *    piecewise-linear function of u (extra vertices lie on it).
 * Where corners cover different ranges of u (EEP tables that stop at different points), the result spans
 * the weighted mean of their ranges, and a corner is held at its end point beyond its own range; this keeps
 * the result exact at nodes and continuous.
 *
 * Speed. The union of a cell's coordinates and each corner's values on it are computed once per cell and
 * cached (a few cells cover a sampler's neighbourhood); a query is then one weighted sum per output value.
 */
import type { BandId } from '../../core/bands.js';
import { ModelError } from '../../core/errors.js';
import type { Isochrone, IsochroneRequest, IsochroneSource, ModelProvenance } from '../types.js';
import type { GridTable } from './gridTable.js';
import { prepareCurve, type PreparedCurve } from './phaseCoordinate.js';
import { gridProvenance } from './gridProvenance.js';
import { SAME_VALUE } from './validateGrid.js';

export interface GridSourceOptions {
  /** Most memory the cell cache may hold, in bytes (default 128 MB). */
  cacheBytes?: number;
}

/** One row of equal [Fe/H]: ages ascending and the isochrone index of each. */
export interface GridRow {
  feh: number;
  logAge: Float64Array;
  iso: Int32Array;
}

interface Cell {
  /** Union of the corners' phase coordinates. */
  u: Float64Array;
  corners: number[];
  /** values[j][c]: corner j's column c on u. Columns: massInitial, massCurrent, logTeff, logg, logL, mags. */
  values: Float64Array[][];
  phase: Uint8Array[];
  /** Coverage of each corner in u. */
  lo: Float64Array;
  hi: Float64Array;
  bytes: number;
}

const BASE_COLUMNS = 5;

export class GridSource implements IsochroneSource {
  readonly provenance: ModelProvenance;
  readonly bands: readonly BandId[];
  readonly domain: { logAgeYr: readonly [number, number]; feh: readonly [number, number] };
  readonly grid: GridTable;
  readonly rows: GridRow[];
  private readonly curves: PreparedCurve[];
  private readonly columns: Float64Array[];
  private readonly cells = new Map<string, Cell>();
  /** Node isochrones in phase-coordinate form, built on first request (copies are returned). */
  private readonly nodes = new Map<number, { cols: Float64Array[]; u: Float64Array; phase: Uint8Array }>();
  private cacheBytes = 0;
  private readonly maxCacheBytes: number;

  constructor(grid: GridTable, options: GridSourceOptions = {}) {
    this.grid = grid;
    this.bands = grid.bands;
    this.maxCacheBytes = options.cacheBytes ?? 128 * 2 ** 20;
    this.curves = grid.isochrones.map((_, k) => prepareCurve(grid, k));
    this.columns = [grid.massInitial, grid.massCurrent, grid.logTeff, grid.logg, grid.logL, ...grid.mag];
    this.rows = buildRows(grid);
    const ages = this.rows.flatMap((r) => [r.logAge[0], r.logAge[r.logAge.length - 1]]);
    this.domain = {
      logAgeYr: [Math.min(...ages), Math.max(...ages)],
      feh: [this.rows[0].feh, this.rows[this.rows.length - 1].feh],
    };
    this.provenance = gridProvenance(grid);
  }

  /** The corner isochrones and weights for a query, or undefined outside the grid. */
  corners(logAgeYr: number, feh: number): { iso: number; w: number }[] | undefined {
    if (!Number.isFinite(logAgeYr) || !Number.isFinite(feh)) return undefined;
    const rows = this.rows;
    const fr = bracket(rows.length, (i) => rows[i].feh, feh);
    if (!fr) return undefined;
    const out: { iso: number; w: number }[] = [];
    for (const [ri, wr] of fr) {
      const row = rows[ri];
      const ar = bracket(row.logAge.length, (i) => row.logAge[i], logAgeYr);
      if (!ar) return undefined;
      for (const [ai, wa] of ar) out.push({ iso: row.iso[ai], w: wr * wa });
    }
    return out;
  }

  isochrone(logAgeYr: number, feh: number, request: IsochroneRequest): Isochrone | undefined {
    const bandIdx = request.bands.map((b) => {
      const k = this.bands.indexOf(b);
      if (k < 0) {
        throw new ModelError(`the isochrone grid "${this.grid.meta.name}" has no ${b} magnitudes`, {
          expected: `one of its bands: ${this.bands.join(', ')}`,
          hint: 'map that band when importing the grid, or fit the bands it has',
        });
      }
      return k;
    });
    const corners = this.corners(logAgeYr, feh);
    if (!corners) return undefined;
    if (corners.length === 1) return this.node(corners[0].iso, logAgeYr, feh, request.bands, bandIdx);
    return this.interpolate(corners, logAgeYr, feh, request.bands, bandIdx);
  }

  /**
   * A grid isochrone exactly as stored: its rows in order, in phase-coordinate form. Where the curve has a
   * zero-length segment (a landmark it lacks, or a stage it skips) the row there appears once per segment
   * boundary, each with its own phase coordinate, exactly as interpolated results near this node have it.
   */
  private node(k: number, logAgeYr: number, feh: number, bands: readonly BandId[], bandIdx: number[]): Isochrone {
    let cached = this.nodes.get(k);
    if (!cached) {
      const c = this.curves[k];
      const m = c.src.length;
      const cols = this.columns.map((arr) => {
        const o = new Float64Array(m);
        for (let i = 0; i < m; i++) o[i] = arr[c.src[i]];
        return o;
      });
      cached = { cols, u: c.u, phase: c.phase };
      this.nodes.set(k, cached);
    }
    const cols = cached.cols;
    return {
      logAgeYr,
      feh,
      massInitial: cols[0].slice(),
      massCurrent: cols[1].slice(),
      phase: cached.phase.slice(),
      phaseCoord: cached.u.slice(),
      logL: cols[4].slice(),
      logTeff: cols[2].slice(),
      logg: cols[3].slice(),
      bands: [...bands],
      absMag: bandIdx.map((b) => cols[BASE_COLUMNS + b].slice()),
      provenance: this.provenance,
    };
  }

  private interpolate(corners: { iso: number; w: number }[], logAgeYr: number, feh: number, bands: readonly BandId[], bandIdx: number[]): Isochrone {
    const cell = this.cell(corners.map((c) => c.iso));
    const nc = corners.length;
    const w = corners.map((c) => c.w);
    let uLo = 0;
    let uHi = 0;
    let jMax = 0;
    for (let j = 0; j < nc; j++) {
      uLo += w[j] * cell.lo[j];
      uHi += w[j] * cell.hi[j];
      if (w[j] > w[jMax]) jMax = j;
    }
    const U = cell.u;
    const P = U.length;
    let p0 = 0;
    while (p0 < P && U[p0] <= uLo) p0++;
    let p1 = P - 1;
    while (p1 >= 0 && U[p1] >= uHi) p1--;
    // Output: uLo, the union points strictly inside (uLo, uHi), uHi.
    const inner = Math.max(0, p1 - p0 + 1);
    const n = inner + 2;
    const cols = [0, 1, 2, 3, 4, ...bandIdx.map((b) => BASE_COLUMNS + b)];
    const nCols = cols.length;
    const out: Float64Array[] = new Array(nCols);
    // One allocation for every output column (and the phase coordinate): views on a single buffer.
    const buffer = new Float64Array(n * (nCols + 1));
    const w0 = w[0];
    const w1 = w[1];
    const w2 = nc > 2 ? w[2] : 0;
    const w3 = nc > 3 ? w[3] : 0;
    for (let c = 0; c < nCols; c++) {
      const col = cols[c];
      const o = buffer.subarray(c * n, (c + 1) * n);
      if (col === 1 && !this.grid.hasMassCurrent) {
        o.fill(Number.NaN);
        out[c] = o;
        continue;
      }
      const a0 = cell.values[0][col];
      const a1 = cell.values[1][col];
      // One weighted sum per output value; the loops are split by corner count to stay monomorphic.
      if (nc === 2) {
        for (let p = p0, q = 1; p <= p1; p++, q++) o[q] = w0 * a0[p] + w1 * a1[p];
      } else if (nc === 3) {
        const a2 = cell.values[2][col];
        for (let p = p0, q = 1; p <= p1; p++, q++) o[q] = w0 * a0[p] + w1 * a1[p] + w2 * a2[p];
      } else {
        const a2 = cell.values[2][col];
        const a3 = cell.values[3][col];
        for (let p = p0, q = 1; p <= p1; p++, q++) o[q] = w0 * a0[p] + w1 * a1[p] + w2 * a2[p] + w3 * a3[p];
      }
      o[0] = this.combinedAt(cell, col, w, uLo);
      o[n - 1] = this.combinedAt(cell, col, w, uHi);
      out[c] = o;
    }
    const uOut = buffer.subarray(nCols * n, (nCols + 1) * n);
    uOut[0] = uLo;
    if (inner > 0) uOut.set(U.subarray(p0, p1 + 1), 1);
    uOut[n - 1] = uHi;
    // Phase labels from the corner with the largest weight (constant over the query, so they stay in order).
    const phase = new Uint8Array(n);
    const ph = cell.phase[jMax];
    if (inner > 0) phase.set(ph.subarray(p0, p1 + 1), 1);
    phase[0] = ph[Math.min(P - 1, Math.max(0, p0 - 1))];
    phase[n - 1] = ph[Math.min(P - 1, p1 + 1)];
    const nb = bandIdx.length;
    return {
      logAgeYr,
      feh,
      massInitial: out[0],
      massCurrent: out[1],
      phase,
      phaseCoord: uOut,
      logL: out[4],
      logTeff: out[2],
      logg: out[3],
      bands: [...bands],
      absMag: Array.from({ length: nb }, (_, b) => out[BASE_COLUMNS + b]),
      provenance: this.provenance,
    };
  }

  /** The weighted sum of column `col` at phase u: linear between the union points around u. */
  private combinedAt(cell: Cell, col: number, w: number[], u: number): number {
    const U = cell.u;
    const P = U.length;
    let lo = 0;
    let hi = P - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (U[mid] <= u) lo = mid;
      else hi = mid;
    }
    const t = U[hi] > U[lo] ? Math.min(1, Math.max(0, (u - U[lo]) / (U[hi] - U[lo]))) : 0;
    let va = 0;
    let vb = 0;
    for (let j = 0; j < w.length; j++) {
      va += w[j] * cell.values[j][col][lo];
      vb += w[j] * cell.values[j][col][hi];
    }
    return t === 0 ? va : t === 1 ? vb : va + t * (vb - va);
  }

  /** The union of the corners' phase coordinates and every corner's columns on it, cached. */
  private cell(isos: number[]): Cell {
    const key = isos.join(',');
    const hit = this.cells.get(key);
    if (hit) {
      this.cells.delete(key);
      this.cells.set(key, hit);
      return hit;
    }
    const curves = isos.map((k) => this.curves[k]);
    const u = unionSorted(curves.map((c) => c.u));
    const P = u.length;
    const nCols = this.columns.length;
    const values: Float64Array[][] = [];
    const phase: Uint8Array[] = [];
    const lo = new Float64Array(isos.length);
    const hi = new Float64Array(isos.length);
    const ra = new Int32Array(P);
    const rb = new Int32Array(P);
    const tt = new Float64Array(P);
    curves.forEach((c, j) => {
      const ph = new Uint8Array(P);
      const m = c.u.length;
      lo[j] = c.u[0];
      hi[j] = c.u[m - 1];
      // Where each union point falls on this corner: rows around it and the fraction between them.
      let a = 0;
      for (let p = 0; p < P; p++) {
        const x = u[p];
        while (a < m - 2 && c.u[a + 1] <= x) a++;
        if (x <= c.u[0]) {
          ra[p] = rb[p] = c.src[0];
          tt[p] = 0;
          ph[p] = c.phase[0];
        } else if (x >= c.u[m - 1]) {
          ra[p] = rb[p] = c.src[m - 1];
          tt[p] = 0;
          ph[p] = c.phase[m - 1];
        } else {
          ra[p] = c.src[a];
          rb[p] = c.src[a + 1];
          const t = (x - c.u[a]) / (c.u[a + 1] - c.u[a]);
          tt[p] = t;
          ph[p] = c.phase[t < 1 ? a : a + 1];
        }
      }
      const vals = this.columns.map((arr) => {
        const o = new Float64Array(P);
        for (let p = 0; p < P; p++) {
          const va = arr[ra[p]];
          const t = tt[p];
          o[p] = t === 0 ? va : va + t * (arr[rb[p]] - va);
        }
        return o;
      });
      values.push(vals);
      phase.push(ph);
    });
    const bytes = P * 8 * (1 + nCols * isos.length) + P * isos.length;
    const cell: Cell = { u, corners: isos, values, phase, lo, hi, bytes };
    this.cells.set(key, cell);
    this.cacheBytes += bytes;
    for (const [k, c] of this.cells) {
      if (this.cacheBytes <= this.maxCacheBytes || this.cells.size <= 1) break;
      this.cells.delete(k);
      this.cacheBytes -= c.bytes;
    }
    return cell;
  }
}

/**
 * The nodes around x in a sorted list and their linear weights: one node (weight 1) when x is a node,
 * two otherwise; undefined outside.
 */
function bracket(n: number, at: (i: number) => number, x: number): [number, number][] | undefined {
  // A dimension with one value (a single-metallicity grid) is a point: accept values within SAME_VALUE.
  if (n === 1) return Math.abs(x - at(0)) <= SAME_VALUE ? [[0, 1]] : undefined;
  if (n === 0 || x < at(0) || x > at(n - 1)) return undefined;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (at(mid) <= x) lo = mid;
    else hi = mid;
  }
  if (at(lo) === x) return [[lo, 1]];
  if (at(hi) === x) return [[hi, 1]];
  const t = (x - at(lo)) / (at(hi) - at(lo));
  return [
    [lo, 1 - t],
    [hi, t],
  ];
}

function unionSorted(arrays: Float64Array[]): Float64Array {
  const all = new Float64Array(arrays.reduce((s, a) => s + a.length, 0));
  let o = 0;
  for (const a of arrays) {
    all.set(a, o);
    o += a.length;
  }
  all.sort();
  let m = 0;
  for (let i = 0; i < all.length; i++) if (m === 0 || all[i] !== all[m - 1]) all[m++] = all[i];
  return all.slice(0, m);
}

/** Rows of equal [Fe/H] (within SAME_VALUE), each sorted by age. */
export function buildRows(g: GridTable): GridRow[] {
  const byFeh = new Map<number, { feh: number; items: { a: number; k: number }[] }>();
  g.isochrones.forEach((iso, k) => {
    const key = Math.round(iso.feh / SAME_VALUE);
    const e = byFeh.get(key) ?? { feh: iso.feh, items: [] };
    e.items.push({ a: iso.logAgeYr, k });
    byFeh.set(key, e);
  });
  return [...byFeh.values()]
    .sort((a, b) => a.feh - b.feh)
    .map((e) => {
      e.items.sort((x, y) => x.a - y.a);
      return { feh: e.feh, logAge: Float64Array.from(e.items.map((i) => i.a)), iso: Int32Array.from(e.items.map((i) => i.k)) };
    });
}

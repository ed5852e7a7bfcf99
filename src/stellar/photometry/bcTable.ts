/**
 * The calibration tabulated once, so that the hot path costs nanoseconds per star.
 *
 * Bolometric corrections of each band are evaluated directly (bolometricCorrections.ts, a root-find per
 * colour) at the nodes of a grid in (log Teff, log g, [Fe/H]) and interpolated trilinearly. Trilinear
 * interpolation of a continuous table is continuous in every input, so nothing jumps; the tests bound its
 * difference from the direct evaluation. The log g axis is dense (0.05 dex) across 2.9-3.7, where dwarf and
 * giant relations are blended, and sparse elsewhere, where magnitudes are linear in log g (Casagrande et
 * al. 2021) or independent of it. Tables are filled lazily, one [Fe/H] slab of one photometric system at a
 * time, when a call first needs it, and kept for the life of the process.
 *
 * Inputs beyond the grid are held at its edge: log Teff 3.35-4.70 (2240-50 000 K), log g -1 to 5.5,
 * [Fe/H] -3.0 to +0.6. The magnitude then still varies continuously with log L.
 */
import {
  GAIA_2MASS_BANDS,
  gaiaTwoMassBcsFrom,
  JOHNSON_COUSINS_BANDS,
  johnsonCousinsBcsFrom,
  type PhotometryBand,
} from './bolometricCorrections.js';
import { bcG, evaluateGaiaTwoMassColours, prepareGaiaTwoMass, type GaiaTwoMassPoint } from './gaia2mass.js';
import { dwarfWeight, evaluateJohnsonCousins, mixJohnsonCousins, prepareJohnsonCousins, type JohnsonCousinsPoint } from './johnsonCousins.js';

export interface UniformAxis {
  min: number;
  step: number;
  n: number;
}

function uniformAxis(min: number, max: number, step: number): UniformAxis {
  return { min, step, n: Math.round((max - min) / step) + 1 };
}

function loggNodes(): Float64Array {
  const nodes = [-1.0, -0.5, -0.1, 0.1, 0.5, 1.0, 1.5, 2.0, 2.5, 2.75, 2.9];
  for (let k = 0; k <= 16; k++) nodes.push(Math.round((2.95 + 0.05 * k) * 100) / 100);
  nodes.push(3.8, 4.0, 4.25, 4.5, 4.75, 4.9, 5.1, 5.5);
  return Float64Array.from(nodes);
}

export const BC_GRID = {
  logTeff: uniformAxis(3.35, 4.7, 0.005),
  logg: loggNodes(),
  feh: uniformAxis(-3.0, 0.6, 0.1),
} as const;

const NT = BC_GRID.logTeff.n;
const NG = BC_GRID.logg.length;
const NF = BC_GRID.feh.n;

/** Number of nodes per table; index = (iFeh * nLogg + iLogg) * nLogTeff + iLogTeff. */
export const BC_TABLE_SIZE = NT * NG * NF;

type System = 'jc' | 'gaia';

interface SystemTables {
  bands: readonly PhotometryBand[];
  tables: Float32Array[];
  /** built[k]: the [Fe/H] slab k (all log g and log Teff nodes at feh node k) has been filled. */
  built: Uint8Array;
  buildSlab(k: number, tables: Float32Array[]): void;
}

const systems = new Map<System, SystemTables>();

function systemOf(band: PhotometryBand): System {
  return (JOHNSON_COUSINS_BANDS as readonly string[]).includes(band) ? 'jc' : 'gaia';
}

function logTeffAt(i: number): number {
  return BC_GRID.logTeff.min + i * BC_GRID.logTeff.step;
}

function fehAt(k: number): number {
  return BC_GRID.feh.min + k * BC_GRID.feh.step;
}

/** Johnson-Cousins slab: the relations do not depend on log g except through the dwarf/giant weight. */
function buildJohnsonCousinsSlab(k: number, out: Float32Array[]): void {
  const d: JohnsonCousinsPoint = { bcV: 0, bv: NaN, vr: NaN, vi: NaN };
  const g: JohnsonCousinsPoint = { bcV: 0, bv: NaN, vr: NaN, vi: NaN };
  const m: JohnsonCousinsPoint = { bcV: 0, bv: 0, vr: 0, vi: 0 };
  const bc = new Float64Array(4);
  const weights = Float64Array.from(BC_GRID.logg, dwarfWeight);
  const dwarf = prepareJohnsonCousins('dwarf', fehAt(k));
  const giant = prepareJohnsonCousins('giant', fehAt(k));
  for (let i = 0; i < NT; i++) {
    evaluateJohnsonCousins(dwarf, logTeffAt(i), d);
    evaluateJohnsonCousins(giant, logTeffAt(i), g);
    for (let j = 0; j < NG; j++) {
      mixJohnsonCousins(d, g, weights[j], m);
      johnsonCousinsBcsFrom(m, bc);
      const idx = (k * NG + j) * NT + i;
      for (let b = 0; b < 4; b++) out[b][idx] = bc[b];
    }
  }
}

let bcGOfT: Float64Array | undefined;

function buildGaiaTwoMassSlab(k: number, out: Float32Array[]): void {
  bcGOfT ??= Float64Array.from({ length: NT }, (_, i) => bcG(logTeffAt(i)));
  const p: GaiaTwoMassPoint = { bcG: 0, gBp: NaN, bpRp: NaN, gJ: NaN, gH: NaN, gKs: NaN };
  const bc = new Float64Array(6);
  for (let j = 0; j < NG; j++) {
    const prepared = prepareGaiaTwoMass(BC_GRID.logg[j], fehAt(k));
    const row = (k * NG + j) * NT;
    p.gBp = p.bpRp = p.gJ = p.gH = p.gKs = NaN;
    for (let i = 0; i < NT; i++) {
      p.bcG = bcGOfT[i];
      evaluateGaiaTwoMassColours(prepared, logTeffAt(i), p);
      gaiaTwoMassBcsFrom(p, bc);
      for (let b = 0; b < 6; b++) out[b][row + i] = bc[b];
    }
  }
}

function system(s: System): SystemTables {
  let t = systems.get(s);
  if (!t) {
    const bands = s === 'jc' ? JOHNSON_COUSINS_BANDS : GAIA_2MASS_BANDS;
    t = {
      bands,
      tables: bands.map(() => new Float32Array(BC_TABLE_SIZE)),
      built: new Uint8Array(NF),
      buildSlab: s === 'jc' ? buildJohnsonCousinsSlab : buildGaiaTwoMassSlab,
    };
    systems.set(s, t);
  }
  return t;
}

function ensureSlab(t: SystemTables, k: number): void {
  if (t.built[k]) return;
  t.buildSlab(k, t.tables);
  t.built[k] = 1;
}

/**
 * The table of one band, ready for interpolation at [Fe/H] = feh: the two [Fe/H] slabs that bracket it are
 * built if they were not yet (each slab costs milliseconds: a fit touches only the metallicities it
 * visits). Without feh, the whole table is built (tests, tools).
 */
export function bcTable(band: PhotometryBand, feh?: number): Float32Array {
  const t = system(systemOf(band));
  if (feh === undefined) {
    for (let k = 0; k < NF; k++) ensureSlab(t, k);
  } else if (feh === feh) {
    let u = (feh - BC_GRID.feh.min) / BC_GRID.feh.step;
    if (u < 0) u = 0;
    else if (u > NF - 1) u = NF - 1;
    const k = Math.min(Math.floor(u), NF - 2);
    ensureSlab(t, k);
    ensureSlab(t, k + 1);
  }
  return t.tables[t.bands.indexOf(band)];
}

/** Cell of the log g axis for each 0.01 dex step from its first node: a constant-time lookup. */
const LOGG_LOOKUP_STEP = 0.01;
const LOGG_LOOKUP = (() => {
  const nodes = BC_GRID.logg;
  const n = Math.round((nodes[NG - 1] - nodes[0]) / LOGG_LOOKUP_STEP) + 1;
  const cells = new Int16Array(n);
  let c = 0;
  for (let s = 0; s < n; s++) {
    const x = nodes[0] + s * LOGG_LOOKUP_STEP;
    while (c < NG - 2 && x >= nodes[c + 1] - 1e-9) c++;
    cells[s] = c;
  }
  return cells;
})();

/**
 * Position of a point in the grid: base index of the cell's lower corner and the fractional offsets along
 * each axis. Computed once per star and reused for every band.
 */
export interface GridPosition {
  base: number;
  ft: number;
  fg: number;
  ff: number;
}

export function newGridPosition(): GridPosition {
  return { base: 0, ft: 0, fg: 0, ff: 0 };
}

const T_MIN = BC_GRID.logTeff.min;
const T_STEP = BC_GRID.logTeff.step;
const F_MIN = BC_GRID.feh.min;
const F_STEP = BC_GRID.feh.step;
const G_NODES = BC_GRID.logg;
const G_MIN = G_NODES[0];
const G_MAX = G_NODES[NG - 1];

/** Fills `pos` for (logTeff, logg, feh); returns false (and leaves pos alone) if any input is NaN. */
export function gridPosition(logTeff: number, logg: number, feh: number, pos: GridPosition): boolean {
  if (!(logTeff === logTeff && logg === logg && feh === feh)) return false;
  let ut = (logTeff - T_MIN) / T_STEP;
  if (ut < 0) ut = 0;
  else if (ut > NT - 1) ut = NT - 1;
  let uf = (feh - F_MIN) / F_STEP;
  if (uf < 0) uf = 0;
  else if (uf > NF - 1) uf = NF - 1;
  // The last cell serves points on the upper edge, so that index + 1 stays in range.
  let it = Math.floor(ut);
  if (it > NT - 2) it = NT - 2;
  let iff = Math.floor(uf);
  if (iff > NF - 2) iff = NF - 2;
  let g = logg;
  if (g < G_MIN) g = G_MIN;
  else if (g > G_MAX) g = G_MAX;
  const ig = LOGG_LOOKUP[Math.floor((g - G_MIN) / LOGG_LOOKUP_STEP + 1e-9)];
  pos.base = (iff * NG + ig) * NT + it;
  pos.ft = ut - it;
  pos.fg = (g - G_NODES[ig]) / (G_NODES[ig + 1] - G_NODES[ig]);
  pos.ff = uf - iff;
  return true;
}

const STRIDE_G = NT;
const STRIDE_F = NT * NG;

/** Trilinear interpolation of `table` at `pos`. */
export function interpolate(table: Float32Array, pos: GridPosition): number {
  const b = pos.base;
  const ft = pos.ft;
  const fg = pos.fg;
  const c00 = table[b] + ft * (table[b + 1] - table[b]);
  const c10 = table[b + STRIDE_G] + ft * (table[b + STRIDE_G + 1] - table[b + STRIDE_G]);
  const b1 = b + STRIDE_F;
  const c01 = table[b1] + ft * (table[b1 + 1] - table[b1]);
  const c11 = table[b1 + STRIDE_G] + ft * (table[b1 + STRIDE_G + 1] - table[b1 + STRIDE_G]);
  const c0 = c00 + fg * (c10 - c00);
  const c1 = c01 + fg * (c11 - c01);
  return c0 + pos.ff * (c1 - c0);
}

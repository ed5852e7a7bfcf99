/**
 * Helpers for the interpolation-accuracy checks: features of an isochrone in the colour-magnitude diagram
 * (turnoff, giant branch), a comparison at matched phase, and the naive mass-matched interpolation that
 * phase matching replaces (kept here, as the reference it is measured against; coeval does not offer it).
 */
import type { Isochrone, IsochroneSource } from '../../../src/stellar/types.js';
import { Phase } from '../../../src/stellar/types.js';
import type { GridSource } from '../../../src/stellar/grid/index.js';

/** Bands are [B, V, I]: colour B-V, magnitude V. */
export function turnoff(iso: Isochrone): { v: number; bv: number; mass: number } {
  // The bluest main-sequence point.
  let best = -1;
  for (let k = 0; k < iso.logTeff.length; k++) {
    if (iso.phase[k] !== Phase.MainSequence) continue;
    if (best < 0 || iso.logTeff[k] > iso.logTeff[best]) best = k;
  }
  return { v: iso.absMag[1][best], bv: iso.absMag[0][best] - iso.absMag[1][best], mass: iso.massInitial[best] };
}

/** Geometric turnoff for curves whose phase labels cannot be trusted: bluest point fainter than vLimit. */
export function turnoffGeometric(iso: Isochrone, vLimit: number): { v: number; bv: number } {
  let best = -1;
  for (let k = 0; k < iso.logTeff.length; k++) {
    if (!(iso.absMag[1][k] > vLimit)) continue;
    if (best < 0 || iso.logTeff[k] > iso.logTeff[best]) best = k;
  }
  return { v: iso.absMag[1][best], bv: iso.absMag[0][best] - iso.absMag[1][best] };
}

/** Linear interpolation of col at phase coordinate u (phaseCoord rises). */
export function atPhase(iso: Isochrone, col: Float64Array, u: number): number {
  const pc = iso.phaseCoord;
  let lo = 0;
  let hi = pc.length - 1;
  if (u <= pc[0]) return col[0];
  if (u >= pc[hi]) return col[hi];
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (pc[mid] <= u) lo = mid;
    else hi = mid;
  }
  const t = (u - pc[lo]) / (pc[hi] - pc[lo]);
  return col[lo] + t * (col[hi] - col[lo]);
}

/** Largest |dV| and |d(B-V)| between two isochrones at equal phase coordinate over [u0, u1]. */
export function maxErrorAtPhase(a: Isochrone, b: Isochrone, u0: number, u1: number, n = 200): { v: number; bv: number } {
  let v = 0;
  let bv = 0;
  for (let k = 0; k <= n; k++) {
    const u = u0 + ((u1 - u0) * k) / n;
    const va = atPhase(a, a.absMag[1], u);
    const vb = atPhase(b, b.absMag[1], u);
    const ca = atPhase(a, a.absMag[0], u) - va;
    const cb = atPhase(b, b.absMag[0], u) - vb;
    v = Math.max(v, Math.abs(va - vb));
    bv = Math.max(bv, Math.abs(ca - cb));
  }
  return { v, bv };
}

/**
 * The naive scheme: combine the same corners with the same weights, but at equal initial mass. Each corner
 * is linear in initial mass between its rows; the result spans the masses all corners have.
 */
export function massMatched(grid: GridSource, logAgeYr: number, feh: number, truthFor: (k: number) => Isochrone): Isochrone {
  const corners = grid.corners(logAgeYr, feh)!;
  const isos = corners.map((c) => truthFor(c.iso));
  const lo = Math.max(...isos.map((i) => i.massInitial[0]));
  const hi = Math.min(...isos.map((i) => i.massInitial[i.massInitial.length - 1]));
  const masses = [...new Set(isos.flatMap((i) => Array.from(i.massInitial)))].filter((m) => m >= lo && m <= hi).sort((a, b) => a - b);
  const n = masses.length;
  const at = (iso: Isochrone, col: Float64Array, m: number): number => {
    const mi = iso.massInitial;
    let k = 0;
    while (k < mi.length - 2 && mi[k + 1] < m) k++;
    const t = mi[k + 1] > mi[k] ? (m - mi[k]) / (mi[k + 1] - mi[k]) : 0;
    return col[k] + Math.min(1, Math.max(0, t)) * (col[k + 1] - col[k]);
  };
  const mix = (pick: (iso: Isochrone) => Float64Array) =>
    Float64Array.from(masses, (m) => corners.reduce((s, c, j) => s + c.w * at(isos[j], pick(isos[j]), m), 0));
  return {
    logAgeYr,
    feh,
    massInitial: Float64Array.from(masses),
    massCurrent: mix((i) => i.massCurrent),
    phase: new Uint8Array(n),
    phaseCoord: Float64Array.from(masses, (_, k) => k),
    logL: mix((i) => i.logL),
    logTeff: mix((i) => i.logTeff),
    logg: mix((i) => i.logg),
    bands: isos[0].bands,
    absMag: isos[0].bands.map((_, b) => mix((i) => i.absMag[b])),
    provenance: isos[0].provenance,
  };
}

export type { IsochroneSource };

/**
 * Small synthetic isochrones for testing the grid machinery (import, cache, exactness at nodes, continuity),
 * not stellar physics: smooth curves with a main sequence, a turnoff whose mass and brightness move with age
 * and metallicity, a subgiant branch, a giant branch, a jump to a horizontal branch and an early AGB. The
 * phase coordinate is phase + 0.999 * fraction, as the built-in model writes it. Invented for tests.
 */
import type { BandId } from '../../../src/core/bands.js';
import { Phase, type Isochrone, type IsochroneSource, type ModelProvenance } from '../../../src/stellar/types.js';

export const TOY_PROVENANCE: ModelProvenance = {
  model: 'toy isochrones (tests only)',
  evolution: 'synthetic curves made in tests/stellar/grid/toyIsochrones.ts',
  solarZ: 0.02,
  alphaFe: 0,
  bands: {},
  caveats: ['not a stellar model'],
};

const BANDS: BandId[] = ['B', 'V', 'I'];

export function toyIsochrone(logAgeYr: number, feh: number, nMs = 40, nPost = 60): Isochrone {
  const mTo = 1.05 * 10 ** (-(logAgeYr - 9.8) / 2.6) * (1 + 0.08 * feh);
  const pts: { m: number; ph: Phase; f: number; lt: number; ll: number }[] = [];
  const lTo = 4.2 * Math.log10(mTo) + 0.1 * feh;
  const tTo = 3.79 + 0.2 * Math.log10(mTo) - 0.05 * feh;
  for (let i = 0; i < nMs; i++) {
    const f = i / nMs;
    const m = 0.15 * (mTo / 0.15) ** f;
    const lm = Math.log10(m);
    pts.push({ m, ph: Phase.MainSequence, f, ll: 4.2 * lm + 0.1 * feh, lt: 3.79 + 0.2 * lm - 0.05 * feh - 0.02 * f ** 8 });
  }
  const dm = 0.08 * mTo;
  const nSgb = Math.round(nPost * 0.3);
  for (let i = 0; i < nSgb; i++) {
    const f = i / nSgb;
    pts.push({ m: mTo + 0.1 * dm * f, ph: Phase.HertzsprungGap, f, ll: lTo + 0.25 * f, lt: tTo - 0.02 - 0.1 * f });
  }
  const nRgb = Math.round(nPost * 0.5);
  for (let i = 0; i < nRgb; i++) {
    const f = i / nRgb;
    pts.push({ m: mTo + dm * (0.1 + 0.6 * f), ph: Phase.GiantBranch, f, ll: lTo + 0.25 + (3.3 - lTo - 0.25) * f ** 0.8, lt: tTo - 0.12 - 0.18 * f ** 1.5 });
  }
  const nHb = nPost - nSgb - nRgb;
  for (let i = 0; i < nHb; i++) {
    const f = i / nHb;
    pts.push({ m: mTo + dm * (0.7 + 0.3 * f), ph: f < 0.5 ? Phase.CoreHeliumBurning : Phase.EarlyAGB, f: f < 0.5 ? 2 * f : 2 * f - 1, ll: 1.7 + 0.3 * f + 1.2 * Math.max(0, f - 0.5), lt: 3.72 - 0.02 * feh - 0.08 * f });
  }
  const n = pts.length;
  const iso: Isochrone = {
    logAgeYr,
    feh,
    massInitial: Float64Array.from(pts.map((p) => p.m)),
    massCurrent: Float64Array.from(pts.map((p) => p.m * (p.ph >= Phase.CoreHeliumBurning ? 0.85 : 1))),
    phase: Uint8Array.from(pts.map((p) => p.ph)),
    phaseCoord: Float64Array.from(pts.map((p) => p.ph + 0.999 * p.f)),
    logL: Float64Array.from(pts.map((p) => p.ll)),
    logTeff: Float64Array.from(pts.map((p) => p.lt)),
    logg: Float64Array.from(pts.map((p) => 4.438 + Math.log10(p.m) + 4 * (p.lt - 3.7613) - p.ll)),
    bands: [...BANDS],
    absMag: BANDS.map((_, b) => Float64Array.from(pts.map((p) => 4.74 - 2.5 * p.ll + (b - 1) * 6 * (3.77 - p.lt) + 0.05 * (b - 1)))),
    provenance: TOY_PROVENANCE,
  };
  void n;
  return iso;
}

export const toySource: IsochroneSource = {
  provenance: TOY_PROVENANCE,
  bands: BANDS,
  domain: { logAgeYr: [8.5, 10.2], feh: [-2.5, 0.5] },
  isochrone(logAgeYr, feh, request) {
    if (logAgeYr < 8.5 || logAgeYr > 10.2 || feh < -2.5 || feh > 0.5) return undefined;
    const iso = toyIsochrone(logAgeYr, feh);
    const idx = request.bands.map((b) => iso.bands.indexOf(b));
    return { ...iso, bands: [...request.bands], absMag: idx.map((k) => iso.absMag[k]) };
  },
};

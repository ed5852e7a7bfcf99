/** `coeval grid info`: what a grid holds and where it has holes. */
import type { BandId } from '../../core/bands.js';
import type { GridTable } from './gridTable.js';
import { buildRows } from './gridSource.js';

export interface GridInfo {
  name: string;
  citation: string;
  sources: { path: string; sha256: string; bytes: number }[];
  nIsochrones: number;
  nRows: number;
  bands: BandId[];
  metallicityScale: string;
  solarZ?: number;
  alphaFe: number;
  /** Distinct log ages and [Fe/H] values. */
  logAges: number[];
  fehs: number[];
  rows: { feh: number; metallicityRaw: number; nAges: number; logAgeMin: number; logAgeMax: number }[];
  massInitial: { min: number; max: number; topMin: number; topMax: number };
  phases: { kind: 'eep' | 'stage' | 'derived'; labels?: string[]; min?: number; max?: number };
  rowsPerIsochrone: { min: number; median: number; max: number };
  gaps: string[];
  notes: string[];
  columnMap: Record<string, string>;
}

export function gridInfo(g: GridTable): GridInfo {
  const rows = buildRows(g);
  const distinct = (xs: number[]): number[] => {
    const s = [...xs].sort((a, b) => a - b);
    return s.filter((x, i) => i === 0 || x - s[i - 1] > 1e-6);
  };
  const logAges = distinct(g.isochrones.map((i) => i.logAgeYr));
  const fehs = rows.map((r) => r.feh);
  let mMin = Infinity;
  let mMax = -Infinity;
  const tops: number[] = [];
  for (const iso of g.isochrones) {
    let top = -Infinity;
    for (let r = iso.start; r < iso.start + iso.count; r++) {
      mMin = Math.min(mMin, g.massInitial[r]);
      top = Math.max(top, g.massInitial[r]);
    }
    mMax = Math.max(mMax, top);
    tops.push(top);
  }
  const counts = g.isochrones.map((i) => i.count).sort((a, b) => a - b);
  let phases: GridInfo['phases'];
  if (g.meta.phaseKind === 'stage') phases = { kind: 'stage', labels: g.meta.stageLabels };
  else if (g.meta.phaseKind === 'eep' && g.phaseValue) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of g.phaseValue) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    phases = { kind: 'eep', min: lo, max: hi };
  } else phases = { kind: 'derived' };
  return {
    name: g.meta.name,
    citation: g.meta.citation,
    sources: g.meta.sources.map(({ path, sha256, bytes }) => ({ path, sha256, bytes })),
    nIsochrones: g.isochrones.length,
    nRows: g.nRows,
    bands: g.bands,
    metallicityScale: g.meta.metallicityScale,
    solarZ: g.meta.solarZ,
    alphaFe: g.meta.alphaFe,
    logAges,
    fehs,
    rows: rows.map((r) => ({
      feh: r.feh,
      metallicityRaw: g.isochrones[r.iso[0]].metallicityRaw,
      nAges: r.logAge.length,
      logAgeMin: r.logAge[0],
      logAgeMax: r.logAge[r.logAge.length - 1],
    })),
    massInitial: { min: mMin, max: mMax, topMin: Math.min(...tops), topMax: Math.max(...tops) },
    phases,
    rowsPerIsochrone: { min: counts[0], median: counts[counts.length >> 1], max: counts[counts.length - 1] },
    gaps: findGaps(rows, logAges),
    notes: g.meta.notes,
    columnMap: g.meta.columnMap,
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0 ? Number.NaN : s[s.length >> 1];
}

function findGaps(rows: ReturnType<typeof buildRows>, logAges: number[]): string[] {
  const gaps: string[] = [];
  // Missing (age, [Fe/H]) pairs of the lattice, inside each row's own age range.
  const missing: string[] = [];
  for (const r of rows) {
    const have = Array.from(r.logAge);
    for (const a of logAges) {
      if (a < r.logAge[0] - 1e-6 || a > r.logAge[r.logAge.length - 1] + 1e-6) continue;
      if (!have.some((x) => Math.abs(x - a) <= 1e-6)) missing.push(`log age ${a.toFixed(4)} at [Fe/H] ${r.feh.toFixed(3)}`);
    }
  }
  if (missing.length > 0) gaps.push(`${missing.length} isochrone${missing.length === 1 ? '' : 's'} missing inside the age range of their metallicity: ${missing.slice(0, 8).join('; ')}${missing.length > 8 ? '; ...' : ''}`);
  // Rows whose age ranges differ: the interpolation covers only ages both neighbouring rows have.
  const lo = rows.map((r) => r.logAge[0]);
  const hi = rows.map((r) => r.logAge[r.logAge.length - 1]);
  if (Math.max(...lo) - Math.min(...lo) > 1e-6 || Math.max(...hi) - Math.min(...hi) > 1e-6) {
    gaps.push(`the metallicities cover different ages (log age from ${Math.min(...lo).toFixed(4)}-${Math.max(...lo).toFixed(4)} to ${Math.min(...hi).toFixed(4)}-${Math.max(...hi).toFixed(4)}): between two metallicities only the ages both have can be interpolated`);
  }
  // Steps in age much wider than the row's usual step.
  for (const r of rows) {
    const steps = Array.from({ length: r.logAge.length - 1 }, (_, i) => r.logAge[i + 1] - r.logAge[i]);
    const m = median(steps);
    steps.forEach((s, i) => {
      if (s > 1.5 * m + 1e-9) gaps.push(`a wide age step at [Fe/H] ${r.feh.toFixed(3)}: log age ${r.logAge[i].toFixed(4)} to ${r.logAge[i + 1].toFixed(4)} (usual step ${m.toFixed(4)})`);
    });
  }
  const fsteps = rows.slice(1).map((r, i) => r.feh - rows[i].feh);
  const fm = median(fsteps);
  fsteps.forEach((s, i) => {
    if (s > 1.5 * fm + 1e-9) gaps.push(`a wide metallicity step: [Fe/H] ${rows[i].feh.toFixed(3)} to ${rows[i + 1].feh.toFixed(3)} (usual step ${fm.toFixed(3)})`);
  });
  return gaps;
}

/** The info as text for a terminal. */
export function formatGridInfo(i: GridInfo): string {
  const out: string[] = [];
  const f = (x: number, d = 4): string => (Number.isFinite(x) ? x.toFixed(d) : String(x));
  out.push(`grid        ${i.name}`);
  out.push(`citation    ${i.citation || '(none given: add one before publishing)'}`);
  out.push(i.sources.length === 0 ? 'tables      none: computed by coeval (see the notes)' : `tables      ${i.sources.length} file${i.sources.length === 1 ? '' : 's'}: ${i.sources.map((s) => s.path).join(', ')}`);
  out.push(`isochrones  ${i.nIsochrones} (${i.nRows} rows; ${i.rowsPerIsochrone.min} / ${i.rowsPerIsochrone.median} / ${i.rowsPerIsochrone.max} rows per isochrone, min / median / max)`);
  out.push(`bands       ${i.bands.join(', ')}`);
  const metWords = i.metallicityScale === 'z' ? `from Z with solar Z = ${i.solarZ}` : i.metallicityScale === 'm_h' ? 'from [M/H]' : 'as given';
  out.push(`[Fe/H]      ${i.fehs.length} value${i.fehs.length === 1 ? '' : 's'} from ${f(i.fehs[0], 3)} to ${f(i.fehs[i.fehs.length - 1], 3)} (${metWords}; [alpha/Fe] = ${i.alphaFe})`);
  out.push(`log age     ${i.logAges.length} value${i.logAges.length === 1 ? '' : 's'} from ${f(i.logAges[0])} to ${f(i.logAges[i.logAges.length - 1])}`);
  for (const r of i.rows) {
    const raw = i.metallicityScale === 'fe_h' ? '' : ` (${i.metallicityScale === 'z' ? 'Z' : '[M/H]'} = ${r.metallicityRaw})`;
    out.push(`  [Fe/H] ${f(r.feh, 3).padStart(7)}${raw}: ${r.nAges} ages, log age ${f(r.logAgeMin)} .. ${f(r.logAgeMax)}`);
  }
  out.push(`mass        initial mass ${f(i.massInitial.min)} .. ${f(i.massInitial.max)} Msun; the most massive star per isochrone ${f(i.massInitial.topMin)} .. ${f(i.massInitial.topMax)}`);
  const p = i.phases;
  out.push(
    p.kind === 'eep'
      ? `phases      EEP column, ${f(p.min ?? NaN, 2)} .. ${f(p.max ?? NaN, 2)}`
      : p.kind === 'stage'
        ? `phases      stage labels, in order: ${(p.labels ?? []).join(', ')}`
        : 'phases      no phase column: phase derived from each isochrone\'s shape',
  );
  out.push(i.gaps.length === 0 ? 'gaps        none' : `gaps        ${i.gaps.length}:`);
  for (const gp of i.gaps) out.push(`  - ${gp}`);
  for (const n of i.notes) out.push(`note        ${n}`);
  return out.join('\n');
}

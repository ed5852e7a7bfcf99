/**
 * Import an isochrone grid from the tables a stellar-model group publishes, with nothing but a column map.
 *
 * Rows are split into isochrones where a block of comment lines (or blank lines, or a repeated header line)
 * begins, where a new file begins, and where the age or metallicity changes. Ages become log10(age / yr),
 * metallicities [Fe/H] (metallicity.ts). Checks of the grid as a whole (duplicates, ordering, NaN rows, a
 * truncated last isochrone) are in validateGrid.ts; this module only refuses what it cannot read.
 */
import { createHash } from 'node:crypto';
import { closeSync, openSync, readSync, statSync } from 'node:fs';
import { ConfigError, InputError } from '../../core/errors.js';
import { requireFile } from '../../core/files.js';
import type { BandId } from '../../core/bands.js';
import type { GridIsochroneInfo, GridMeta, GridSourceFile, GridTable } from './gridTable.js';
import type { GridImportSpec } from './importSpec.js';
import { fehToMh, mhToFeh, zToMh } from './metallicity.js';
import type { RawGridTable, RawTableRequest } from './rawTable.js';
import { readGridArrowSource } from './readGridArrowSource.js';
import { readGridText } from './readGridText.js';

export const GRID_FORMAT_VERSION = 1;

/** IAU 2015 Resolution B3 nominal solar values: log10(GM/R^2 in cgs) = 4.4381 and Teff = 5772 K. */
const LOG_G_SUN = Math.log10(1.3271244e26 / (6.957e10 * 6.957e10));
const LOG_TEFF_SUN = Math.log10(5772);

export interface ImportResult {
  grid: GridTable;
  /** How each file was read, in words. */
  details: { path: string; detail: string }[];
}

export async function importGrid(spec: GridImportSpec, createdBy = 'coeval'): Promise<ImportResult> {
  checkSpec(spec);
  const cols = spec.columns;
  const numberCols = [cols.massInitial, cols.logTeff, cols.logL, ...spec.bands.map(([, c]) => c)];
  if (cols.age) numberCols.push(cols.age);
  if (cols.metallicity) numberCols.push(cols.metallicity);
  if (cols.massCurrent) numberCols.push(cols.massCurrent);
  if (cols.logg) numberCols.push(cols.logg);
  const textCols: string[] = [];
  if (cols.phase) (spec.phaseKind === 'stage' ? textCols : numberCols).push(cols.phase);
  const roleOf = new Map<string, string>();
  const role = (k: string, c: string | undefined): void => {
    if (c !== undefined && !roleOf.has(c)) roleOf.set(c, `${spec.keyPrefix}.${k}`);
  };
  role('columns.mass_initial', cols.massInitial);
  role('columns.log_teff', cols.logTeff);
  role('columns.log_l', cols.logL);
  role('columns.age', cols.age);
  role('columns.metallicity', cols.metallicity);
  role('columns.mass_current', cols.massCurrent);
  role('columns.log_g', cols.logg);
  role('columns.phase', cols.phase);
  for (const [b, c] of spec.bands) role(`bands.${b}`, c);

  const ageRe = compilePattern(spec.ageInHeader, `${spec.keyPrefix}.age_in_header`);
  const metRe = compilePattern(spec.metallicityInHeader, `${spec.keyPrefix}.metallicity_in_header`);

  const sources: GridSourceFile[] = [];
  const details: { path: string; detail: string }[] = [];
  const parts: { raw: RawGridTable; logAge: Float64Array; feh: Float64Array; metRaw: Float64Array; source: number }[] = [];
  for (const file of spec.files) {
    requireFile(file.path, 'isochrone table');
    const format = spec.format === 'auto' ? detectFormat(file.path) : spec.format;
    const req: RawTableRequest = {
      numbers: numberCols,
      texts: textCols,
      comment: spec.comment,
      delimiter: spec.delimiter ?? (format === 'csv' ? ',' : undefined),
      keyOf: (c) => roleOf.get(c) ?? 'the column map',
    };
    const raw = format === 'arrow' ? readGridArrowSource(file.path, req) : readGridText(file.path, req);
    const source = sources.length;
    sources.push({ path: file.path, ...checksum(file.path), kind: raw.kind });
    details.push({ path: file.path, detail: raw.detail });

    // Age and metallicity of every row: a column, a per-file value, or a pattern in the comments above.
    const n = raw.nRows;
    const ageCol = cols.age ? raw.numbers.get(cols.age)! : undefined;
    const metCol = cols.metallicity ? raw.numbers.get(cols.metallicity)! : undefined;
    const blockAge = ageCol || file.age !== undefined ? undefined : valuesFromComments(raw, ageRe, 'age', spec);
    const blockMet = metCol || file.metallicity !== undefined ? undefined : valuesFromComments(raw, metRe, 'metallicity', spec);
    const logAge = new Float64Array(n);
    const feh = new Float64Array(n);
    const metRaw = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const a = ageCol ? ageCol[i] : file.age !== undefined ? file.age : blockAge![raw.block[i]];
      const m = metCol ? metCol[i] : file.metallicity !== undefined ? file.metallicity : blockMet![raw.block[i]];
      logAge[i] = toLogAge(a, spec.ageUnit);
      metRaw[i] = m;
      feh[i] = toFeh(m, spec);
    }
    parts.push({ raw, logAge, feh, metRaw, source });
  }

  // Stage labels in evolutionary order: numeric labels by value, text labels by first appearance.
  let stageLabels: string[] | undefined;
  const stageIndex = new Map<string, number>();
  if (cols.phase && spec.phaseKind === 'stage') {
    const seen: string[] = [];
    const set = new Set<string>();
    for (const p of parts) for (const s of p.raw.texts.get(cols.phase)!) if (!set.has(s)) {
      set.add(s);
      seen.push(s);
    }
    const numeric = seen.every((s) => s.trim() !== '' && Number.isFinite(Number(s)));
    stageLabels = numeric ? [...seen].sort((a, b) => Number(a) - Number(b)) : seen;
    stageLabels.forEach((s, k) => stageIndex.set(s, k));
  }

  const nRows = parts.reduce((s, p) => s + p.raw.nRows, 0);
  const nb = spec.bands.length;
  const grid: GridTable = {
    meta: metaOf(spec, sources, stageLabels, createdBy),
    bands: spec.bands.map(([b]) => b) as BandId[],
    nRows,
    massInitial: new Float64Array(nRows),
    massCurrent: new Float64Array(nRows).fill(Number.NaN),
    hasMassCurrent: cols.massCurrent !== undefined,
    phaseValue: cols.phase ? new Float64Array(nRows) : undefined,
    logTeff: new Float64Array(nRows),
    logg: new Float64Array(nRows),
    logL: new Float64Array(nRows),
    mag: Array.from({ length: nb }, () => new Float64Array(nRows)),
    rowSource: new Int32Array(nRows),
    rowLine: new Int32Array(nRows),
    isochrones: [],
  };
  let r = 0;
  let dropped = 0;
  for (const p of parts) {
    const raw = p.raw;
    const get = (c: string) => raw.numbers.get(c)!;
    const mi = get(cols.massInitial);
    const mc = cols.massCurrent ? get(cols.massCurrent) : undefined;
    const te = get(cols.logTeff);
    const ll = get(cols.logL);
    const lg = cols.logg ? get(cols.logg) : undefined;
    const ph = cols.phase ? (spec.phaseKind === 'stage' ? undefined : get(cols.phase)) : undefined;
    const st = cols.phase && spec.phaseKind === 'stage' ? raw.texts.get(cols.phase)! : undefined;
    const mags = spec.bands.map(([, c]) => get(c));
    let current: GridIsochroneInfo | undefined;
    for (let i = 0; i < raw.nRows; i++) {
      const g = lg ? lg[i] : LOG_G_SUN + Math.log10(mc ? mc[i] : mi[i]) + 4 * (te[i] - LOG_TEFF_SUN) - ll[i];
      if (spec.dropNanRows) {
        let bad = !Number.isFinite(p.logAge[i]) || !Number.isFinite(p.feh[i]) || !Number.isFinite(mi[i]) || !Number.isFinite(te[i]) || !Number.isFinite(ll[i]) || !Number.isFinite(g);
        if (mc && !Number.isFinite(mc[i])) bad = true;
        if (ph && !Number.isFinite(ph[i])) bad = true;
        for (let b = 0; b < nb; b++) if (!Number.isFinite(mags[b][i])) bad = true;
        if (bad) {
          dropped++;
          continue;
        }
      }
      const newIso =
        current === undefined ||
        raw.block[i] !== raw.block[i - 1] ||
        p.logAge[i] !== p.logAge[i - 1] ||
        p.feh[i] !== p.feh[i - 1] ||
        (Number.isNaN(p.logAge[i]) !== Number.isNaN(p.logAge[i - 1]));
      if (newIso) {
        current = { logAgeYr: p.logAge[i], feh: p.feh[i], metallicityRaw: p.metRaw[i], start: r, count: 0, source: p.source };
        grid.isochrones.push(current);
      }
      current!.count++;
      grid.massInitial[r] = mi[i];
      if (mc) grid.massCurrent[r] = mc[i];
      grid.logTeff[r] = te[i];
      grid.logL[r] = ll[i];
      grid.logg[r] = g;
      if (ph) grid.phaseValue![r] = ph[i];
      if (st) grid.phaseValue![r] = stageIndex.get(st[i])!;
      for (let b = 0; b < nb; b++) grid.mag[b][r] = mags[b][i];
      grid.rowSource[r] = p.source;
      grid.rowLine[r] = raw.line[i];
      r++;
    }
  }
  if (r < nRows) shrink(grid, r);
  if (dropped > 0) grid.meta.notes.push(`${dropped} row${dropped === 1 ? '' : 's'} with a missing (NaN) value in a mapped column were dropped (${spec.keyPrefix}.drop_nan_rows)`);
  return { grid, details };
}

function checkSpec(spec: GridImportSpec): void {
  if (spec.files.length === 0) {
    throw new ConfigError('no isochrone tables are named', { where: { key: `${spec.keyPrefix}.files` }, hint: 'list the downloaded tables in files = [...]' });
  }
  if (spec.metallicityScale === 'z' && !(spec.solarZ !== undefined && spec.solarZ > 0)) {
    throw new ConfigError('the metallicity is given as Z, so the solar Z of the grid is needed to turn it into [M/H]', {
      where: { key: `${spec.keyPrefix}.solar_z` },
      expected: 'solar_z = the solar metallicity of the model family (its papers state it)',
      hint: 'add solar_z to the grid settings',
    });
  }
  if (spec.columns.phase && !spec.phaseKind) {
    throw new ConfigError('a phase column is mapped, but not what it holds', {
      where: { key: `${spec.keyPrefix}.phase_kind` },
      expected: 'phase_kind = "eep" (a number that rises along each isochrone and marks the same phase in all) or "stage" (a label per evolutionary stage)',
    });
  }
  if (spec.bands.length === 0) {
    throw new ConfigError('no bands are mapped', { where: { key: `${spec.keyPrefix}.bands` }, hint: 'map each band to its magnitude column, e.g. V = "<column>"' });
  }
  const needAge = !spec.columns.age && !spec.ageInHeader && spec.files.some((f) => f.age === undefined);
  if (needAge) {
    throw new ConfigError('the grid has no age: no age column, no age per file, and no pattern for the age in the comments', {
      where: { key: `${spec.keyPrefix}.columns.age` },
      hint: 'map the age column, or give each file its age, or set age_in_header to a pattern with one group',
    });
  }
  const needMet = !spec.columns.metallicity && !spec.metallicityInHeader && spec.files.some((f) => f.metallicity === undefined);
  if (needMet) {
    throw new ConfigError('the grid has no metallicity: no metallicity column, no value per file, and no pattern for it in the comments', {
      where: { key: `${spec.keyPrefix}.columns.metallicity` },
      hint: 'map the metallicity column, or give each file its metallicity, or set metallicity_in_header to a pattern with one group',
    });
  }
}

function compilePattern(p: string | undefined, key: string): RegExp | undefined {
  if (p === undefined) return undefined;
  let re: RegExp;
  try {
    re = new RegExp(p);
  } catch (e) {
    throw new ConfigError(`the pattern is not a valid regular expression: ${(e as Error).message}`, { where: { key }, found: p });
  }
  if (new RegExp(`${p}|`).exec('')!.length < 2) {
    throw new ConfigError('the pattern needs one group in parentheses around the number', { where: { key }, found: p, expected: 'e.g. "age = ([0-9.eE+-]+)"' });
  }
  return re;
}

/**
 * Per block, the value the pattern finds in the comment lines before the block, or (when the block's own
 * comments do not have it) the last value found earlier in the file: a metallicity stated once in a file's
 * header holds for every isochrone below it.
 */
function valuesFromComments(raw: RawGridTable, re: RegExp | undefined, what: string, spec: GridImportSpec): Float64Array {
  const out = new Float64Array(raw.blockComments.length).fill(Number.NaN);
  let last = Number.NaN;
  for (let b = 0; b < raw.blockComments.length; b++) {
    for (const c of raw.blockComments[b]) {
      const m = re?.exec(c);
      if (m && m[1] !== undefined) last = Number(m[1].replace(/[dD]/, 'e'));
    }
    out[b] = last;
    if (Number.isNaN(last)) {
      const firstRow = raw.block.indexOf(b);
      throw new InputError(`no ${what} for the isochrone starting here: the comment lines above it do not match ${spec.keyPrefix}.${what}_in_header`, {
        where: { file: raw.path, line: raw.line[Math.max(0, firstRow)] },
        found: raw.blockComments[b].slice(-3).join(' | ') || '(no comment lines)',
        expected: `a comment line matching /${re?.source ?? ''}/`,
        hint: `adjust the pattern, or give the ${what} per file`,
      });
    }
  }
  return out;
}

export function toLogAge(a: number, unit: GridImportSpec['ageUnit']): number {
  switch (unit) {
    case 'log_yr':
      return a;
    case 'yr':
      return Math.log10(a);
    case 'myr':
      return Math.log10(a) + 6;
    case 'gyr':
      return Math.log10(a) + 9;
  }
}

function toFeh(m: number, spec: GridImportSpec): number {
  switch (spec.metallicityScale) {
    case 'fe_h':
      return m;
    case 'm_h':
      return mhToFeh(m, spec.alphaFe);
    case 'z':
      return mhToFeh(zToMh(m, spec.solarZ!), spec.alphaFe);
  }
}

function metaOf(spec: GridImportSpec, sources: GridSourceFile[], stageLabels: string[] | undefined, createdBy: string): GridMeta {
  const c = spec.columns;
  const columnMap: Record<string, string> = { mass_initial: c.massInitial, log_teff: c.logTeff, log_l: c.logL };
  if (c.age) columnMap.age = c.age;
  if (c.metallicity) columnMap.metallicity = c.metallicity;
  if (c.massCurrent) columnMap.mass_current = c.massCurrent;
  if (c.logg) columnMap.log_g = c.logg;
  if (c.phase) columnMap.phase = c.phase;
  for (const [b, col] of spec.bands) columnMap[`band ${b}`] = col;
  const notes: string[] = [];
  if (spec.ageUnit !== 'log_yr') notes.push(`ages converted from ${spec.ageUnit === 'yr' ? 'years' : spec.ageUnit === 'myr' ? 'Myr' : 'Gyr'} to log10(age / yr)`);
  if (spec.metallicityScale === 'z') notes.push(`[M/H] = log10(Z / Zsun) with Zsun = ${spec.solarZ}`);
  if (spec.metallicityScale !== 'fe_h') {
    notes.push(
      spec.alphaFe === 0
        ? '[Fe/H] = [M/H] (scaled-solar mixture, [alpha/Fe] = 0)'
        : `[Fe/H] = [M/H] - log10(0.638 f + 0.362), f = 10^[alpha/Fe], [alpha/Fe] = ${spec.alphaFe} (Salaris et al. 1993); [M/H] - [Fe/H] = ${fehToMh(0, spec.alphaFe).toFixed(4)}`,
    );
  }
  if (!c.logg) notes.push(`log g computed from ${c.massCurrent ? 'the current' : 'the initial'} mass, log Teff and log L with the IAU 2015 nominal solar values (log g_sun = ${LOG_G_SUN.toFixed(4)}, Teff_sun = 5772 K)`);
  if (spec.ageInHeader) notes.push(`ages read from comment lines by the pattern /${spec.ageInHeader}/`);
  if (spec.metallicityInHeader) notes.push(`metallicities read from comment lines by the pattern /${spec.metallicityInHeader}/`);
  return {
    name: spec.name,
    citation: spec.citation,
    ageUnit: spec.ageUnit,
    metallicityScale: spec.metallicityScale,
    solarZ: spec.solarZ,
    alphaFe: spec.alphaFe,
    phaseKind: c.phase ? spec.phaseKind : undefined,
    stageLabels,
    stagePhases: spec.stagePhases,
    columnMap,
    sources,
    notes,
    createdBy,
  };
}

function checksum(path: string): { sha256: string; bytes: number } {
  const h = createHash('sha256');
  const fd = openSync(path, 'r');
  const buf = Buffer.allocUnsafe(1 << 22);
  try {
    for (;;) {
      const got = readSync(fd, buf, 0, buf.length, null);
      if (got === 0) break;
      h.update(buf.subarray(0, got));
    }
  } finally {
    closeSync(fd);
  }
  return { sha256: h.digest('hex'), bytes: statSync(path).size };
}

function detectFormat(path: string): 'text' | 'csv' | 'arrow' {
  const lower = path.toLowerCase();
  if (/\.(arrow|feather|ipc|arrows)$/.test(lower)) return 'arrow';
  const fd = openSync(path, 'r');
  const head = Buffer.alloc(8);
  try {
    readSync(fd, head, 0, 8, 0);
  } finally {
    closeSync(fd);
  }
  if (head.toString('latin1', 0, 6) === 'ARROW1' || (head.readUInt32LE(0) === 0xffffffff)) return 'arrow';
  if (lower.endsWith('.csv')) return 'csv';
  return 'text';
}

function shrink(g: GridTable, n: number): void {
  g.nRows = n;
  g.massInitial = g.massInitial.slice(0, n);
  g.massCurrent = g.massCurrent.slice(0, n);
  if (g.phaseValue) g.phaseValue = g.phaseValue.slice(0, n);
  g.logTeff = g.logTeff.slice(0, n);
  g.logg = g.logg.slice(0, n);
  g.logL = g.logL.slice(0, n);
  g.mag = g.mag.map((m) => m.slice(0, n));
  g.rowSource = g.rowSource.slice(0, n);
  g.rowLine = g.rowLine.slice(0, n);
}

/**
 * The grid cache: one Arrow IPC file (`grid.arrow`) with a row per isochrone point and the grid's
 * provenance as JSON in the schema metadata (key `coeval.grid`): source files with sha256 checksums, the
 * column map, the solar Z, the citation, and the isochrones' ages, metallicities and row ranges. Only mapped
 * columns are kept, as float64 (so that the grid's own isochrones are reproduced bit for bit), plus each
 * row's source file and line, so that a problem found at `coeval check` still names the original table.
 * Any Arrow reader can open it (pyarrow, arrow-js, polars); the columns are self-describing:
 *   isochrone, log_age, feh, mass_initial, [mass_current], [phase], log_teff, log_g, log_l, mag_<band>..., source, line
 */
import { readFileSync } from 'node:fs';
import { makeTable, RecordBatch, Schema, Table, tableFromIPC, tableToIPC, type Vector } from 'apache-arrow';
import { isBandId, type BandId } from '../../core/bands.js';
import { InputError } from '../../core/errors.js';
import { writeFileAtomic } from '../../core/atomicWrite.js';
import { requireFile } from '../../core/files.js';
import type { GridIsochroneInfo, GridMeta, GridTable } from './gridTable.js';

export const GRID_METADATA_KEY = 'coeval.grid';
const FORMAT = 'coeval isochrone grid';
const VERSION = 1;

interface StoredMeta extends GridMeta {
  format: typeof FORMAT;
  version: number;
  bands: BandId[];
  hasMassCurrent: boolean;
  isochrones: GridIsochroneInfo[];
}

export function gridToArrowBytes(g: GridTable): Uint8Array {
  const iso = new Int32Array(g.nRows);
  const logAge = new Float64Array(g.nRows);
  const feh = new Float64Array(g.nRows);
  g.isochrones.forEach((c, k) => {
    iso.fill(k, c.start, c.start + c.count);
    logAge.fill(c.logAgeYr, c.start, c.start + c.count);
    feh.fill(c.feh, c.start, c.start + c.count);
  });
  const cols: Record<string, Float64Array | Int32Array> = { isochrone: iso, log_age: logAge, feh, mass_initial: g.massInitial };
  if (g.hasMassCurrent) cols.mass_current = g.massCurrent;
  if (g.phaseValue) cols.phase = g.phaseValue;
  cols.log_teff = g.logTeff;
  cols.log_g = g.logg;
  cols.log_l = g.logL;
  g.bands.forEach((b, k) => (cols[`mag_${b}`] = g.mag[k]));
  cols.source = g.rowSource;
  cols.line = g.rowLine;
  const stored: StoredMeta = { format: FORMAT, version: VERSION, ...g.meta, bands: g.bands, hasMassCurrent: g.hasMassCurrent, isochrones: g.isochrones };
  const t = makeTable(cols);
  const schema = new Schema(t.schema.fields, new Map([[GRID_METADATA_KEY, JSON.stringify(stored)]]));
  return tableToIPC(new Table(schema, t.batches.map((b) => new RecordBatch(schema, b.data))), 'file');
}

export function writeGridArrow(g: GridTable, path: string): void {
  writeFileAtomic(path, gridToArrowBytes(g));
}

export function readGridArrow(path: string): GridTable {
  requireFile(path, 'grid cache');
  let t: Table;
  try {
    t = tableFromIPC(readFileSync(path));
  } catch (e) {
    throw notGrid(path, `not an Arrow IPC file (${(e as Error).message})`);
  }
  const text = t.schema.metadata.get(GRID_METADATA_KEY);
  if (text === undefined) throw notGrid(path, `an Arrow file without the "${GRID_METADATA_KEY}" metadata`);
  let m: StoredMeta;
  try {
    m = JSON.parse(text) as StoredMeta;
  } catch {
    throw notGrid(path, 'its grid metadata is not valid JSON');
  }
  if (m.format !== FORMAT || m.version !== VERSION) throw notGrid(path, `grid format ${JSON.stringify(m.format)} version ${m.version}, not version ${VERSION}`);
  const n = t.numRows;
  const f64 = (name: string): Float64Array => {
    const v = t.getChild(name) as Vector | null;
    if (!v) throw notGrid(path, `the column "${name}" is missing`);
    const a = v.toArray() as unknown;
    return a instanceof Float64Array && a.length === n ? a : Float64Array.from(a as ArrayLike<number>);
  };
  const i32 = (name: string): Int32Array => {
    const v = t.getChild(name) as Vector | null;
    if (!v) throw notGrid(path, `the column "${name}" is missing`);
    const a = v.toArray() as unknown;
    return a instanceof Int32Array && a.length === n ? a : Int32Array.from(a as ArrayLike<number>);
  };
  const bands = m.bands.filter(isBandId);
  const { format: _f, version: _v, bands: _b, hasMassCurrent, isochrones, ...meta } = m;
  return {
    meta,
    bands,
    nRows: n,
    massInitial: f64('mass_initial'),
    massCurrent: hasMassCurrent ? f64('mass_current') : new Float64Array(n).fill(Number.NaN),
    hasMassCurrent,
    phaseValue: meta.phaseKind ? f64('phase') : undefined,
    logTeff: f64('log_teff'),
    logg: f64('log_g'),
    logL: f64('log_l'),
    mag: bands.map((b) => f64(`mag_${b}`)),
    rowSource: i32('source'),
    rowLine: i32('line'),
    isochrones,
  };
}

function notGrid(path: string, why: string): InputError {
  return new InputError(`this is not a coeval grid cache: ${why}`, {
    where: { file: path },
    expected: 'a grid.arrow written by `coeval grid import` or `coeval grid build`',
    hint: 'import the published tables with `coeval grid import`, or name them in the [grid] section with a column map',
  });
}

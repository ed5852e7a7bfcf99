/**
 * FITS binary tables (XTENSION = 'BINTABLE'), read by hand following the FITS Standard 4.0 (IAU FITS
 * Working Group 2016, section 7.3), because no maintained npm package reads FITS tables. Supports: the
 * table in any HDU (the first BINTABLE by default); TFORM L, B, I, J, K, E, D and A with repeat counts
 * (a mapped numeric column must have repeat 1); TSCAL/TZERO scaling, including the unsigned-integer
 * convention (TZERO = 2^15, 2^31, 2^63); TNULL for integer columns and NaN for floating point; big-endian
 * data; gzipped files. Rows are read in chunks and only mapped columns are decoded.
 */
import { InputError } from '../core/errors.js';
import type { ColumnRequest, ColumnTable, TableRequest } from './columnTable.js';
import { BLOCK, intKeyword, readFitsHeader, type FitsHeader } from './fitsHeader.js';
import { openRandomAccess, type RandomAccess } from './randomAccess.js';
import { requireColumns } from './requireColumns.js';

const VALID_BITPIX = [8, 16, 32, 64, -32, -64];
const CHUNK_BYTES = 1 << 23;

/** Bytes per element of each TFORM type code (section 7.3.1, Table 18). */
const WIDTH: Record<string, number> = { L: 1, X: 0, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8, C: 8, M: 16, P: 8, Q: 16 };

interface FitsColumn {
  name: string;
  code: string;
  repeat: number;
  offset: number;
  tform: string;
  scale: number;
  zero: number;
  /** TZERO as written, for exact int64 text. */
  zeroRaw?: string;
  tnull?: number;
  tnullRaw?: string;
  unit?: string;
}

interface HduInfo {
  index: number;
  kind: string;
  name?: string;
  rows?: number;
}

export async function readFits(path: string, req: TableRequest): Promise<ColumnTable> {
  const file = openRandomAccess(path);
  try {
    return readFitsFrom(file, path, req);
  } finally {
    file.close();
  }
}

function readFitsFrom(file: RandomAccess, path: string, req: TableRequest): ColumnTable {
  if (file.size === 0) throw new InputError('the file is empty', { where: { file: path }, hint: 'check that the download or copy finished' });
  const magic = file.read(0, 9).toString('latin1');
  if (magic !== 'SIMPLE  =') {
    throw new InputError('this is not a FITS file: it does not begin with SIMPLE = T', {
      where: { file: path, hdu: 0 },
      found: magic,
      expected: 'SIMPLE = T as the first header card (FITS Standard 4.0, section 4.4.1.1)',
      hint: 'check catalogue.format and the file',
    });
  }
  const seen: HduInfo[] = [];
  let offset = 0;
  for (let hdu = 0; ; hdu++) {
    if (hdu > 0 && offset >= file.size) break;
    const h = readFitsHeader(file, offset, hdu, path);
    const { dataBytes, info } = checkStructure(h, hdu, path);
    seen.push(info);
    const wanted = req.hdu === undefined ? info.kind === 'BINTABLE' : req.hdu === hdu;
    if (wanted) {
      if (info.kind !== 'BINTABLE') {
        throw new InputError(`HDU ${hdu} is ${describe(info)}, not a binary table`, {
          where: { file: path, hdu, key: 'catalogue.hdu' },
          expected: "an HDU with XTENSION = 'BINTABLE'",
          hint: tableHint(file, offset + (h.dataStart - h.start) + padded(dataBytes), hdu, seen, path),
        });
      }
      return readBinTable(file, h, hdu, path, req);
    }
    if (h.dataStart + dataBytes > file.size) {
      throw new InputError(`the FITS file is truncated: the data of HDU ${hdu} (${describe(info)}) run past the end of the file, before the table was reached`, {
        where: { file: path, hdu },
        found: `${file.size} bytes; HDU ${hdu}'s data end at byte ${h.dataStart + dataBytes}`,
        hint: 'the file was cut short: download or copy it again',
      });
    }
    offset = h.dataStart + padded(dataBytes);
  }
  if (req.hdu !== undefined) {
    throw new InputError(`the file has no HDU ${req.hdu}`, {
      where: { file: path, key: 'catalogue.hdu' },
      found: `HDUs: ${seen.map((s) => `${s.index} ${describe(s)}`).join('; ')}`,
      hint: `set catalogue.hdu to the index of the table (0 = primary)`,
    });
  }
  throw new InputError('the FITS file holds no binary table', {
    where: { file: path },
    found: `HDUs: ${seen.map((s) => `${s.index} ${describe(s)}`).join('; ')}`,
    expected: "an HDU with XTENSION = 'BINTABLE'",
    hint: 'coeval reads FITS binary tables; convert ASCII tables or images of catalogues first',
  });
}

function padded(n: number): number {
  return Math.ceil(n / BLOCK) * BLOCK;
}

function describe(h: HduInfo): string {
  const name = h.name ? ` "${h.name}"` : '';
  if (h.kind === 'PRIMARY') return `the primary HDU${name}`;
  if (h.kind === 'BINTABLE') return `a BINTABLE${name} of ${h.rows} rows`;
  return `a ${h.kind} extension${name}`;
}

/** Lists the binary tables after `offset` too, so the hint can name the right HDU. */
function tableHint(file: RandomAccess, offset: number, hdu: number, seen: HduInfo[], path: string): string {
  const all = [...seen];
  try {
    let o = offset;
    for (let k = hdu + 1; k < hdu + 50 && o < file.size; k++) {
      const h = readFitsHeader(file, o, k, path);
      const { dataBytes, info } = checkStructure(h, k, path);
      all.push(info);
      o = h.dataStart + padded(dataBytes);
    }
  } catch {
    // A damaged later HDU only shortens the list.
  }
  const tables = all.filter((s) => s.kind === 'BINTABLE');
  if (tables.length === 0) return 'the file has no binary table';
  return `set catalogue.hdu = ${tables[0].index} (${tables.map((t) => `HDU ${t.index}: ${describe(t)}`).join('; ')})`;
}

/** Mandatory keywords of a primary HDU or an extension (sections 4.4.1, 7.3.1) and the size of its data. */
function checkStructure(h: FitsHeader, hdu: number, path: string): { dataBytes: number; info: HduInfo } {
  const first = h.cards[0];
  if (hdu === 0) {
    if (!first || first.keyword !== 'SIMPLE' || first.value !== true) {
      throw new InputError('this is not a FITS file: it does not begin with SIMPLE = T', {
        where: { file: path, hdu: 0 },
        found: first ? `${first.keyword} = ${first.raw ?? ''}` : 'no header cards',
        expected: 'SIMPLE = T as the first header card (FITS Standard 4.0, section 4.4.1.1)',
        hint: 'check catalogue.format and the file',
      });
    }
  } else if (!first || first.keyword !== 'XTENSION') {
    throw new InputError(`HDU ${hdu} does not begin with XTENSION`, {
      where: { file: path, hdu },
      found: first ? first.keyword : 'no header cards',
      expected: 'XTENSION as the first card of an extension (FITS Standard 4.0, section 7)',
      hint: 'the file may have junk after its last HDU, or be damaged',
    });
  }
  const bitpix = intKeyword(h, 'BITPIX', hdu, path, (v) => VALID_BITPIX.includes(v), 'BITPIX one of 8, 16, 32, 64, -32, -64 (FITS Standard 4.0, Table 8)');
  const naxis = intKeyword(h, 'NAXIS', hdu, path, (v) => v >= 0 && v <= 999, 'NAXIS an integer from 0 to 999');
  let product = naxis === 0 ? 0 : 1;
  for (let k = 1; k <= naxis; k++) product *= intKeyword(h, `NAXIS${k}`, hdu, path, (v) => v >= 0, `NAXIS${k} a non-negative integer`);
  const kind = hdu === 0 ? 'PRIMARY' : String(h.get('XTENSION')?.value ?? '').trim();
  const pcount = hdu === 0 ? 0 : intKeyword(h, 'PCOUNT', hdu, path, (v) => v >= 0, 'PCOUNT a non-negative integer');
  const gcount = hdu === 0 ? 1 : intKeyword(h, 'GCOUNT', hdu, path, (v) => v >= 1, 'GCOUNT a positive integer');
  if (kind === 'BINTABLE') {
    if (bitpix !== 8) badTableKeyword(h, 'BITPIX', hdu, path, '8 for a binary table');
    if (naxis !== 2) badTableKeyword(h, 'NAXIS', hdu, path, '2 for a binary table');
  }
  const dataBytes = (Math.abs(bitpix) / 8) * gcount * (pcount + product);
  const name = h.get('EXTNAME')?.value;
  const rows = kind === 'BINTABLE' ? Number(h.get('NAXIS2')?.value) : undefined;
  return { dataBytes, info: { index: hdu, kind, name: typeof name === 'string' ? name : undefined, rows } };
}

function badTableKeyword(h: FitsHeader, keyword: string, hdu: number, path: string, expected: string): never {
  const card = h.get(keyword);
  throw new InputError(`HDU ${hdu}, header card ${card?.index}: ${keyword} = ${card?.raw} is not valid for a binary table`, {
    where: { file: path, hdu },
    found: card?.raw,
    expected: `${keyword} = ${expected} (FITS Standard 4.0, section 7.3.1)`,
    hint: 'the header is damaged or was written by a non-conforming tool; rewrite the file with a FITS library',
  });
}

function parseColumns(h: FitsHeader, hdu: number, path: string): FitsColumn[] {
  const rowBytes = intKeyword(h, 'NAXIS1', hdu, path);
  const tfields = intKeyword(h, 'TFIELDS', hdu, path, (v) => v >= 0 && v <= 999, 'TFIELDS an integer from 0 to 999');
  const cols: FitsColumn[] = [];
  let offset = 0;
  for (let i = 1; i <= tfields; i++) {
    const card = h.get(`TFORM${i}`);
    const tform = typeof card?.value === 'string' ? card.value.trim() : '';
    const m = /^(\d*)([LXBIJKAEDCMPQ])/.exec(tform);
    if (!m) {
      throw new InputError(`HDU ${hdu}: TFORM${i} = ${card?.raw ?? '(missing)'} is not a valid binary-table format`, {
        where: { file: path, hdu },
        expected: 'rT with T one of L X B I J K A E D C M P Q (FITS Standard 4.0, Table 18)',
        hint: 'the header is damaged; rewrite the file with a FITS library',
      });
    }
    const repeat = m[1] === '' ? 1 : Number(m[1]);
    const code = m[2];
    const width = code === 'X' ? Math.ceil(repeat / 8) : code === 'P' || code === 'Q' ? WIDTH[code] : repeat * WIDTH[code];
    const str = (k: string): string | undefined => {
      const v = h.get(`${k}${i}`)?.value;
      return typeof v === 'string' ? v.trim() : undefined;
    };
    const num = (k: string): { v?: number; raw?: string } => {
      const c = h.get(`${k}${i}`);
      return typeof c?.value === 'number' ? { v: c.value, raw: c.raw } : {};
    };
    const zero = num('TZERO');
    const tnull = num('TNULL');
    cols.push({
      name: str('TTYPE') || `col${i}`,
      code,
      repeat,
      offset,
      tform,
      scale: num('TSCAL').v ?? 1,
      zero: zero.v ?? 0,
      zeroRaw: zero.raw,
      tnull: tnull.v,
      tnullRaw: tnull.raw,
      unit: str('TUNIT'),
    });
    offset += width;
  }
  if (offset !== rowBytes) {
    throw new InputError(`HDU ${hdu}: the column formats add up to ${offset} bytes per row, but NAXIS1 = ${rowBytes}`, {
      where: { file: path, hdu },
      expected: 'NAXIS1 equal to the sum of the TFORM widths (FITS Standard 4.0, section 7.3.1)',
      hint: 'the header is damaged; rewrite the file with a FITS library',
    });
  }
  return cols;
}

function readBinTable(file: RandomAccess, h: FitsHeader, hdu: number, path: string, req: TableRequest): ColumnTable {
  const cols = parseColumns(h, hdu, path);
  const rowBytes = intKeyword(h, 'NAXIS1', hdu, path);
  const nRows = intKeyword(h, 'NAXIS2', hdu, path);
  const names = cols.map((c) => c.name);
  const index = requireColumns(names, req.columns, { file: path, hdu }, (i) => `column ${i + 1} (TTYPE${i + 1})`);
  for (const r of req.columns) checkReadable(cols[index.get(r.name) as number], r, hdu, path);

  const tableBytes = rowBytes * nRows;
  if (h.dataStart + tableBytes > file.size) {
    const complete = Math.max(0, Math.floor((file.size - h.dataStart) / Math.max(1, rowBytes)));
    throw new InputError(`the FITS file is truncated: HDU ${hdu}'s table of ${nRows} rows needs ${tableBytes} bytes of data, but the file ends after ${complete} complete rows`, {
      where: { file: path, hdu, row: complete + 1 },
      found: `${file.size} bytes in the file; the table data would end at byte ${h.dataStart + tableBytes}`,
      hint: 'the file was cut short: download or copy it again',
    });
  }
  if (nRows === 0) {
    throw new InputError(`HDU ${hdu}'s table has its columns but no rows`, {
      where: { file: path, hdu },
      hint: 'check that the query or export returned stars',
    });
  }

  const numbers = new Map<string, Float64Array>();
  const texts = new Map<string, string[]>();
  const numberJobs: { col: FitsColumn; out: Float64Array }[] = [];
  const textJobs: { col: FitsColumn; out: string[] }[] = [];
  for (const r of req.columns) {
    const col = cols[index.get(r.name) as number];
    if (r.kind === 'number' && !numbers.has(r.name)) {
      const out = new Float64Array(nRows);
      numbers.set(r.name, out);
      numberJobs.push({ col, out });
    }
    if (r.kind === 'text' && !texts.has(r.name)) {
      const out = new Array<string>(nRows);
      texts.set(r.name, out);
      textJobs.push({ col, out });
    }
  }

  const rowsPerChunk = Math.max(1, Math.floor(CHUNK_BYTES / Math.max(1, rowBytes)));
  for (let row0 = 0; row0 < nRows; row0 += rowsPerChunk) {
    const nChunk = Math.min(rowsPerChunk, nRows - row0);
    const buf = file.read(h.dataStart + row0 * rowBytes, nChunk * rowBytes);
    for (const job of numberJobs) decodeNumbers(buf, nChunk, rowBytes, job.col, job.out, row0);
    for (const job of textJobs) decodeTexts(buf, nChunk, rowBytes, job.col, job.out, row0);
  }

  const units = new Map<string, string>();
  for (const c of cols) if (c.unit) units.set(c.name, c.unit);
  const extname = h.get('EXTNAME')?.value;
  return {
    path,
    format: 'fits',
    hdu,
    detail: `binary table in HDU ${hdu}${typeof extname === 'string' && extname ? ` ("${extname}")` : ''}`,
    nRows,
    names,
    units,
    numbers,
    texts,
    locate: (row, column) => ({ file: path, hdu, row: row + 1, field: column }),
  };
}

function checkReadable(col: FitsColumn, r: ColumnRequest, hdu: number, path: string): void {
  const where = { file: path, hdu, field: col.name, key: r.key };
  if (['X', 'C', 'M', 'P', 'Q'].includes(col.code)) {
    throw new InputError(`the column "${col.name}" (${r.role}) has TFORM = '${col.tform}', which coeval cannot read as a catalogue value`, {
      where,
      expected: 'TFORM L, B, I, J, K, E, D or A',
      hint: 'map a column of plain numbers or text instead',
    });
  }
  if (r.kind === 'number' && col.code === 'A') {
    throw new InputError(`the column "${col.name}" (${r.role}) holds text (TFORM = '${col.tform}'), not numbers`, {
      where,
      expected: 'a numeric column (TFORM L, B, I, J, K, E or D)',
      hint: 'map a numeric column',
    });
  }
  if (col.code !== 'A' && col.repeat !== 1) {
    throw new InputError(`the column "${col.name}" (${r.role}) holds ${col.repeat} values per row (TFORM = '${col.tform}'); coeval needs one`, {
      where,
      expected: 'a column with repeat count 1',
      hint: 'map a scalar column, or split the vector column into scalar columns first',
    });
  }
}

const TWO_63 = 9223372036854775808;

function decodeNumbers(buf: Buffer, n: number, rowBytes: number, col: FitsColumn, out: Float64Array, row0: number): void {
  const { scale, zero, tnull } = col;
  const scaled = scale !== 1 || zero !== 0;
  let o = col.offset;
  switch (col.code) {
    case 'D':
      for (let i = 0; i < n; i++, o += rowBytes) out[row0 + i] = scaled ? zero + scale * buf.readDoubleBE(o) : buf.readDoubleBE(o);
      return;
    case 'E':
      for (let i = 0; i < n; i++, o += rowBytes) out[row0 + i] = scaled ? zero + scale * buf.readFloatBE(o) : buf.readFloatBE(o);
      return;
    case 'L':
      // T true, F false, 0 undefined (section 7.3.3.1).
      for (let i = 0; i < n; i++, o += rowBytes) out[row0 + i] = buf[o] === 0x54 ? 1 : buf[o] === 0x46 ? 0 : Number.NaN;
      return;
    case 'K': {
      const nullBig = col.tnullRaw !== undefined ? BigInt(col.tnullRaw) : undefined;
      for (let i = 0; i < n; i++, o += rowBytes) {
        const s = buf.readBigInt64BE(o);
        if (nullBig !== undefined && s === nullBig) out[row0 + i] = Number.NaN;
        // Unsigned convention: TZERO = 2^63 (section 7.3.2). Add in BigInt so the sum is rounded once.
        else if (scale === 1 && zero === TWO_63) out[row0 + i] = Number(s + 9223372036854775808n);
        else out[row0 + i] = scaled ? zero + scale * Number(s) : Number(s);
      }
      return;
    }
    default: {
      const read = col.code === 'B' ? (p: number) => buf[p] : col.code === 'I' ? (p: number) => buf.readInt16BE(p) : (p: number) => buf.readInt32BE(p);
      for (let i = 0; i < n; i++, o += rowBytes) {
        const s = read(o);
        out[row0 + i] = tnull !== undefined && s === tnull ? Number.NaN : scaled ? zero + scale * s : s;
      }
    }
  }
}

function decodeTexts(buf: Buffer, n: number, rowBytes: number, col: FitsColumn, out: string[], row0: number): void {
  let o = col.offset;
  if (col.code === 'A') {
    for (let i = 0; i < n; i++, o += rowBytes) {
      let end = o + col.repeat;
      const nul = buf.indexOf(0, o);
      if (nul >= 0 && nul < end) end = nul;
      out[row0 + i] = buf.toString('latin1', o, end).replace(/\s+$/, '');
    }
    return;
  }
  if (col.code === 'K') {
    // Identifiers such as 64-bit source ids: exact, in BigInt, never through a double.
    const nullBig = col.tnullRaw !== undefined ? BigInt(col.tnullRaw) : undefined;
    const exactZero = col.scale === 1 && col.zeroRaw !== undefined && /^[+-]?\d+$/.test(col.zeroRaw) ? BigInt(col.zeroRaw) : col.zero === 0 ? 0n : undefined;
    for (let i = 0; i < n; i++, o += rowBytes) {
      const s = buf.readBigInt64BE(o);
      if (nullBig !== undefined && s === nullBig) out[row0 + i] = '';
      else out[row0 + i] = exactZero !== undefined ? String(s + exactZero) : String(col.zero + col.scale * Number(s));
    }
    return;
  }
  const tmp = new Float64Array(n);
  decodeNumbers(buf, n, rowBytes, col, tmp, 0);
  for (let i = 0; i < n; i++) {
    const v = tmp[i];
    out[row0 + i] = Number.isNaN(v) ? '' : col.code === 'L' ? (v === 1 ? 'T' : 'F') : String(v);
  }
}

/**
 * A table as a FITS file: an empty primary HDU and one binary-table extension (XTENSION = 'BINTABLE'),
 * following the FITS Standard 4.0 (IAU FITS Working Group 2016): sections 3.2-3.3 (2880-byte blocks, header
 * padded with blanks, data with zeros), 4.1-4.2 (80-character cards in fixed format: keyword in columns
 * 1-8, "= " in 9-10, logical and integer values ending in column 30, strings quoted from column 11 and
 * padded to at least 8 characters), 4.4.1 (SIMPLE, BITPIX, NAXIS, EXTEND), and 7.3 (BINTABLE: XTENSION,
 * BITPIX = 8, NAXIS = 2, NAXIS1 = bytes per row, NAXIS2 = rows, PCOUNT = 0, GCOUNT = 1, TFIELDS, then
 * TTYPEn / TFORMn / TUNITn; big-endian IEEE doubles 'D' with NaN as the null value, 32-bit integers 'J',
 * fixed-width ASCII text 'rA' padded with blanks).
 *
 * Written by hand because no maintained npm package writes FITS tables (the catalogue reader, readFits.ts,
 * is hand-written for the same reason); it writes only what coeval needs.
 */
import { OutputError } from '../core/errors.js';
import { AtomicFileStream } from './streamFile.js';
import type { OutputColumn, OutputTable } from './outputTable.js';

const BLOCK = 2880;
const CARD = 80;
const ROWS_PER_CHUNK = 8192;

/** Printable ASCII only (section 4.1.2.3: header text is restricted to 0x20-0x7E). */
function ascii(s: string): string {
  return s.normalize('NFKD').replace(/[^\x20-\x7e]/g, '?');
}

function card(keyword: string, value: string | number | boolean, comment?: string): string {
  let v: string;
  if (typeof value === 'boolean') v = (value ? 'T' : 'F').padStart(20);
  else if (typeof value === 'number') {
    if (!Number.isInteger(value)) throw new RangeError(`FITS card ${keyword}: only integer values are written`);
    v = String(value).padStart(20);
  } else {
    const quoted = `'${ascii(value).replace(/'/g, "''").padEnd(8)}'`;
    if (quoted.length > 70) throw new RangeError(`FITS card ${keyword}: the string value is too long for one card`);
    v = quoted.padEnd(20);
  }
  let text = `${keyword.padEnd(8)}= ${v}`;
  if (comment) text += ` / ${ascii(comment)}`;
  return text.slice(0, CARD).padEnd(CARD);
}

/** COMMENT cards holding `text`, wrapped at 72 characters. */
function commentCards(text: string): string[] {
  const out: string[] = [];
  const words = ascii(text).split(/\s+/).filter(Boolean);
  let line = '';
  for (const w of words) {
    if (line && line.length + 1 + w.length > 72) {
      out.push(`COMMENT ${line}`.padEnd(CARD));
      line = '';
    }
    line = line ? `${line} ${w}` : w.slice(0, 72);
  }
  if (line) out.push(`COMMENT ${line}`.padEnd(CARD));
  return out;
}

/** The cards, END, and blank padding to a whole number of blocks. */
function headerBytes(cards: string[]): Buffer {
  const all = [...cards, 'END'.padEnd(CARD)];
  const size = Math.ceil((all.length * CARD) / BLOCK) * BLOCK;
  return Buffer.from(all.join('').padEnd(size), 'latin1');
}

interface Layout {
  column: OutputColumn;
  tform: string;
  width: number;
  offset: number;
}

function layout(columns: OutputColumn[]): { fields: Layout[]; rowBytes: number } {
  let offset = 0;
  const fields = columns.map((c) => {
    let tform: string;
    let width: number;
    if (c.values instanceof Float64Array) {
      tform = 'D';
      width = 8;
    } else if (c.values instanceof Int32Array) {
      tform = 'J';
      width = 4;
    } else {
      let w = 1;
      for (const s of c.values as readonly string[]) {
        if (/[^\x20-\x7e]/.test(s)) throw new OutputError(`column ${c.name}: FITS text columns hold printable ASCII only, found "${s}"`);
        w = Math.max(w, s.length);
      }
      tform = `${w}A`;
      width = w;
    }
    const f = { column: c, tform, width, offset };
    offset += width;
    return f;
  });
  return { fields, rowBytes: offset };
}

export function writeFitsTable(path: string, t: OutputTable, extname = 'CATALOGUE'): void {
  const { fields, rowBytes } = layout(t.columns);
  const primary = [
    card('SIMPLE', true, 'conforms to the FITS Standard 4.0'),
    card('BITPIX', 8, 'no primary data'),
    card('NAXIS', 0),
    card('EXTEND', true, 'a binary table follows'),
  ];
  const table = [
    card('XTENSION', 'BINTABLE', 'binary table extension'),
    card('BITPIX', 8),
    card('NAXIS', 2),
    card('NAXIS1', rowBytes, 'bytes per row'),
    card('NAXIS2', t.nRows, 'rows'),
    card('PCOUNT', 0),
    card('GCOUNT', 1),
    card('TFIELDS', fields.length, 'columns'),
  ];
  fields.forEach((f, i) => {
    const n = i + 1;
    table.push(card(`TTYPE${n}`, f.column.name, f.column.description?.slice(0, 45)));
    table.push(card(`TFORM${n}`, f.tform));
    if (f.column.unit) table.push(card(`TUNIT${n}`, f.column.unit));
  });
  table.push(card('EXTNAME', extname));
  for (const [k, v] of t.notes) table.push(...commentCards(`${k}: ${v}`));

  const out = new AtomicFileStream(path);
  try {
    out.write(headerBytes(primary));
    out.write(headerBytes(table));
    const chunk = Buffer.alloc(Math.max(1, ROWS_PER_CHUNK * rowBytes));
    for (let start = 0; start < t.nRows; start += ROWS_PER_CHUNK) {
      const end = Math.min(t.nRows, start + ROWS_PER_CHUNK);
      chunk.fill(0);
      for (let i = start; i < end; i++) {
        const row = (i - start) * rowBytes;
        for (const f of fields) {
          const at = row + f.offset;
          const v = f.column.values;
          if (v instanceof Float64Array) chunk.writeDoubleBE(v[i], at);
          else if (v instanceof Int32Array) chunk.writeInt32BE(v[i], at);
          else chunk.write((v as readonly string[])[i].padEnd(f.width), at, f.width, 'latin1');
        }
      }
      out.write(chunk.subarray(0, (end - start) * rowBytes));
    }
    const dataBytes = t.nRows * rowBytes;
    const pad = (BLOCK - (dataBytes % BLOCK)) % BLOCK;
    if (pad > 0) out.write(Buffer.alloc(pad));
    out.commit();
  } catch (err) {
    out.abort();
    throw err;
  }
}

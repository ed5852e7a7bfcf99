/**
 * Parquet with hyparquet (plus hyparquet-compressors for the GZIP, ZSTD, BROTLI and LZ4 codecs that other
 * writers use by default). Row groups are read one at a time, and only the requested columns.
 * Columns must be flat (no lists or structs); numbers may be BOOLEAN, INT32, INT64, FLOAT, DOUBLE,
 * FLOAT16 or DECIMAL; text may be a UTF-8 string or an integer.
 */
import type { AsyncBuffer, FileMetaData, SchemaElement } from 'hyparquet';
import { InputError } from '../core/errors.js';
import type { ColumnRequest, ColumnTable, TableRequest } from './columnTable.js';
import { isGzip, readAllBytes } from './openBytes.js';
import { requireColumns } from './requireColumns.js';

export async function readParquet(path: string, req: TableRequest): Promise<ColumnTable> {
  const { parquetMetadataAsync, parquetSchema, parquetRead, asyncBufferFromFile } = await import('hyparquet');
  const { compressors } = await import('hyparquet-compressors');
  const file: AsyncBuffer = isGzip(path) ? memoryBuffer(readAllBytes(path)) : await asyncBufferFromFile(path);
  let metadata: FileMetaData;
  try {
    metadata = await parquetMetadataAsync(file);
  } catch (e) {
    throw new InputError('the Parquet file could not be read', {
      where: { file: path },
      found: (e as Error).message,
      hint: 'the file may be truncated (its footer is at the end) or not Parquet: check catalogue.format',
    });
  }
  const tree = parquetSchema(metadata);
  const top = tree.children;
  const names = top.map((c) => c.element.name);
  const index = requireColumns(names, req.columns, { file: path }, (i) => `column ${i + 1}`);
  const nRows = Number(metadata.num_rows);
  const numbers = new Map<string, Float64Array>();
  const texts = new Map<string, string[]>();
  for (const r of req.columns) {
    const node = top[index.get(r.name) as number];
    checkReadable(node.element, node.children.length, r, path);
    if (r.kind === 'number' && !numbers.has(r.name)) numbers.set(r.name, new Float64Array(nRows).fill(Number.NaN));
    if (r.kind === 'text' && !texts.has(r.name)) texts.set(r.name, new Array<string>(nRows).fill(''));
  }
  if (nRows === 0) {
    throw new InputError('the Parquet table has its columns but no rows', { where: { file: path }, hint: 'check that the export wrote the stars' });
  }
  const wanted = [...new Set(req.columns.map((r) => r.name))];

  let groupStart = 0;
  for (let g = 0; g < metadata.row_groups.length; g++) {
    const groupRows = Number(metadata.row_groups[g].num_rows);
    const rowStart = groupStart;
    const rowEnd = groupStart + groupRows;
    try {
      await parquetRead({
        file,
        metadata,
        columns: wanted,
        rowStart,
        rowEnd,
        compressors,
        onChunk: (chunk) => {
          const num = numbers.get(chunk.columnName);
          const txt = texts.get(chunk.columnName);
          const data = chunk.columnData as ArrayLike<unknown>;
          for (let k = 0; k < data.length; k++) {
            const row = chunk.rowStart + k;
            if (row < rowStart || row >= rowEnd) continue;
            const v = data[k];
            if (num) num[row] = toNumber(v);
            if (txt) txt[row] = toText(v);
          }
        },
      });
    } catch (e) {
      const msg = (e as Error).message;
      throw new InputError(`the Parquet data could not be read (row group ${g}, rows ${rowStart + 1}-${rowEnd})`, {
        where: { file: path, row: rowStart + 1 },
        found: msg,
        hint: /compression|codec/i.test(msg) ? 'rewrite the file with SNAPPY, GZIP, ZSTD, BROTLI or LZ4 compression' : 'the file may be truncated or damaged',
      });
    }
    groupStart = rowEnd;
  }

  return {
    path,
    format: 'parquet',
    detail: `${metadata.row_groups.length} row group${metadata.row_groups.length === 1 ? '' : 's'}`,
    nRows,
    names,
    units: new Map(),
    numbers,
    texts,
    locate: (row, column) => ({ file: path, row: row + 1, field: column }),
  };
}

function memoryBuffer(buf: Buffer): AsyncBuffer {
  const ab = buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer;
  return { byteLength: ab.byteLength, slice: (s, e) => ab.slice(s, e) };
}

/** The type in words, for messages: the logical type when there is one, else the physical type. */
function typeName(el: SchemaElement): string {
  return el.logical_type?.type ?? el.converted_type ?? el.type ?? 'group';
}

function checkReadable(el: SchemaElement, nChildren: number, r: ColumnRequest, path: string): void {
  const logical = el.logical_type?.type;
  const converted = el.converted_type;
  const physical = el.type;
  let ok: boolean;
  if (nChildren > 0 || el.repetition_type === 'REPEATED' || physical === undefined) ok = false;
  else if (r.kind === 'number') {
    const numericPhysical = physical === 'BOOLEAN' || physical === 'INT32' || physical === 'INT64' || physical === 'FLOAT' || physical === 'DOUBLE';
    const dateLike = ['DATE', 'TIME', 'TIMESTAMP', 'INTERVAL'].includes(logical ?? '') || /^(DATE|TIME|TIMESTAMP|INTERVAL)/.test(converted ?? '');
    ok = (numericPhysical && !dateLike) || logical === 'FLOAT16' || logical === 'DECIMAL' || converted === 'DECIMAL';
  } else {
    const textLike = physical === 'BYTE_ARRAY' && (logical === 'STRING' || logical === 'ENUM' || converted === 'UTF8' || converted === 'ENUM');
    ok = textLike || physical === 'INT32' || physical === 'INT64';
  }
  if (!ok) {
    throw new InputError(`the column "${el.name}" (${r.role}) has Parquet type ${typeName(el)}${nChildren > 0 ? ' (a nested column)' : ''}, which coeval does not support as ${r.kind === 'number' ? 'a number' : 'text'}`, {
      where: { file: path, field: el.name, key: r.key },
      found: `physical ${physical ?? 'group'}${logical ? `, logical ${logical}` : ''}${converted ? `, converted ${converted}` : ''}`,
      expected: r.kind === 'number' ? 'a flat BOOLEAN, INT32, INT64, FLOAT, DOUBLE, FLOAT16 or DECIMAL column' : 'a flat UTF-8 string or integer column',
      hint: 'map another column, or convert this one when writing the file',
    });
  }
}

function toNumber(v: unknown): number {
  if (v === null || v === undefined) return Number.NaN;
  if (typeof v === 'number') return v;
  if (typeof v === 'bigint') return Number(v);
  if (typeof v === 'boolean') return v ? 1 : 0;
  return Number.NaN;
}

function toText(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'boolean') return v ? 'T' : 'F';
  return String(v);
}

/**
 * Arrow IPC, file ("ARROW1" magic, random access) and stream formats, with apache-arrow. Record batches are
 * visited one at a time and only the requested columns are copied out.
 */
import { open } from 'node:fs/promises';
import { RecordBatchReader, Type, type AsyncRecordBatchFileReader, type AsyncRecordBatchStreamReader, type DataType, type Field, type Vector } from 'apache-arrow';
import { InputError } from '../core/errors.js';
import type { ColumnRequest, ColumnTable, TableRequest } from './columnTable.js';
import { GrowableFloat64 } from './growable.js';
import { isGzip, readAllBytes } from './openBytes.js';

type AsyncRecordBatchReaders = AsyncRecordBatchFileReader | AsyncRecordBatchStreamReader;
import { requireColumns } from './requireColumns.js';

const NUMERIC = new Set<Type>([Type.Int, Type.Float, Type.Bool, Type.Null]);
const TEXT = new Set<Type>([Type.Utf8, Type.LargeUtf8, Type.Int, Type.Float, Type.Bool, Type.Null]);

export async function readArrow(path: string, req: TableRequest): Promise<ColumnTable> {
  // A plain file is read through a file handle, batch by batch; a gzipped one is decompressed in memory.
  const handle = isGzip(path) ? undefined : await open(path, 'r');
  try {
    let reader: RecordBatchReader | AsyncRecordBatchReaders;
    try {
      reader = handle ? await RecordBatchReader.from(handle) : RecordBatchReader.from(readAllBytes(path));
    } catch (e) {
      throw notArrow(path, e);
    }
    return await readBatches(path, req, reader);
  } finally {
    await handle?.close();
  }
}

async function readBatches(path: string, req: TableRequest, source: RecordBatchReader | AsyncRecordBatchReaders): Promise<ColumnTable> {
  const reader = source;
  try {
    await reader.open({ autoDestroy: false });
  } catch (e) {
    throw notArrow(path, e);
  }
  const fields: Field[] = reader.schema.fields;
  const names = fields.map((f) => f.name);
  const index = requireColumns(names, req.columns, { file: path }, (i) => `field ${i + 1}`);
  const jobs = new Map<string, { field: number; numbers?: GrowableFloat64; texts?: string[] }>();
  for (const r of req.columns) {
    const fi = index.get(r.name) as number;
    checkReadable(fields[fi], r, path);
    const job = jobs.get(r.name) ?? { field: fi };
    if (r.kind === 'number') job.numbers ??= new GrowableFloat64();
    else job.texts ??= [];
    jobs.set(r.name, job);
  }

  let nRows = 0;
  let batchNo = 0;
  try {
    for await (const batch of reader) {
      batchNo++;
      for (const job of jobs.values()) {
        const vec = batch.getChildAt(job.field) as Vector;
        if (job.numbers) copyNumbers(vec, job.numbers);
        if (job.texts) copyTexts(vec, job.texts);
      }
      nRows += batch.numRows;
    }
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(`the Arrow data could not be read after ${nRows} rows (record batch ${batchNo})`, {
      where: { file: path, row: nRows + 1 },
      found: (e as Error).message,
      hint: 'the file may be truncated or damaged',
    });
  }
  if (nRows === 0) {
    throw new InputError('the Arrow table has its columns but no rows', { where: { file: path }, hint: 'check that the export wrote the stars' });
  }
  const numbers = new Map<string, Float64Array>();
  const texts = new Map<string, string[]>();
  for (const [name, job] of jobs) {
    if (job.numbers) numbers.set(name, job.numbers.view());
    if (job.texts) texts.set(name, job.texts);
  }
  const units = new Map<string, string>();
  for (const f of fields) {
    const u = f.metadata.get('unit');
    if (u) units.set(f.name, u);
  }
  return {
    path,
    format: 'arrow',
    detail: `IPC ${reader.isFile() ? 'file' : 'stream'} format`,
    nRows,
    names,
    units,
    numbers,
    texts,
    locate: (row, column) => ({ file: path, row: row + 1, field: column }),
  };
}

function notArrow(path: string, e: unknown): InputError {
  return new InputError('the Arrow IPC file could not be read', {
    where: { file: path },
    found: (e as Error).message,
    expected: 'an Arrow IPC file or stream',
    hint: 'the file may be truncated or not Arrow at all: check catalogue.format',
  });
}

function baseType(t: DataType): DataType {
  return t.typeId === Type.Dictionary ? (t as unknown as { dictionary: DataType }).dictionary : t;
}

function checkReadable(field: Field, r: ColumnRequest, path: string): void {
  const t = baseType(field.type);
  const ok = r.kind === 'number' ? NUMERIC.has(t.typeId) : TEXT.has(t.typeId);
  if (!ok) {
    throw new InputError(`the column "${field.name}" (${r.role}) has Arrow type ${String(field.type)}, which coeval cannot read as ${r.kind === 'number' ? 'a number' : 'text'}`, {
      where: { file: path, field: field.name, key: r.key },
      expected: r.kind === 'number' ? 'an integer, floating-point or boolean column' : 'a string or integer column',
      hint: 'map another column, or convert this one when writing the file',
    });
  }
}

function copyNumbers(vec: Vector, out: GrowableFloat64): void {
  const n = vec.length;
  for (let i = 0; i < n; i++) {
    const v: unknown = vec.get(i);
    if (v === null || v === undefined) out.push(Number.NaN);
    else if (typeof v === 'bigint') out.push(Number(v));
    else if (typeof v === 'boolean') out.push(v ? 1 : 0);
    else out.push(v as number);
  }
}

function copyTexts(vec: Vector, out: string[]): void {
  const n = vec.length;
  for (let i = 0; i < n; i++) {
    const v: unknown = vec.get(i);
    out.push(v === null || v === undefined ? '' : typeof v === 'boolean' ? (v ? 'T' : 'F') : String(v));
  }
}

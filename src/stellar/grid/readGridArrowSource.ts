/**
 * An isochrone table delivered as Arrow IPC (file or stream): the requested columns, with 1-based row
 * numbers for messages. An Arrow table has no comment blocks, so isochrones are told apart by their age and
 * metallicity columns (or one file per isochrone).
 */
import { readFileSync } from 'node:fs';
import { tableFromIPC, type Table } from 'apache-arrow';
import { InputError } from '../../core/errors.js';
import { requireFile } from '../../core/files.js';
import { didYouMean } from '../../core/suggest.js';
import type { RawGridTable, RawTableRequest } from './rawTable.js';

export function readGridArrowSource(path: string, req: RawTableRequest): RawGridTable {
  requireFile(path, 'isochrone table');
  let table: Table;
  try {
    table = tableFromIPC(readFileSync(path));
  } catch (e) {
    throw new InputError('the file is not a readable Arrow IPC file', {
      where: { file: path },
      found: (e as Error).message,
      expected: 'Arrow IPC (file or stream format)',
      hint: 'set grid.format to "text" or "csv" if this is a text table',
    });
  }
  const names = table.schema.fields.map((f) => f.name);
  const n = table.numRows;
  const column = (c: string) => {
    const v = table.getChild(c);
    if (!v) {
      throw new InputError(`the column "${c}" named by ${req.keyOf(c)} is not in the table`, {
        where: { file: path },
        found: `columns ${names.map((x) => JSON.stringify(x)).join(', ')}`,
        hint: didYouMean(c, names) ?? 'check the column map against the table',
      });
    }
    return v;
  };
  const numbers = new Map<string, Float64Array>();
  for (const c of new Set(req.numbers)) {
    const v = column(c);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const x = v.get(i) as unknown;
      const num = typeof x === 'bigint' ? Number(x) : typeof x === 'number' ? x : typeof x === 'boolean' ? Number(x) : Number.NaN;
      if (x !== null && x !== undefined && typeof x !== 'number' && typeof x !== 'bigint' && typeof x !== 'boolean') {
        throw new InputError(`the column "${c}" should hold numbers`, {
          where: { file: path, row: i + 1, field: c },
          found: String(x),
          hint: `check ${req.keyOf(c)}`,
        });
      }
      out[i] = num;
    }
    numbers.set(c, out);
  }
  const texts = new Map<string, string[]>();
  for (const c of new Set(req.texts)) {
    const v = column(c);
    texts.set(c, Array.from({ length: n }, (_, i) => String(v.get(i) ?? '')));
  }
  const line = new Int32Array(n);
  for (let i = 0; i < n; i++) line[i] = i + 1;
  return {
    path,
    kind: 'arrow',
    names,
    nRows: n,
    numbers,
    texts,
    line,
    block: new Int32Array(n),
    blockComments: [[]],
    detail: `Arrow IPC, ${n} rows`,
  };
}

import { closeSync, openSync, readSync, statSync } from 'node:fs';
import { InputError, type Location } from '../core/errors.js';
import type { ColumnTable, TableRequest } from './columnTable.js';
import { detectLayout, requestedSeparator, separatorName, type Layout } from './detectLayout.js';
import { GrowableFloat64, GrowableInt32 } from './growable.js';
import { isGzip, openBytes } from './openBytes.js';
import { numberHint, parseNumber } from './parseNumber.js';
import { RecordScanner, type Separator } from './recordScanner.js';
import { requireColumns } from './requireColumns.js';
import type { CatalogFormat } from './types.js';

/** Bytes looked at before deciding the delimiter and the header. */
const PREFIX_BYTES = 1 << 18;

/** What a format built on delimited text (ECSV) fixes in advance. */
export interface DelimitedPreset {
  format: CatalogFormat;
  layout: Layout;
  /** Called with the header's names and line, before data is read; throws if they are wrong. */
  checkHeader?: (names: string[], line: number) => void;
  /** Called for each requested column before data is read; throws if it cannot be read as asked. */
  checkRequest?: (name: string, kind: 'number' | 'text', line: number) => void;
  units?: Map<string, string>;
  detail?: string;
}

/**
 * Read a CSV, TSV or whitespace-aligned table (or the data part of an ECSV file), streaming it in chunks
 * and materialising only the requested columns. Reports bad cells with file:line:column.
 */
export async function readDelimited(path: string, req: TableRequest, preset?: DelimitedPreset): Promise<ColumnTable> {
  const source = openBytes(path)[Symbol.asyncIterator]();
  let done = false;
  let first = true;
  let bomBytes = 0;
  const pull = async (): Promise<Buffer | undefined> => {
    if (done) return undefined;
    const r = await source.next();
    if (r.done) {
      done = true;
      return undefined;
    }
    let chunk = r.value;
    if (first) {
      first = false;
      if (chunk.length >= 3 && chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf) {
        chunk = chunk.subarray(3);
        bomBytes = 3;
      }
    }
    return chunk;
  };

  // The first part of the file decides the layout.
  const prefixChunks: Buffer[] = [];
  let prefixLength = 0;
  while (prefixLength < PREFIX_BYTES) {
    const c = await pull();
    if (!c) break;
    prefixChunks.push(c);
    prefixLength += c.length;
  }
  const prefix = Buffer.concat(prefixChunks);
  if (prefix.toString('utf8', 0, Math.min(prefix.length, 1 << 16)).trim() === '' && done) {
    throw new InputError(prefix.length === 0 ? 'the file is empty' : 'the file holds only blank lines', {
      where: { file: path },
      expected: 'a header line naming the columns, then one line per star',
      hint: 'check that the download or export finished',
    });
  }
  const layout = preset?.layout ?? detectLayout(prefix, done, {
    comment: req.comment,
    requested: requestedSeparator(req.delimiter, req.textFormat),
    header: req.header,
    file: path,
  });

  const sc = new RecordScanner(layout.sep, req.comment);
  sc.push(prefix);
  const nextRecord = async (): Promise<boolean> => {
    for (;;) {
      if (sc.next(done)) return true;
      if (done) return false;
      const c = await pull();
      if (c) sc.push(c);
    }
  };

  if (!(await nextRecord())) {
    throw new InputError('the file holds only comment lines: no header and no data', {
      where: { file: path },
      expected: `a header line naming the columns (lines starting with ${JSON.stringify(req.comment)} are comments)`,
      hint: 'check the file, or set catalogue.comment if comments use another prefix',
    });
  }

  // Header: the first line, or (for a table of numbers only) the last comment line if it has as many names.
  const headerLine = sc.recordLine;
  let names: string[];
  let firstIsData = false;
  let headerNote: string;
  if (layout.header) {
    names = fieldTexts(sc);
    headerNote = `header on line ${headerLine}`;
  } else {
    firstIsData = true;
    const fromComment = namesFromComment(sc.lastComment, layout.sep, sc.nFields);
    names = fromComment ?? Array.from({ length: sc.nFields }, (_, i) => `col${i + 1}`);
    headerNote = fromComment ? 'column names from the last comment line' : `no header: columns named col1..col${sc.nFields}`;
  }
  names = names.map((n, i) => (n === '' ? `col${i + 1}` : n));
  preset?.checkHeader?.(names, headerLine);

  const headerWhere: Location = { file: path, line: headerLine };
  const index = requireColumns(names, req.columns, headerWhere, (i) => `column ${i + 1} of the header on line ${headerLine}`);
  for (const r of req.columns) preset?.checkRequest?.(r.name, r.kind, headerLine);

  const estimate = estimateRows(path, prefix);
  const numberCols = new Map<string, { idx: number; out: GrowableFloat64 }>();
  const textCols = new Map<string, { idx: number; out: string[] }>();
  for (const r of req.columns) {
    const idx = index.get(r.name) as number;
    if (r.kind === 'number' && !numberCols.has(r.name)) numberCols.set(r.name, { idx, out: new GrowableFloat64(estimate) });
    if (r.kind === 'text' && !textCols.has(r.name)) textCols.set(r.name, { idx, out: [] });
  }
  const numberList = [...numberCols.entries()].map(([name, c]) => ({ name, ...c }));
  const textList = [...textCols.entries()].map(([name, c]) => ({ name, ...c }));
  const lines = new GrowableInt32(estimate);
  const offsets = new GrowableFloat64(estimate);
  const nNames = names.length;

  // Lines between the header and the data that some services print: a rule of dashes, or (VizieR's TSV)
  // a units line and then a rule. Decided by looking ahead in the first part of the file.
  const units = preset?.units ?? new Map<string, string>();
  let preamble = firstIsData ? 0 : preambleLines(prefix, done, layout.sep, req.comment, names, units);
  const nNumbers = numberList.length;
  const nTexts = textList.length;
  // One record, synchronously: awaiting per record would cost a microtask per star.
  const takeRecord = (): void => {
    const line = sc.recordLine;
    if (preamble > 0) {
      preamble--;
      return;
    }
    const nf = sc.nFields;
    if (nf !== nNames && !(nf > nNames && trailingEmpty(sc, nNames))) {
      throw new InputError(`line ${line} has ${nf} field${nf === 1 ? '' : 's'}, but the header has ${nNames}`, {
        where: { file: path, line, column: 1 },
        expected: `${nNames} ${separatorName(layout.sep)} fields, as on line ${headerLine}`,
        hint:
          nf < nNames
            ? 'a value may be missing without a placeholder (write an empty field or NaN), or the line may be cut short'
            : 'a text value may contain the delimiter without quotes (put it in double quotes), or the delimiter may be wrong',
      });
    }
    for (let k = 0; k < nNumbers; k++) {
      const c = numberList[k];
      const v = sc.fastNumber(c.idx) ?? parseNumber(sc.asciiText(c.idx));
      if (v === undefined) {
        const text = sc.text(c.idx);
        const first = lines.length === 0;
        throw new InputError(`the column "${c.name}" should hold numbers, but this cell is not a number`, {
          where: { file: path, line, column: sc.columnOf(c.idx), field: c.name },
          found: text,
          expected: 'a number, or an empty cell / NaN for a missing value',
          hint:
            numberHint(text) ??
            (first && !firstIsData
              ? 'if this line is a second header line, remove it or start it with the comment prefix'
              : 'fix the value, or map a different column'),
        });
      }
      c.out.push(v);
    }
    for (let k = 0; k < nTexts; k++) textList[k].out.push(sc.text(textList[k].idx));
    lines.push(line);
    offsets.push(sc.recordOffset());
  };

  if (firstIsData) takeRecord();
  for (;;) {
    while (sc.next(done)) takeRecord();
    if (done) break;
    const c = await pull();
    if (c) sc.push(c);
  }

  const nRows = lines.length;
  if (nRows === 0) {
    throw new InputError('the file has a header but no data rows', {
      where: { file: path, line: headerLine },
      found: `${nNames} column names and nothing after them`,
      expected: 'one line per star after the header',
      hint: 'check that the export or download finished',
    });
  }

  const lineOf = lines.view();
  const offsetOf = offsets.view();
  const gz = isGzip(path);
  return {
    path,
    format: preset?.format ?? textFormatOf(layout.sep),
    detail: preset?.detail ?? `${separatorName(layout.sep)}, ${headerNote}`,
    nRows,
    names,
    units,
    numbers: new Map(numberList.map((c) => [c.name, c.out.view()])),
    texts: new Map(textList.map((c) => [c.name, c.out])),
    locate(row, column) {
      const where: Location = { file: path, line: lineOf[row], field: column };
      const idx = names.indexOf(column);
      if (!gz && idx >= 0) where.column = columnOnLine(path, offsetOf[row] + bomBytes, idx, layout.sep, req.comment);
      return where;
    },
  };
}

function textFormatOf(sep: Separator): CatalogFormat {
  if (sep === 'whitespace') return 'whitespace';
  if (sep === 0x09) return 'tsv';
  return 'csv';
}

function fieldTexts(sc: RecordScanner): string[] {
  return Array.from({ length: sc.nFields }, (_, f) => sc.text(f));
}

function isRule(sc: RecordScanner): boolean {
  for (let f = 0; f < sc.nFields; f++) if (!/^[-=+:|]+$/.test(sc.text(f))) return false;
  return true;
}

/** How many lines after the header are not data: 1 for a rule, 2 for a units line and a rule. */
function preambleLines(prefix: Buffer, whole: boolean, sep: Separator, comment: string, names: string[], units: Map<string, string>): number {
  const sc = new RecordScanner(sep, comment);
  sc.push(prefix);
  if (!sc.next(whole) || !sc.next(whole)) return 0;
  if (isRule(sc)) return 1;
  if (!isUnitsLine(sc, names.length)) return 0;
  const unitTexts = Array.from({ length: sc.nFields }, (_, f) => sc.text(f));
  if (!sc.next(whole) || !isRule(sc)) return 0;
  unitTexts.forEach((u, f) => {
    if (u !== '') units.set(names[f], u);
  });
  return 2;
}

/** A line of unit names under the header: the right number of cells, none a number, some not empty. */
function isUnitsLine(sc: RecordScanner, nNames: number): boolean {
  if (sc.nFields !== nNames) return false;
  let any = false;
  for (let f = 0; f < sc.nFields; f++) {
    const t = sc.text(f);
    if (t === '') continue;
    if (parseNumber(t) !== undefined || t.length > 24) return false;
    any = true;
  }
  return any;
}

function trailingEmpty(sc: RecordScanner, from: number): boolean {
  for (let f = from; f < sc.nFields; f++) if (sc.text(f) !== '') return false;
  return true;
}

function namesFromComment(comment: string | undefined, sep: Separator, n: number): string[] | undefined {
  if (comment === undefined) return undefined;
  const sc = new RecordScanner(sep, '');
  sc.push(Buffer.from(comment, 'utf8'));
  if (!sc.next(true) || sc.nFields !== n) return undefined;
  const names = fieldTexts(sc);
  return names.every((s) => s !== '' && parseNumber(s) === undefined) ? names : undefined;
}

/** Rows expected from the file size and the lines seen so far, to size the column arrays once. */
function estimateRows(path: string, prefix: Buffer): number {
  try {
    const size = statSync(path).size;
    let lf = 0;
    for (let i = 0; i < prefix.length; i++) if (prefix[i] === 0x0a) lf++;
    const perLine = prefix.length / Math.max(1, lf);
    return Math.min(50_000_000, Math.ceil((size / Math.max(8, perLine)) * 1.05) + 16);
  } catch {
    return 1024;
  }
}

/** 1-based character column of field `idx` in the record starting at byte `offset` (error paths only). */
function columnOnLine(path: string, offset: number, idx: number, sep: Separator, comment: string): number | undefined {
  let fd: number | undefined;
  try {
    fd = openSync(path, 'r');
    const buf = Buffer.alloc(1 << 16);
    const got = readSync(fd, buf, 0, buf.length, offset);
    const sc = new RecordScanner(sep, comment);
    sc.push(buf.subarray(0, got));
    if (!sc.next(true) || idx >= sc.nFields) return undefined;
    return sc.columnOf(idx);
  } catch {
    return undefined;
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

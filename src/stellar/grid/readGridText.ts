/**
 * The reader for isochrone tables as stellar-model groups publish them: whitespace-aligned (or CSV)
 * columns, `#` comment lines, and several isochrones stacked in one file, each introduced by a block of
 * comments (often repeating the column names). The catalogue reader (src/catalog) drops comment lines and
 * expects one header; here the comment blocks matter (they separate isochrones and may carry each one's age
 * or metallicity), so this module keeps them. It streams the file in chunks, splits fields by hand (no
 * quoting beyond a pair of quotes around a CSV cell) and turns only the mapped columns into numbers.
 * stellar/ may import only core/, so the catalogue's reader could not be reused here without moving it.
 */
import { closeSync, openSync, readSync } from 'node:fs';
import { StringDecoder } from 'node:string_decoder';
import { InputError } from '../../core/errors.js';
import { requireFile } from '../../core/files.js';
import { numberHint, parseNumber } from '../../core/parseNumber.js';
import { didYouMean } from '../../core/suggest.js';
import type { RawGridTable, RawTableRequest } from './rawTable.js';

const CHUNK = 1 << 22;

class Growable {
  a: Float64Array;
  n = 0;
  constructor(cap: number) {
    this.a = new Float64Array(Math.max(16, cap));
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Float64Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  view(): Float64Array {
    return this.a.subarray(0, this.n);
  }
}

class GrowableInt {
  a: Int32Array;
  n = 0;
  constructor(cap: number) {
    this.a = new Int32Array(Math.max(16, cap));
  }
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = new Int32Array(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  view(): Int32Array {
    return this.a.subarray(0, this.n);
  }
}

/** Field boundaries of one line: starts[f] .. ends[f] (exclusive), quotes excluded. */
class Fields {
  starts = new Int32Array(64);
  ends = new Int32Array(64);
  n = 0;

  split(line: string, delim: number): void {
    let n = 0;
    const len = line.length;
    let i = 0;
    if (delim < 0) {
      for (;;) {
        while (i < len && isBlank(line.charCodeAt(i))) i++;
        if (i >= len) break;
        const s = i;
        while (i < len && !isBlank(line.charCodeAt(i))) i++;
        this.put(n++, s, i);
      }
    } else {
      for (;;) {
        let s = i;
        while (i < len && line.charCodeAt(i) !== delim) i++;
        let e = i;
        while (s < e && isBlank(line.charCodeAt(s))) s++;
        while (e > s && isBlank(line.charCodeAt(e - 1))) e--;
        if (e - s >= 2 && line.charCodeAt(s) === 0x22 && line.charCodeAt(e - 1) === 0x22) {
          s++;
          e--;
        }
        this.put(n++, s, e);
        if (i >= len) break;
        i++;
      }
    }
    this.n = n;
  }

  private put(k: number, s: number, e: number): void {
    if (k >= this.starts.length) {
      const a = new Int32Array(this.starts.length * 2);
      a.set(this.starts);
      this.starts = a;
      const b = new Int32Array(this.ends.length * 2);
      b.set(this.ends);
      this.ends = b;
    }
    this.starts[k] = s;
    this.ends[k] = e;
  }

  texts(line: string): string[] {
    return Array.from({ length: this.n }, (_, f) => line.slice(this.starts[f], this.ends[f]));
  }
}

function isBlank(c: number): boolean {
  return c === 0x20 || c === 0x09;
}

/** Read the requested columns of a whitespace-aligned or delimited isochrone table. */
export function readGridText(path: string, req: RawTableRequest): RawGridTable {
  const st = requireFile(path, 'isochrone table');
  const delim = req.delimiter === undefined || /^\s+$/.test(req.delimiter) ? -1 : (req.delimiter === '\\t' ? '\t' : req.delimiter).charCodeAt(0);
  const comment = req.comment;
  const fields = new Fields();
  const estimate = Math.ceil(st.size / 80);
  const lineOf = new GrowableInt(estimate);
  const blockOf = new GrowableInt(estimate);
  const blockComments: string[][] = [];
  let pendingComments: string[] = [];
  let sinceData = true; // a comment, blank line or header since the last data row: the next row starts a block
  let names: string[] | undefined;
  let headerNote = '';
  let headerLine = 0;
  let numberCols: { name: string; idx: number; out: Growable }[] = [];
  let textCols: { name: string; idx: number; out: string[] }[] = [];
  let nBlocks = 0;
  let lineNo = 0;

  const setHeader = (h: string[], line: number, note: string): void => {
    names = h.map((s, k) => (s === '' ? `col${k + 1}` : s));
    headerLine = line;
    headerNote = note;
    const index = new Map<string, number>();
    names.forEach((nm, k) => {
      if (!index.has(nm)) index.set(nm, k);
    });
    const need = (c: string): number => {
      const k = index.get(c);
      if (k === undefined) {
        throw new InputError(`the column "${c}" named by ${req.keyOf(c)} is not in the table`, {
          where: { file: path, line },
          found: `columns ${names!.map((x) => JSON.stringify(x)).join(', ')}`,
          expected: `a column named "${c}" (names are case-sensitive)`,
          hint: didYouMean(c, names!) ?? 'check the column map against the header of the table',
        });
      }
      return k;
    };
    numberCols = [...new Set(req.numbers)].map((c) => ({ name: c, idx: need(c), out: new Growable(estimate) }));
    textCols = [...new Set(req.texts)].map((c) => ({ name: c, idx: need(c), out: [] as string[] }));
  };

  const takeLine = (line: string): void => {
    lineNo++;
    let i = 0;
    const len = line.length;
    while (i < len && isBlank(line.charCodeAt(i))) i++;
    if (i >= len) {
      sinceData = true;
      return;
    }
    if (comment !== '' && line.startsWith(comment, i)) {
      pendingComments.push(line.slice(i + comment.length).trim());
      if (pendingComments.length > 200) pendingComments.shift();
      sinceData = true;
      return;
    }
    fields.split(line, delim);
    if (names === undefined) {
      // The first line names the columns when all its fields are words; else the names come from the last
      // comment line above it with as many words (the usual layout), or, failing both, from a first line
      // that is mostly words. A data row may hold a word or two (a stage label).
      const texts = fields.texts(line);
      const words = texts.filter((t) => parseNumber(t) === undefined).length;
      const fromComment = words === texts.length ? undefined : headerFromComments(pendingComments, delim, fields.n);
      if (!fromComment && 2 * words >= texts.length) {
        setHeader(texts, lineNo, `header on line ${lineNo}`);
        sinceData = true;
        return;
      }
      if (fromComment) setHeader(fromComment, lineNo, 'column names from the comment line above the first row');
      else setHeader(texts.map((_, k) => `col${k + 1}`), lineNo, `no header: columns named col1..col${fields.n}`);
    } else if (fields.n === names.length && isRepeatedHeader(line, fields, names)) {
      sinceData = true;
      return;
    }
    const nNames = names!.length;
    if (fields.n !== nNames) {
      throw fieldCountError(path, lineNo, fields.n, nNames, headerLine, false);
    }
    if (sinceData) {
      blockComments.push(pendingComments);
      pendingComments = [];
      nBlocks++;
      sinceData = false;
    }
    for (let k = 0; k < numberCols.length; k++) {
      const c = numberCols[k];
      const s = fields.starts[c.idx];
      const e = fields.ends[c.idx];
      let v: number;
      if (s === e) v = Number.NaN;
      else {
        const t = line.slice(s, e);
        v = +t;
        if (Number.isNaN(v)) {
          const p = parseNumber(t);
          if (p === undefined) {
            throw new InputError(`the column "${c.name}" should hold numbers, but this cell is not a number`, {
              where: { file: path, line: lineNo, column: s + 1, field: c.name },
              found: t,
              expected: `a number (the column is named by ${req.keyOf(c.name)})`,
              hint: numberHint(t) ?? 'check that the column map names the right column, and that comment lines start with the comment prefix',
            });
          }
          v = p;
        }
      }
      c.out.push(v);
    }
    for (let k = 0; k < textCols.length; k++) {
      const c = textCols[k];
      c.out.push(line.slice(fields.starts[c.idx], fields.ends[c.idx]));
    }
    lineOf.push(lineNo);
    blockOf.push(nBlocks - 1);
  };

  const fd = openSync(path, 'r');
  const decoder = new StringDecoder('utf8');
  const buf = Buffer.allocUnsafe(CHUNK);
  let rest = '';
  let first = true;
  try {
    for (;;) {
      const got = readSync(fd, buf, 0, CHUNK, null);
      if (got === 0) break;
      let text = rest + decoder.write(buf.subarray(0, got));
      if (first) {
        text = text.replace(/^\uFEFF/, '');
        first = false;
      }
      let start = 0;
      for (;;) {
        const nl = text.indexOf('\n', start);
        if (nl < 0) break;
        const end = nl > start && text.charCodeAt(nl - 1) === 0x0d ? nl - 1 : nl;
        takeLine(text.slice(start, end));
        start = nl + 1;
      }
      rest = text.slice(start);
    }
    rest += decoder.end();
    if (rest.length > 0) {
      const line = rest.endsWith('\r') ? rest.slice(0, -1) : rest;
      try {
        takeLine(line);
      } catch (e) {
        // A last line without its newline and with too few fields: the file was cut short.
        if (e instanceof InputError && names !== undefined && fields.n < names.length) {
          throw fieldCountError(path, lineNo, fields.n, names.length, headerLine, true);
        }
        throw e;
      }
    }
  } finally {
    closeSync(fd);
  }
  if (names === undefined || lineOf.n === 0) {
    throw new InputError('the isochrone table holds no data rows', {
      where: { file: path, line: headerLine || undefined },
      expected: 'rows of numbers, one per star of each isochrone',
      hint: 'check that the download finished, and that data lines do not start with the comment prefix',
    });
  }
  return {
    path,
    kind: 'text',
    names,
    nRows: lineOf.n,
    numbers: new Map(numberCols.map((c) => [c.name, c.out.view()])),
    texts: new Map(textCols.map((c) => [c.name, c.out])),
    line: lineOf.view(),
    block: blockOf.view(),
    blockComments,
    detail: `${delim < 0 ? 'whitespace-aligned' : `separated by ${JSON.stringify(String.fromCharCode(delim))}`}, ${headerNote}, ${nBlocks} block${nBlocks === 1 ? '' : 's'} of rows`,
  };
}

function fieldCountError(path: string, line: number, nf: number, nNames: number, headerLine: number, cutShort: boolean): InputError {
  if (cutShort) {
    return new InputError(`the file ends in the middle of a line: line ${line} has ${nf} of ${nNames} fields and no line end`, {
      where: { file: path, line, column: 1 },
      expected: `${nNames} fields, as named on line ${headerLine}`,
      hint: 'the download or copy was probably cut short: fetch the table again (or delete the incomplete last isochrone)',
    });
  }
  return new InputError(`line ${line} has ${nf} field${nf === 1 ? '' : 's'}, but the table has ${nNames} columns`, {
    where: { file: path, line, column: 1 },
    expected: `${nNames} fields, as named on line ${headerLine}`,
    hint:
      nf < nNames
        ? 'a value may be missing without a placeholder, or the line may be cut short; comment lines must start with the comment prefix'
        : 'the delimiter may be wrong (grid.delimiter), or a comment line may lack the comment prefix',
  });
}

/** Names from the last comment line with as many fields as the data, none of them a number. */
function headerFromComments(comments: string[], delim: number, n: number): string[] | undefined {
  const f = new Fields();
  for (let k = comments.length - 1; k >= 0; k--) {
    f.split(comments[k], delim);
    if (f.n !== n) continue;
    const t = f.texts(comments[k]);
    if (t.every((s) => s !== '' && parseNumber(s) === undefined)) return t;
  }
  return undefined;
}

function isRepeatedHeader(line: string, f: Fields, names: string[]): boolean {
  for (let k = 0; k < f.n; k++) if (line.slice(f.starts[k], f.ends[k]) !== names[k]) return false;
  return true;
}

/**
 * Delimited text as astronomers receive it. Expected values are the cells as written in each file; the
 * quoting rules are those of RFC 4180 (double quotes, "" for a quote, delimiters and line breaks inside).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import type { ColumnRequest, TableRequest } from '../../src/catalog/index.js';
import { readTable } from '../../src/catalog/index.js';
import { InputError } from '../../src/core/errors.js';

const dir = mkdtempSync(join(tmpdir(), 'coeval-text-'));
let n = 0;
function file(content: string | Buffer, ext = '.csv'): string {
  const p = join(dir, `t${n++}${ext}`);
  writeFileSync(p, content);
  return p;
}
const num = (name: string): ColumnRequest => ({ name, kind: 'number', role: 'test', key: `test.${name}` });
const txt = (name: string): ColumnRequest => ({ name, kind: 'text', role: 'test', key: `test.${name}` });
const req = (columns: ColumnRequest[], extra: Partial<TableRequest> = {}): TableRequest => ({ columns, comment: '#', ...extra });

async function inputError(p: Promise<unknown>): Promise<InputError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('delimited text', () => {
  it('reads comma-separated values with comment lines, blank lines and a header', async () => {
    const p = file('# exported 2031-01-01\n# columns: id, V\n\nid,V,eV\na,15.5,0.01\n\nb,16.25,0.02\n# a trailing comment\n');
    const t = await readTable(p, 'csv', req([txt('id'), num('V')]));
    expect(t.nRows).toBe(2);
    expect(t.texts.get('id')).toEqual(['a', 'b']);
    expect(Array.from(t.numbers.get('V') as Float64Array)).toEqual([15.5, 16.25]);
    expect(t.detail).toBe('comma-separated, header on line 4');
    expect(t.locate(1, 'V')).toMatchObject({ line: 7, column: 3, field: 'V' });
  });

  it('detects tabs, semicolons and whitespace-aligned columns', async () => {
    const tsv = await readTable(file('id\tV\na\t15\n'), 'tsv', req([num('V')]));
    expect(tsv.format).toBe('tsv');
    const semi = await readTable(file('id;V\na;15\n'), 'csv', req([num('V')]));
    expect(semi.detail).toMatch(/semicolon/);
    const ws = await readTable(file('  id     V    eV\n  a   15.0  0.1\n  b   16.0  0.2\n', '.txt'), 'whitespace', req([num('V'), num('eV')]));
    expect(ws.format).toBe('whitespace');
    expect(Array.from(ws.numbers.get('eV') as Float64Array)).toEqual([0.1, 0.2]);
  });

  it('reads quoted fields with delimiters, doubled quotes and line breaks inside (RFC 4180)', async () => {
    const p = file('id,note,V\n"s,1","said ""hi""",15\n"s2","two\nlines",16\n');
    const t = await readTable(p, 'csv', req([txt('id'), txt('note'), num('V')]));
    expect(t.texts.get('id')).toEqual(['s,1', 's2']);
    expect(t.texts.get('note')).toEqual(['said "hi"', 'two\nlines']);
    expect(Array.from(t.numbers.get('V') as Float64Array)).toEqual([15, 16]);
    expect(t.locate(1, 'V').line).toBe(3);
  });

  it('reads the spellings of "no value" as NaN, true/false as 1/0, and a Fortran D exponent', async () => {
    const p = file('V,f\n,true\nNaN,False\nnull,1\n--,0\n1.5D+01,TRUE\n');
    const t = await readTable(p, 'csv', req([num('V'), num('f')]));
    expect(Array.from(t.numbers.get('V') as Float64Array)).toEqual([NaN, NaN, NaN, NaN, 15]);
    expect(Array.from(t.numbers.get('f') as Float64Array)).toEqual([1, 0, 1, 0, 1]);
  });

  it('takes column names from the last comment line of a table of numbers only', async () => {
    const t = await readTable(file('# id V eV\n1 15.0 0.1\n2 16.0 0.2\n', '.dat'), 'whitespace', req([num('V')]));
    expect(Array.from(t.numbers.get('V') as Float64Array)).toEqual([15, 16]);
    const bare = await readTable(file('1 15.0 0.1\n2 16.0 0.2\n', '.dat'), 'whitespace', req([num('col2')]));
    expect(Array.from(bare.numbers.get('col2') as Float64Array)).toEqual([15, 16]);
  });

  it('skips a rule of dashes under the header', async () => {
    const t = await readTable(file('id    V\n----  -----\na     15.0\n'), 'whitespace', req([num('V')]));
    expect(t.nRows).toBe(1);
  });

  it('keeps 64-bit integer ids exact as text', async () => {
    const t = await readTable(file('source_id,V\n9223372036854775807,15\n4611686018427387905,16\n'), 'csv', req([txt('source_id')]));
    expect(t.texts.get('source_id')).toEqual(['9223372036854775807', '4611686018427387905']);
  });

  it('reads a gzipped file, and a file split across many chunks', async () => {
    const rows = Array.from({ length: 30000 }, (_, i) => `s${i},"${(10 + i / 3000).toFixed(4)}",0.01`).join('\r\n');
    const text = `id,V,eV\r\n${rows}\r\n`;
    const plain = await readTable(file(text), 'csv', req([num('V'), txt('id')]));
    const gz = await readTable(file(gzipSync(Buffer.from(text)), '.csv.gz'), 'csv', req([num('V'), txt('id')]));
    expect(plain.nRows).toBe(30000);
    expect(Array.from(gz.numbers.get('V') as Float64Array)).toEqual(Array.from(plain.numbers.get('V') as Float64Array));
    expect((plain.numbers.get('V') as Float64Array)[29999]).toBe(Number((10 + 29999 / 3000).toFixed(4)));
    expect(plain.locate(29999, 'V')).toMatchObject({ line: 30001, column: 8 });
  });

  it('accepts a trailing delimiter on data lines', async () => {
    const t = await readTable(file('id,V\na,15,\nb,16,\n'), 'csv', req([num('V')]));
    expect(t.nRows).toBe(2);
  });

  it('locates a cell after a multi-byte character by characters, not bytes', async () => {
    const e = await inputError(readTable(file('id,V\nstär,x\n'), 'csv', req([num('V')])));
    expect(e.where).toMatchObject({ line: 2, column: 6 });
  });

  it('refuses a requested delimiter that leaves the header as one column', async () => {
    const e = await inputError(readTable(file('a\tb\n1\t2\n'), 'csv', req([num('a')], { delimiter: ',' })));
    expect(e.message).toMatch(/looks tab-separated/);
    expect(e.hint).toMatch(/catalogue\.delimiter = "\\t"/);
  });

  it('says when a file has only comments', async () => {
    const e = await inputError(readTable(file('# nothing here\n# at all\n'), 'csv', req([num('V')])));
    expect(e.message).toMatch(/only comment lines/);
  });

  it('suggests a case-insensitive match for a missing column', async () => {
    const e = await inputError(readTable(file('ID,VMAG\na,1\n'), 'csv', req([num('Vmag')])));
    expect(e.hint).toMatch(/did you mean "VMAG"/);
  });
});

describe('the byte-level number path', () => {
  it('gives exactly what Number() gives for plain decimals, and defers everything else', async () => {
    // Number() is the reference: ECMAScript's StringToNumber is correctly rounded.
    const cells = ['0', '-0', '+3', '15.12345', '-0.000123', '.5', '5.', '123456789012345', '1234567890.12345', '0.1234567890123456789', '99999999999999999', '1e3', '7.1D-2', '  42.5  ', '00012.50'];
    const p = file(`x\n${cells.map((c) => `"${c}"`.replace(/^"(.*)"$/, '$1')).join('\n')}\n`);
    const t = await readTable(p, 'csv', req([num('x')]));
    const got = Array.from(t.numbers.get('x') as Float64Array);
    cells.forEach((c, i) => {
      const want = /D/.test(c) ? Number(c.replace('D', 'e')) : Number(c);
      expect(Object.is(got[i], want), `${JSON.stringify(c)}: ${got[i]} vs ${want}`).toBe(true);
    });
  });

  it('matches Number() on many random decimals', async () => {
    // Seeded linear congruential sequence (Numerical Recipes constants); values with 1-15 digits.
    let s = 12345;
    const next = () => (s = (s * 1664525 + 1013904223) % 4294967296) / 4294967296;
    const cells = Array.from({ length: 20000 }, () => (next() * 10 ** Math.floor(next() * 8) * (next() < 0.5 ? -1 : 1)).toFixed(Math.floor(next() * 9)));
    const t = await readTable(file(`x\n${cells.join('\n')}\n`), 'csv', req([num('x')]));
    const got = t.numbers.get('x') as Float64Array;
    let bad = 0;
    cells.forEach((c, i) => {
      if (!Object.is(got[i], Number(c))) bad++;
    });
    expect(bad).toBe(0);
  });
});

describe('service layouts', () => {
  it("reads VizieR's tab-separated layout: comments, header, a units line and a rule of dashes", async () => {
    // The layout of VizieR's "tab-separated values" output (common practice; invented values).
    const text = ['#', '#Title: an invented table', '#Column\tRAJ2000\t(F10.6)', 'RAJ2000\tVmag\te_Vmag\tID', 'deg\tmag\tmag\t', '----------\t------\t------\t---', '10.000001\t15.123\t0.012\tT7-1', '10.000002\t\t\tT7-2', ''].join('\n');
    const t = await readTable(file(text, '.tsv'), 'tsv', req([num('Vmag'), num('e_Vmag'), txt('ID')]));
    expect(t.nRows).toBe(2);
    expect(Array.from(t.numbers.get('Vmag') as Float64Array)).toEqual([15.123, NaN]);
    expect(t.units.get('Vmag')).toBe('mag');
    expect(t.texts.get('ID')).toEqual(['T7-1', 'T7-2']);
  });
});

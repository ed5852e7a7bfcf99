/**
 * ECSV (Enhanced Character Separated Values, astropy APE 6, ECSV 1.0): a YAML header in `# ` comment lines
 * gives each column's name, unit and datatype, and the delimiter (space or comma); the data follow as
 * delimited text with a line of column names. The YAML is parsed with the `yaml` package; the data go
 * through the same streaming reader as CSV.
 */
import { parseDocument } from 'yaml';
import { InputError } from '../core/errors.js';
import type { ColumnTable, TableRequest } from './columnTable.js';
import { openBytes } from './openBytes.js';
import { readDelimited } from './readDelimited.js';

interface EcsvColumn {
  name: string;
  datatype: string;
  unit?: string;
  subtype?: string;
}

const NUMERIC = /^(bool|u?int(8|16|32|64)|float(16|32|64|128))$/;
const HEADER_LIMIT = 8 << 20;

export async function readEcsv(path: string, req: TableRequest): Promise<ColumnTable> {
  const { lines, firstLine } = await headerLines(path);
  const first = lines[0] ?? '';
  const version = /^# %ECSV (\d+\.\d+)/.exec(first);
  if (!version) {
    throw new InputError('this is not an ECSV file: the first line is not "# %ECSV <version>"', {
      where: { file: path, line: firstLine, column: 1 },
      found: first.slice(0, 60),
      hint: 'set catalogue.format = "csv" (or "auto") for plain delimited text',
    });
  }
  const sep = lines.findIndex((l) => /^# ---\s*$/.test(l));
  if (sep < 0) {
    throw new InputError('the ECSV header has no "# ---" line before its YAML', {
      where: { file: path, line: firstLine + 1 },
      expected: 'the ECSV 1.0 header layout: "# %ECSV 1.0", "# ---", then YAML lines each starting with "# "',
    });
  }
  const yamlText = lines
    .slice(sep + 1)
    .map((l) => (l.startsWith('# ') ? l.slice(2) : l.slice(1)))
    .join('\n');
  const doc = parseDocument(yamlText, { strict: false, uniqueKeys: false, logLevel: 'silent' });
  if (doc.errors.length > 0) {
    const e = doc.errors[0];
    throw new InputError(`the ECSV header is not valid YAML: ${e.message.split('\n')[0]}`, {
      where: { file: path, line: firstLine + sep + 1 + (e.linePos?.[0].line ?? 0), column: (e.linePos?.[0].col ?? 0) + 2 },
      hint: 'fix the header, or export the table again',
    });
  }
  const header = (doc.toJS({ maxAliasCount: -1 }) ?? {}) as { datatype?: unknown; delimiter?: unknown };
  if (!Array.isArray(header.datatype)) {
    throw new InputError('the ECSV header has no "datatype" list of columns', {
      where: { file: path, line: firstLine + sep + 1 },
      expected: 'datatype: a list of {name, datatype, unit, ...} entries',
    });
  }
  const columns: EcsvColumn[] = (header.datatype as Record<string, unknown>[]).map((c) => ({
    name: String(c.name),
    datatype: String(c.datatype ?? 'string'),
    unit: c.unit === undefined ? undefined : String(c.unit),
    subtype: c.subtype === undefined ? undefined : String(c.subtype),
  }));
  const delimiter = header.delimiter === undefined ? ' ' : String(header.delimiter);
  if (delimiter !== ' ' && delimiter !== ',') {
    throw new InputError(`the ECSV delimiter ${JSON.stringify(delimiter)} is not allowed`, {
      where: { file: path },
      expected: 'a space or a comma (ECSV 1.0)',
    });
  }
  const byName = new Map(columns.map((c) => [c.name, c]));
  const units = new Map<string, string>();
  for (const c of columns) if (c.unit) units.set(c.name, c.unit);

  return readDelimited(path, { ...req, comment: '#' }, {
    format: 'ecsv',
    layout: { sep: delimiter === ',' ? 0x2c : 'whitespace', header: true },
    units,
    detail: `version ${version[1]}, ${delimiter === ',' ? 'comma' : 'space'}-delimited`,
    checkHeader(names, line) {
      const expected = columns.map((c) => c.name);
      if (names.length !== expected.length || names.some((n, i) => n !== expected[i])) {
        throw new InputError('the ECSV column-name line does not match the names in the YAML header', {
          where: { file: path, line, column: 1 },
          found: names.join(' '),
          expected: expected.join(' '),
          hint: 'the file was edited by hand or is damaged; export it again',
        });
      }
    },
    checkRequest(name, kind, line) {
      const c = byName.get(name);
      if (!c) return;
      if (c.subtype !== undefined && kind === 'number') {
        throw new InputError(`the column "${name}" holds ${c.subtype} values per row, not one number`, {
          where: { file: path, line, field: name },
          hint: 'map a scalar column',
        });
      }
      if (kind === 'number' && !NUMERIC.test(c.datatype)) {
        throw new InputError(`the column "${name}" has ECSV datatype ${c.datatype}, not a number`, {
          where: { file: path, line, field: name },
          expected: 'bool, int*, uint* or float*',
          hint: 'map a numeric column',
        });
      }
    },
  });
}

/** The `#` lines at the top of the file (streamed: the header may be long, the data longer). */
async function headerLines(path: string): Promise<{ lines: string[]; firstLine: number }> {
  const decoder = new TextDecoder('utf-8');
  let text = '';
  for await (const chunk of openBytes(path, 1 << 16)) {
    text += decoder.decode(chunk, { stream: true });
    const m = /(^|\n)[ \t]*[^#\s]/.exec(text);
    if (m || text.length > HEADER_LIMIT) break;
  }
  const all = text.split(/\r?\n/);
  let firstLine = 1;
  while (firstLine <= all.length && all[firstLine - 1].trim() === '') firstLine++;
  const lines: string[] = [];
  for (let i = firstLine - 1; i < all.length && all[i].startsWith('#'); i++) lines.push(all[i]);
  if (lines.length === 0 && text.trim() === '') {
    throw new InputError('the file is empty', { where: { file: path }, hint: 'check that the download or export finished' });
  }
  return { lines, firstLine };
}

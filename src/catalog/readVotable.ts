/**
 * VOTable 1.4 (IVOA Recommendation, 2019): TABLEDATA, BINARY and BINARY2 serialisations, streamed through
 * the saxes XML parser so that a large archive result is never held as a DOM. Only the requested columns
 * are kept. The TABLE read is the first one, or `catalogue.table` (0-based, in document order).
 */
import { SaxesParser, type SaxesTag } from 'saxes';
import { InputError, type Location } from '../core/errors.js';
import type { ColumnRequest, ColumnTable, TableRequest } from './columnTable.js';
import { GrowableFloat64, GrowableInt32 } from './growable.js';
import { openBytes } from './openBytes.js';
import { requireColumns } from './requireColumns.js';
import { ELEMENT_BYTES, fixedCount, isScalar, tdNumber, tdText, TEXT_TYPES, type VoField, binaryNumber, binaryText } from './votableFields.js';

interface Wanted {
  field: number;
  name: string;
  numbers?: GrowableFloat64;
  texts?: string[];
}

export async function readVotable(path: string, req: TableRequest): Promise<ColumnTable> {
  const tableWanted = req.table ?? 0;
  const parser = new SaxesParser({ position: true, xmlns: false });
  const fields: VoField[] = [];
  const units = new Map<string, string>();
  let tableCount = 0;
  let inTable = false; // inside the selected TABLE
  let finished = false;
  let depthInField = false;
  let status: { value: string; text: string } | undefined;
  let infoText: string | undefined;
  let serialisation: string | undefined;
  let wanted: Wanted[] = [];
  let wantedByField: (Wanted | undefined)[] = [];
  let fatal: unknown;
  const rowLines = new GrowableInt32();
  let nRows = 0;
  // TABLEDATA state
  let cell = -1;
  let cellText = '';
  let inTd = false;
  let tdLine = 0;
  let tdColumn = 0;
  // BINARY/BINARY2 state
  let inStream = false;
  let base64Rest = '';
  let pending: Buffer = Buffer.alloc(0);

  const where = (extra: Partial<Location> = {}): Location => ({ file: path, ...extra });

  const startData = (): void => {
    const names = fields.map((f) => f.name);
    const index = requireColumns(names, req.columns, where(), (i) => `FIELD ${i + 1}`);
    const byName = new Map<string, Wanted>();
    for (const r of req.columns) {
      const fi = index.get(r.name) as number;
      checkReadable(fields[fi], r, path);
      let w = byName.get(r.name);
      if (!w) {
        w = { field: fi, name: r.name };
        byName.set(r.name, w);
      }
      if (r.kind === 'number') w.numbers ??= new GrowableFloat64();
      else w.texts ??= [];
    }
    wanted = [...byName.values()];
    wantedByField = fields.map((_, i) => wanted.find((w) => w.field === i));
  };

  const local = (name: string): string => name.slice(name.indexOf(':') + 1);

  parser.on('opentag', (tag: SaxesTag) => {
    const name = local(tag.name);
    const attr = tag.attributes as Record<string, string>;
    if (name === 'INFO' && attr.name === 'QUERY_STATUS') {
      status = { value: attr.value ?? '', text: '' };
      infoText = '';
    }
    if (name === 'TABLE') {
      if (tableCount === tableWanted) inTable = true;
      tableCount++;
      return;
    }
    if (!inTable) return;
    switch (name) {
      case 'FIELD':
        fields.push({ name: attr.name ?? attr.ID ?? `col${fields.length + 1}`, datatype: attr.datatype ?? 'char', arraysize: attr.arraysize, unit: attr.unit });
        if (attr.unit) units.set(fields[fields.length - 1].name, attr.unit);
        depthInField = true;
        return;
      case 'VALUES':
        if (depthInField && attr.null !== undefined) fields[fields.length - 1].nullValue = attr.null;
        return;
      case 'TABLEDATA':
      case 'BINARY':
      case 'BINARY2':
        serialisation = name;
        startData();
        return;
      case 'FITS':
        throw new InputError('this VOTable carries its data as an embedded FITS stream, which coeval does not read', {
          where: where(),
          expected: 'TABLEDATA, BINARY or BINARY2 serialisation',
          hint: 'ask the archive for TABLEDATA or BINARY2 output, or download the FITS file itself',
        });
      case 'STREAM':
        if (attr.href) {
          throw new InputError('this VOTable points at its data elsewhere (STREAM href), which coeval does not follow', {
            where: where({ line: parser.line }),
            found: attr.href,
            hint: 'download the data it points at, or ask the archive for inline data',
          });
        }
        if ((attr.encoding ?? 'base64') !== 'base64') {
          throw new InputError(`the VOTable STREAM encoding "${attr.encoding}" is not supported`, {
            where: where({ line: parser.line }),
            expected: 'encoding="base64"',
          });
        }
        inStream = true;
        return;
      case 'TR':
        cell = -1;
        rowLines.push(parser.line);
        return;
      case 'TD':
        cell++;
        cellText = '';
        inTd = true;
        tdLine = parser.line;
        tdColumn = parser.column + 1;
        return;
      default:
    }
  });

  parser.on('text', (t: string) => {
    if (inTd) cellText += t;
    else if (inStream) feedBase64(t);
    else if (infoText !== undefined) infoText += t;
  });
  parser.on('cdata', (t: string) => {
    if (inTd) cellText += t;
  });

  parser.on('closetag', (tag: SaxesTag) => {
    const name = local(tag.name);
    if (name === 'INFO' && infoText !== undefined) {
      if (status && status.text === '') status.text = infoText.trim();
      infoText = undefined;
    }
    if (!inTable) return;
    switch (name) {
      case 'FIELD':
        depthInField = false;
        return;
      case 'TD':
        inTd = false;
        takeCell();
        return;
      case 'TR':
        finishTextRow();
        return;
      case 'STREAM':
        inStream = false;
        flushBase64();
        if (pending.length > 0) {
          throw new InputError(`the binary stream ends in the middle of row ${nRows + 1}`, {
            where: where({ row: nRows + 1 }),
            found: `${pending.length} bytes left over`,
            hint: 'the file is truncated or damaged; download it again',
          });
        }
        return;
      case 'TABLE':
        inTable = false;
        finished = true;
        return;
      default:
    }
  });

  parser.on('error', (e: Error) => {
    throw new InputError(`the VOTable is not well-formed XML: ${e.message.replace(/^.*?:\d+:\d+: /, '')}`, {
      where: { file: path, line: parser.line, column: parser.column + 1 },
      expected: 'well-formed XML (VOTable 1.4)',
      hint: 'the file may be truncated or hand-edited; download or export it again',
    });
  });

  function takeCell(): void {
    const w = wantedByField[cell];
    if (!w) return;
    const field = fields[cell];
    if (w.numbers) {
      const v = tdNumber(field, cellText);
      if (v === undefined) {
        throw new InputError(`the column "${w.name}" should hold numbers, but this cell is not a number`, {
          where: { file: path, line: tdLine, column: tdColumn, row: nRows + 1, field: w.name },
          found: cellText.trim(),
          expected: `a ${field.datatype} value, or an empty cell for a missing value`,
          hint: 'fix the value, or map a different column',
        });
      }
      w.numbers.push(v);
    }
    if (w.texts) w.texts.push(tdText(field, cellText));
  }

  function finishTextRow(): void {
    nRows++;
    if (cell + 1 < fields.length) {
      // Missing trailing TDs are empty cells (section 6: a row may end early).
      for (let c = cell + 1; c < fields.length; c++) {
        cell = c;
        cellText = '';
        takeCell();
      }
    }
  }

  function feedBase64(t: string): void {
    const s = base64Rest + t.replace(/\s+/g, '');
    const usable = s.length - (s.length % 4);
    base64Rest = s.slice(usable);
    if (usable > 0) decodeRows(Buffer.from(s.slice(0, usable), 'base64'));
  }

  function flushBase64(): void {
    if (base64Rest.length > 0) decodeRows(Buffer.from(base64Rest, 'base64'));
    base64Rest = '';
  }

  function decodeRows(bytes: Buffer): void {
    const buf = pending.length > 0 ? Buffer.concat([pending, bytes]) : bytes;
    let pos = 0;
    for (;;) {
      const next = decodeRow(buf, pos);
      if (next < 0) break;
      pos = next;
      nRows++;
    }
    pending = Buffer.from(buf.subarray(pos));
  }

  /** Decodes the row at `pos`; returns the position after it, or -1 if the bytes end inside it. */
  function decodeRow(buf: Buffer, pos: number): number {
    let p = pos;
    const nf = fields.length;
    let nulls: Buffer | undefined;
    if (serialisation === 'BINARY2') {
      const nb = Math.ceil(nf / 8);
      if (p + nb > buf.length) return -1;
      nulls = buf.subarray(p, p + nb);
      p += nb;
    }
    // First pass: check the whole row is present (variable-length cells carry a 4-byte count).
    const starts = rowStarts.length >= nf ? rowStarts : (rowStarts = new Int32Array(nf));
    const counts = rowCounts.length >= nf ? rowCounts : (rowCounts = new Int32Array(nf));
    for (let f = 0; f < nf; f++) {
      const field = fields[f];
      let count = fixedCount(field);
      if (count === undefined) {
        if (p + 4 > buf.length) return -1;
        count = buf.readUInt32BE(p);
        p += 4;
      }
      const bytes = field.datatype === 'bit' ? Math.ceil(count / 8) : count * ELEMENT_BYTES[field.datatype];
      if (p + bytes > buf.length) return -1;
      starts[f] = p;
      counts[f] = count;
      p += bytes;
    }
    for (const w of wanted) {
      const f = w.field;
      const isNull = nulls !== undefined && (nulls[f >> 3] & (0x80 >> (f & 7))) !== 0;
      if (w.numbers) w.numbers.push(isNull || counts[f] === 0 ? Number.NaN : binaryNumber(fields[f], buf, starts[f]));
      if (w.texts) w.texts.push(isNull || counts[f] === 0 ? '' : binaryText(fields[f], buf, starts[f], counts[f]));
    }
    return p;
  }
  let rowStarts = new Int32Array(0);
  let rowCounts = new Int32Array(0);

  const decoder = new TextDecoder('utf-8');
  try {
    for await (const chunk of openBytes(path)) {
      parser.write(decoder.decode(chunk, { stream: true }));
      if (finished) break;
    }
    if (!finished) {
      parser.write(decoder.decode());
      parser.close();
    }
  } catch (e) {
    fatal = e;
  }
  if (fatal) throw fatal;

  if (tableCount <= tableWanted) {
    if (status && status.value.toUpperCase() === 'ERROR') {
      throw new InputError('the archive returned an error instead of a table', {
        where: { file: path },
        found: status.text || '(no message)',
        hint: 'fix the query and download the result again',
      });
    }
    throw new InputError(tableCount === 0 ? 'the VOTable holds no TABLE' : `the VOTable has ${tableCount} TABLE(s), so there is no table ${tableWanted}`, {
      where: { file: path, key: tableCount === 0 ? undefined : 'catalogue.table' },
      hint: tableCount === 0 ? 'check that the query returned a table' : `set catalogue.table to a number from 0 to ${tableCount - 1}`,
    });
  }
  if (serialisation === undefined) {
    if (fields.length > 0) startData(); // report a missing column before reporting no rows
    throw new InputError('the VOTable table has no DATA: its fields are described but no rows follow', {
      where: where(),
      hint: 'check that the query returned stars',
    });
  }
  if (nRows === 0) {
    throw new InputError('the VOTable table has its fields but no rows', {
      where: where(),
      hint: 'check that the query returned stars',
    });
  }

  const lineOf = rowLines.view();
  const numbers = new Map<string, Float64Array>();
  const texts = new Map<string, string[]>();
  for (const w of wanted) {
    if (w.numbers) numbers.set(w.name, w.numbers.view());
    if (w.texts) texts.set(w.name, w.texts);
  }
  return {
    path,
    format: 'votable',
    detail: `TABLE ${tableWanted}, ${serialisation} serialisation`,
    nRows,
    names: fields.map((f) => f.name),
    units,
    numbers,
    texts,
    locate: (row, column) => (serialisation === 'TABLEDATA' && row < lineOf.length ? { file: path, line: lineOf[row], row: row + 1, field: column } : { file: path, row: row + 1, field: column }),
  };
}

function checkReadable(field: VoField, r: ColumnRequest, path: string): void {
  const where = { file: path, field: field.name, key: r.key };
  if (!(field.datatype in ELEMENT_BYTES)) {
    throw new InputError(`the FIELD "${field.name}" has an unknown datatype "${field.datatype}"`, {
      where,
      expected: 'a VOTable 1.4 datatype (boolean, unsignedByte, short, int, long, float, double, char, unicodeChar, ...)',
    });
  }
  if (r.kind === 'number' && TEXT_TYPES.has(field.datatype)) {
    throw new InputError(`the column "${field.name}" (${r.role}) holds text (datatype ${field.datatype}), not numbers`, {
      where,
      hint: 'map a numeric column',
    });
  }
  if (!isScalar(field) || field.datatype.endsWith('Complex')) {
    throw new InputError(`the column "${field.name}" (${r.role}) holds ${field.datatype.endsWith('Complex') ? 'complex numbers' : `arrays (arraysize="${field.arraysize}")`}; coeval needs one real value per row`, {
      where,
      hint: 'map a scalar column',
    });
  }
}

/**
 * VOTable FIELD descriptions and how one cell of each is decoded, in TABLEDATA text and in BINARY/BINARY2
 * bytes (IVOA VOTable 1.4, sections 2.1 and 5). Nulls: an empty TD; NaN for floating point; the VALUES
 * `null` attribute for integers; `?`, blank or NUL for booleans; in BINARY2, the null-flag bits that precede
 * each row (section 5.5).
 */
import { parseNumber } from './parseNumber.js';

export interface VoField {
  name: string;
  datatype: string;
  arraysize?: string;
  unit?: string;
  /** VALUES/@null: the integer (or text) that stands for "no value". */
  nullValue?: string;
}

/** Bytes per element in the binary serialisations (section 5.1, Table 1). `bit` is handled apart. */
export const ELEMENT_BYTES: Record<string, number> = {
  boolean: 1, bit: 0, unsignedByte: 1, short: 2, int: 4, long: 8, char: 1, unicodeChar: 2,
  float: 4, double: 8, floatComplex: 8, doubleComplex: 16,
};

export const INTEGER_TYPES = new Set(['unsignedByte', 'short', 'int', 'long']);
export const TEXT_TYPES = new Set(['char', 'unicodeChar']);

/** Fixed element count, or undefined when the size is variable (`*`, `10*`, `3x*`). */
export function fixedCount(field: VoField): number | undefined {
  const a = field.arraysize?.trim();
  if (a === undefined || a === '') return 1;
  if (a.endsWith('*')) return undefined;
  return a.split('x').reduce((p, d) => p * Number(d), 1);
}

/** Whether a cell holds a single value (what a catalogue column needs), strings aside. */
export function isScalar(field: VoField): boolean {
  if (TEXT_TYPES.has(field.datatype)) return true;
  return fixedCount(field) === 1;
}

function isNullToken(field: VoField, s: string): boolean {
  return field.nullValue !== undefined && s === field.nullValue.trim();
}

/** A TABLEDATA cell as a number (NaN = null); undefined when it is not a number. */
export function tdNumber(field: VoField, text: string): number | undefined {
  const s = text.trim();
  if (s === '' || isNullToken(field, s)) return Number.NaN;
  if (field.datatype === 'boolean') {
    const c = s[0];
    if (c === 'T' || c === 't' || c === '1') return 1;
    if (c === 'F' || c === 'f' || c === '0') return 0;
    if (c === '?') return Number.NaN;
    return undefined;
  }
  if (INTEGER_TYPES.has(field.datatype) && /^[+-]?0[xX][0-9a-fA-F]+$/.test(s)) {
    // Hexadecimal integers are allowed in TABLEDATA (section 6).
    const neg = s.startsWith('-');
    const v = Number(BigInt(s.replace(/^[+-]/, '')));
    return neg ? -v : v;
  }
  return parseNumber(s);
}

/** A TABLEDATA cell as text ('' = null). */
export function tdText(field: VoField, text: string): string {
  const s = field.datatype === 'char' || field.datatype === 'unicodeChar' ? text.replace(/\s+$/, '') : text.trim();
  if (field.datatype !== 'char' && field.datatype !== 'unicodeChar' && isNullToken(field, s)) return '';
  return s;
}

/** Decodes one binary cell; `at` is its first byte (after any length prefix), `count` its element count. */
export function binaryNumber(field: VoField, buf: Buffer, at: number): number {
  switch (field.datatype) {
    case 'double':
      return buf.readDoubleBE(at);
    case 'float':
      return buf.readFloatBE(at);
    case 'boolean': {
      const c = buf[at];
      return c === 0x54 || c === 0x74 || c === 0x31 ? 1 : c === 0x46 || c === 0x66 || c === 0x30 ? 0 : Number.NaN;
    }
    case 'unsignedByte':
      return nullCheck(field, buf[at]);
    case 'short':
      return nullCheck(field, buf.readInt16BE(at));
    case 'int':
      return nullCheck(field, buf.readInt32BE(at));
    case 'long': {
      const v = buf.readBigInt64BE(at);
      return field.nullValue !== undefined && v === BigInt(field.nullValue.trim()) ? Number.NaN : Number(v);
    }
    case 'bit':
      // Bits are packed from the most significant bit, and padding bits shall be 0 (section 2.1), so for a
      // single bit any non-zero byte means 1. Reading it so also accepts astropy's writer (at least 5.2),
      // which stores a true scalar bit as 0x08.
      return buf[at] !== 0 ? 1 : 0;
    default:
      return Number.NaN;
  }
}

function nullCheck(field: VoField, v: number): number {
  return field.nullValue !== undefined && v === Number(field.nullValue) ? Number.NaN : v;
}

export function binaryText(field: VoField, buf: Buffer, at: number, count: number): string {
  if (field.datatype === 'char') {
    let end = at + count;
    const nul = buf.indexOf(0, at);
    if (nul >= 0 && nul < end) end = nul;
    return buf.toString('utf8', at, end).replace(/\s+$/, '');
  }
  if (field.datatype === 'unicodeChar') {
    const bytes = Buffer.from(buf.subarray(at, at + 2 * count));
    bytes.swap16(); // UCS-2 big-endian on the wire
    return bytes.toString('utf16le').replace(/[\s\0]+$/, '');
  }
  if (field.datatype === 'long') {
    const v = buf.readBigInt64BE(at);
    return field.nullValue !== undefined && v === BigInt(field.nullValue.trim()) ? '' : String(v);
  }
  const v = binaryNumber(field, buf, at);
  if (Number.isNaN(v)) return '';
  return field.datatype === 'boolean' ? (v === 1 ? 'T' : 'F') : String(v);
}

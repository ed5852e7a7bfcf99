/**
 * Text to number for table cells (catalogues and isochrone grids). Returns NaN for the spellings of "no value" that archives and
 * table writers use (empty, NaN, null, --, N/A, ...), 1/0 for true/false (flag columns), and undefined when
 * the text is not a number at all, so the caller can say where.
 *
 * `Number()` does the conversion (correctly rounded), after refusing the forms it accepts that a catalogue
 * never means: hexadecimal/binary/octal prefixes. A Fortran `D` exponent (`1.5D+03`, common in older
 * ASCII tables) is read as `E`.
 */
const MISSING = new Set(['', 'nan', '+nan', '-nan', 'null', 'none', '--', '---', 'n/a', 'na', '?', 'masked']);

export function parseNumber(raw: string): number | undefined {
  const s = raw.trim();
  if (s.length === 0) return Number.NaN;
  const c = s.charCodeAt(0);
  // Fast path: a plain decimal number (the overwhelming case).
  if ((c >= 48 && c <= 57) || c === 45 || c === 43 || c === 46) {
    const v = Number(s);
    if (!Number.isNaN(v) && !/^[+-]?0[xXbBoO]/.test(s)) return v;
  }
  const lower = s.toLowerCase();
  if (MISSING.has(lower)) return Number.NaN;
  // Whole words only: a single T or F is as likely a column named t or f.
  if (lower === 'true') return 1;
  if (lower === 'false') return 0;
  if (lower === 'inf' || lower === '+inf' || lower === 'infinity' || lower === '+infinity') return Number.POSITIVE_INFINITY;
  if (lower === '-inf' || lower === '-infinity') return Number.NEGATIVE_INFINITY;
  if (/^[+-]?(\d+\.?\d*|\.\d+)[dD][+-]?\d+$/.test(s)) return Number(s.replace(/[dD]/, 'e'));
  return undefined;
}

/** Why a cell did not parse, when a likely cause can be named. */
export function numberHint(raw: string): string | undefined {
  const s = raw.trim();
  if (/^[+-]?\d+,\d+$/.test(s)) return 'this looks like a decimal comma; coeval needs a decimal point (convert the file, or export it with "." as the decimal separator)';
  if (/^[+-]?0[xXbBoO]/.test(s)) return 'hexadecimal/binary/octal numbers are not read as catalogue values';
  if (/[;,\t|]/.test(s)) return 'the cell contains a delimiter character: the delimiter may be wrong (set catalogue.delimiter)';
  return undefined;
}

import { InputError } from '../core/errors.js';
import { parseNumber } from './parseNumber.js';
import { RecordScanner, type Separator } from './recordScanner.js';

/** Delimiters tried, in order of preference when several fit. */
const CANDIDATES: readonly Separator[] = [0x2c, 0x09, 0x3b, 0x7c, 'whitespace'];
const SAMPLE_RECORDS = 30;

export function separatorName(sep: Separator): string {
  switch (sep) {
    case 'whitespace':
      return 'whitespace-aligned';
    case 0x2c:
      return 'comma-separated';
    case 0x09:
      return 'tab-separated';
    case 0x3b:
      return 'semicolon-separated';
    case 0x7c:
      return 'bar-separated';
    default:
      return `separated by ${JSON.stringify(String.fromCharCode(sep))}`;
  }
}

function separatorSetting(sep: Separator): string {
  return sep === 'whitespace' ? '" "' : JSON.stringify(String.fromCharCode(sep));
}

/** The separator a config asks for: `catalogue.delimiter` first, then an explicit text format. */
export function requestedSeparator(delimiter: string | undefined, textFormat: 'csv' | 'tsv' | 'whitespace' | undefined): { sep: Separator; from: string } | undefined {
  if (delimiter !== undefined) {
    const d = delimiter === '\\t' ? '\t' : delimiter;
    if (/^ +$/.test(d)) return { sep: 'whitespace', from: `catalogue.delimiter = ${JSON.stringify(delimiter)}` };
    return { sep: d.charCodeAt(0), from: `catalogue.delimiter = ${JSON.stringify(delimiter)}` };
  }
  if (textFormat === 'csv') return { sep: 0x2c, from: 'catalogue.format = "csv"' };
  if (textFormat === 'tsv') return { sep: 0x09, from: 'catalogue.format = "tsv"' };
  if (textFormat === 'whitespace') return { sep: 'whitespace', from: 'catalogue.format = "whitespace"' };
  return undefined;
}

export interface Layout {
  sep: Separator;
  /** Whether the first non-comment line names the columns. */
  header: boolean;
}

interface Sample {
  counts: number[];
  first: string[];
  second?: string[];
  firstLine: number;
}

function sample(prefix: Buffer, whole: boolean, sep: Separator, comment: string): Sample {
  const sc = new RecordScanner(sep, comment);
  sc.push(prefix);
  const counts: number[] = [];
  let first: string[] = [];
  let second: string[] | undefined;
  let firstLine = 1;
  while (counts.length < SAMPLE_RECORDS && sc.next(whole)) {
    const fields = Array.from({ length: sc.nFields }, (_, f) => sc.text(f));
    if (counts.length === 0) {
      first = fields;
      firstLine = sc.recordLine;
    } else if (counts.length === 1) second = fields;
    counts.push(sc.nFields);
  }
  return { counts, first, second, firstLine };
}

/** A separator fits when it splits the first line into 2+ fields and every sampled line alike. */
function fits(s: Sample): boolean {
  if (s.counts.length === 0 || s.counts[0] < 2) return false;
  return s.counts.every((c) => c === s.counts[0]);
}

/**
 * Decide the separator and whether there is a header line, from the first part of the file. With a
 * requested separator that leaves the header as one field while another separator splits every sampled
 * line alike, the request is wrong: say so rather than report a missing column later.
 */
export function detectLayout(
  prefix: Buffer,
  whole: boolean,
  opts: { comment: string; requested?: { sep: Separator; from: string }; header?: boolean; file: string },
): Layout {
  let sep: Separator;
  let chosen: Sample;
  if (opts.requested) {
    sep = opts.requested.sep;
    chosen = sample(prefix, whole, sep, opts.comment);
    if (chosen.counts.length > 0 && chosen.counts[0] < 2) {
      for (const other of CANDIDATES) {
        if (other === sep) continue;
        const s = sample(prefix, whole, other, opts.comment);
        if (fits(s)) {
          throw new InputError(`with the delimiter from ${opts.requested.from}, the first line is a single column, but the file looks ${separatorName(other)}`, {
            where: { file: opts.file, line: chosen.firstLine, column: 1 },
            found: truncate(chosen.first[0] ?? ''),
            expected: `${separatorName(sep)} fields`,
            hint: `set catalogue.delimiter = ${separatorSetting(other)}, or remove the setting to let coeval detect it`,
          });
        }
      }
    }
  } else {
    const samples = CANDIDATES.map((c) => ({ sep: c, s: sample(prefix, whole, c, opts.comment) }));
    const fit = samples.find((x) => fits(x.s));
    // Nothing splits every line alike (a ragged file): take the one that splits the first line most, and
    // let the reader report the first line that disagrees.
    const pick = fit ?? samples.reduce((a, b) => ((b.s.counts[0] ?? 0) > (a.s.counts[0] ?? 0) ? b : a));
    sep = pick.sep;
    chosen = pick.s;
  }
  const header = opts.header ?? looksLikeHeader(chosen.first, chosen.second);
  return { sep, header };
}

/**
 * A first line is a header when all its cells are text, or when some column that holds a number on the
 * second line holds text on the first; with no second line, when any of its cells is text.
 */
function looksLikeHeader(first: string[], second: string[] | undefined): boolean {
  const isText = (s: string): boolean => s.trim() !== '' && parseNumber(s) === undefined;
  // A first line of names only is a header: a catalogue without numbers on its first data line is implausible.
  if (first.every(isText)) return true;
  if (!second) return first.some(isText);
  for (let j = 0; j < first.length; j++) {
    const b = second[j];
    if (isText(first[j]) && b !== undefined && Number.isFinite(parseNumber(b) ?? Number.NaN)) return true;
  }
  return false;
}

function truncate(s: string): string {
  return s.length > 120 ? `${s.slice(0, 117)}...` : s;
}

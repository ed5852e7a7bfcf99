/**
 * A table as CSV (RFC 4180): a header line of column names, comma-separated values, fields with commas or
 * quotes quoted. Notes go first as `#` comment lines (the readers skip them). NaN is an empty field.
 */
import { AtomicFileStream } from './streamFile.js';
import type { OutputColumn, OutputTable } from './outputTable.js';

const ROWS_PER_CHUNK = 20000;

function quote(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function cell(c: OutputColumn, i: number): string {
  const v = c.values[i];
  if (typeof v === 'string') return quote(v);
  if (Number.isNaN(v)) return '';
  return c.decimals !== undefined && !Number.isInteger(v) ? v.toFixed(c.decimals) : String(v);
}

export function writeCsvTable(path: string, t: OutputTable): void {
  const out = new AtomicFileStream(path);
  try {
    const head: string[] = t.notes.map(([k, v]) => `# ${k}: ${v.replace(/\n/g, ' ')}`);
    const described = t.columns.filter((c) => c.unit || c.description);
    if (described.length > 0) {
      head.push('# columns:');
      for (const c of described) head.push(`#   ${c.name}${c.unit ? ` [${c.unit}]` : ''}${c.description ? `: ${c.description}` : ''}`);
    }
    head.push(t.columns.map((c) => quote(c.name)).join(','));
    out.write(`${head.join('\n')}\n`);
    for (let start = 0; start < t.nRows; start += ROWS_PER_CHUNK) {
      const end = Math.min(t.nRows, start + ROWS_PER_CHUNK);
      const lines: string[] = [];
      for (let i = start; i < end; i++) lines.push(t.columns.map((c) => cell(c, i)).join(','));
      out.write(`${lines.join('\n')}\n`);
    }
    out.commit();
  } catch (err) {
    out.abort();
    throw err;
  }
}

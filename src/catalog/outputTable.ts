/**
 * A table to write (a simulated catalogue, per-star results): named columns of doubles, 32-bit integers or
 * text, with units and descriptions, and key/value notes that each format keeps in its own way (CSV `#`
 * lines, Arrow schema metadata, FITS COMMENT cards). NaN in a double column means "no value".
 */
import { extname } from 'node:path';
import { UsageError } from '../core/errors.js';

export interface OutputColumn {
  name: string;
  unit?: string;
  description?: string;
  values: Float64Array | Int32Array | readonly string[];
  /** CSV only: decimals to print for doubles (default: shortest exact form). */
  decimals?: number;
}

export interface OutputTable {
  nRows: number;
  columns: OutputColumn[];
  /** Notes on where the table came from, in order. */
  notes: [string, string][];
}

export type OutputFormat = 'csv' | 'arrow' | 'fits';

/** The format for a file name: .csv, .arrow / .arrows / .feather, .fits / .fit / .fts. */
export function outputFormatFor(path: string, format: OutputFormat | 'auto' = 'auto'): OutputFormat {
  if (format !== 'auto') return format;
  const ext = extname(path).toLowerCase();
  if (ext === '.csv') return 'csv';
  if (ext === '.arrow' || ext === '.feather' || ext === '.arrows') return 'arrow';
  if (ext === '.fits' || ext === '.fit' || ext === '.fts') return 'fits';
  throw new UsageError(`cannot tell the output format from the file name "${path}"`, {
    expected: 'a name ending in .csv, .arrow or .fits, or an explicit format',
    hint: 'rename the output, or set the format (csv, arrow, fits)',
  });
}

export function checkTable(t: OutputTable): void {
  for (const c of t.columns) {
    if (c.values.length !== t.nRows) throw new RangeError(`column ${c.name} has ${c.values.length} values for ${t.nRows} rows`);
  }
  const names = new Set<string>();
  for (const c of t.columns) {
    if (names.has(c.name)) throw new RangeError(`column ${c.name} appears twice`);
    names.add(c.name);
  }
}

/** Write the table in the given format (atomically: a temporary file renamed into place). */
export async function writeOutputTable(path: string, table: OutputTable, format: OutputFormat): Promise<void> {
  checkTable(table);
  switch (format) {
    case 'csv': {
      const { writeCsvTable } = await import('./writeCsvTable.js');
      return writeCsvTable(path, table);
    }
    case 'arrow': {
      const { writeArrowTable } = await import('./writeArrowTable.js');
      return writeArrowTable(path, table);
    }
    case 'fits': {
      const { writeFitsTable } = await import('./writeFitsTable.js');
      return writeFitsTable(path, table);
    }
  }
}

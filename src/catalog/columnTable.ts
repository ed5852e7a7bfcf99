import type { Location } from '../core/errors.js';
import type { CatalogFormat } from './types.js';

/**
 * How a column is wanted: `number` for magnitudes, errors, parallaxes and numeric cuts (NaN = missing);
 * `text` for identifiers and text cuts. An int64 column asked for as text keeps every digit.
 */
export type ColumnKind = 'number' | 'text';

export interface ColumnRequest {
  name: string;
  kind: ColumnKind;
  /** Why it is wanted, in words (`band V magnitude`), for messages. */
  role: string;
  /** Config key that named it (`photometry.V.mag`), for messages. */
  key: string;
}

/** What a reader is asked for: the columns to materialise, plus format options from the config. */
export interface TableRequest {
  columns: ColumnRequest[];
  /** FITS: HDU index (0 = primary). */
  hdu?: number;
  /** VOTable: 0-based index of the TABLE element in document order. */
  table?: number;
  /** Text tables: field delimiter; undefined = detect. */
  delimiter?: string;
  /** Text tables: comment prefix. */
  comment: string;
  /** Text tables: whether the first line names the columns; undefined = detect. */
  header?: boolean;
  /** The format the config asked for (`auto` resolved by the caller), for text tables. */
  textFormat?: 'csv' | 'tsv' | 'whitespace';
}

/**
 * One table as a reader delivers it: the names of all its columns, and the requested columns only, so that
 * a wide archive table costs memory only for what the fit uses.
 */
export interface ColumnTable {
  path: string;
  format: CatalogFormat;
  /** FITS HDU, or VOTable table index, that was read. */
  hdu?: number;
  /** Words for the summary, e.g. `comma-separated, header on line 3`. */
  detail?: string;
  nRows: number;
  /** Every column in the file, in file order. */
  names: string[];
  /** Units where the format records them (FITS TUNIT, ECSV unit, VOTable unit). */
  units: Map<string, string>;
  numbers: Map<string, Float64Array>;
  texts: Map<string, string[]>;
  /** Where data row `row` (0-based) of `column` is in the file, for messages. */
  locate(row: number, column: string): Location;
}

/**
 * A source table of an isochrone grid, as read: the requested columns, where each row is (line, or row for
 * Arrow), and the blocks that comment lines split the rows into, with the comments before each block.
 */
export interface RawGridTable {
  path: string;
  kind: 'text' | 'arrow';
  /** Every column name, in file order. */
  names: string[];
  nRows: number;
  numbers: Map<string, Float64Array>;
  texts: Map<string, string[]>;
  /** Line (text, 1-based) or row (Arrow, 1-based) of each row. */
  line: Int32Array;
  /** Block index of each row (0-based, rising). */
  block: Int32Array;
  /** The comment lines (prefix removed, trimmed) met before each block's first row, since the previous block. */
  blockComments: string[][];
  /** How the table was read, in words. */
  detail: string;
}

/** What to read from a source table. */
export interface RawTableRequest {
  numbers: string[];
  texts: string[];
  /** Comment prefix of text tables. */
  comment: string;
  /** Field delimiter of text tables: one character, or undefined for runs of blanks. */
  delimiter?: string;
  /** Config key that names each column, for messages. */
  keyOf(column: string): string;
}

import type { BandId } from '../core/bands.js';

/** File formats a catalogue can arrive in. */
export type CatalogFormat = 'csv' | 'tsv' | 'whitespace' | 'ecsv' | 'fits' | 'votable' | 'arrow' | 'parquet';

/** How many stars one filter removed, and why, for the check summary. */
export interface FilterReport {
  /** In words, e.g. `p_mem >= 0.5` or `V: magnitude missing`. */
  rule: string;
  dropped: number;
}

/**
 * A star catalogue after reading, column mapping and filtering: one Float64Array per quantity, NaN where
 * a value is missing. Arrays are views on SharedArrayBuffers, so worker threads can read them without a
 * copy. Band order follows the config. Magnitudes are apparent; errors are 1-sigma, in magnitudes.
 */
export interface Catalog {
  /** Where it came from, for messages and manifests. */
  source: {
    path: string;
    format: CatalogFormat;
    hdu?: number;
    rowsRead: number;
    /** How the reader took it, in words (`comma-separated, header on line 3`, `binary table in HDU 1`). */
    detail?: string;
  };
  nStars: number;
  bands: BandId[];
  /** mag[b][i]: star i's magnitude in bands[b]; NaN when missing. */
  mag: Float64Array[];
  /** err[b][i]: its 1-sigma error; NaN exactly where mag is NaN. */
  err: Float64Array[];
  /** Star identifiers as text (Gaia source_id does not fit a double exactly). */
  id?: string[];
  /** Prior membership probability in [0, 1]. */
  membership?: Float64Array;
  /** Parallax and its error, in mas. */
  parallaxMas?: Float64Array;
  parallaxErrorMas?: Float64Array;
  /** What each filter removed, in the order applied. */
  filters: FilterReport[];
}

/** A Float64Array of length n on shared memory, filled with `fill`. */
export function sharedFloat64(n: number, fill = Number.NaN): Float64Array {
  const a = new Float64Array(new SharedArrayBuffer(n * Float64Array.BYTES_PER_ELEMENT));
  if (fill !== 0) a.fill(fill);
  return a;
}

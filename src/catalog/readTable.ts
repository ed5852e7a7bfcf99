import type { ColumnTable, TableRequest } from './columnTable.js';
import type { CatalogFormat } from './types.js';

/**
 * Read the requested columns of a table in a known format. Each reader is loaded on first use, so that
 * reading a CSV never loads the Arrow or Parquet libraries.
 */
export async function readTable(path: string, format: CatalogFormat, req: TableRequest): Promise<ColumnTable> {
  switch (format) {
    case 'csv':
    case 'tsv':
    case 'whitespace':
      return (await import('./readDelimited.js')).readDelimited(path, req);
    case 'ecsv':
      return (await import('./readEcsv.js')).readEcsv(path, req);
    case 'fits':
      return (await import('./readFits.js')).readFits(path, req);
    case 'votable':
      return (await import('./readVotable.js')).readVotable(path, req);
    case 'arrow':
      return (await import('./readArrow.js')).readArrow(path, req);
    case 'parquet':
      return (await import('./readParquet.js')).readParquet(path, req);
  }
}

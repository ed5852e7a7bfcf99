export { sharedFloat64, type Catalog, type CatalogFormat, type FilterReport } from './types.js';
export type { ColumnKind, ColumnRequest, ColumnTable, TableRequest } from './columnTable.js';
export { buildCatalog, describeCut, MAG_PER_RELATIVE_FLUX } from './buildCatalog.js';
export { catalogRequests } from './catalogRequests.js';
export { detectFormat } from './detectFormat.js';
export { readCatalog, readConfiguredCatalog, type CatalogSpec } from './readCatalog.js';
export { readTable } from './readTable.js';
export { outputFormatFor, writeOutputTable, type OutputColumn, type OutputFormat, type OutputTable } from './outputTable.js';

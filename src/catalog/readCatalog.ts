import { resolveConfigPath, type CatalogueConfig, type LoadedConfig, type PhotometryConfig } from '../config/index.js';
import { requireFile } from '../core/files.js';
import { buildCatalog } from './buildCatalog.js';
import { catalogRequests } from './catalogRequests.js';
import { detectFormat } from './detectFormat.js';
import { readTable } from './readTable.js';
import type { Catalog } from './types.js';

export interface CatalogSpec {
  /** The catalogue file (absolute, or relative to the working directory). */
  path: string;
  catalogue: CatalogueConfig;
  photometry: PhotometryConfig;
}

/**
 * Read a catalogue as a config describes it: detect the format, read only the mapped columns, and build
 * the Catalog (sentinels, flux conversion, cuts, checks). Every problem is a located InputError.
 */
export async function readCatalog(spec: CatalogSpec): Promise<Catalog> {
  const { path, catalogue } = spec;
  requireFile(path, 'catalogue file');
  const format = detectFormat(path, catalogue.format);
  const explicitText = catalogue.format === 'csv' || catalogue.format === 'tsv' || catalogue.format === 'whitespace' ? catalogue.format : undefined;
  const table = await readTable(path, format, {
    columns: catalogRequests(catalogue, spec.photometry),
    hdu: catalogue.hdu,
    table: catalogue.table,
    delimiter: catalogue.delimiter,
    comment: catalogue.comment,
    header: catalogue.header,
    textFormat: explicitText,
  });
  const catalog = buildCatalog(table, catalogue, spec.photometry);
  if (table.detail !== undefined) catalog.source.detail = table.detail;
  return catalog;
}

/** Read the catalogue a loaded config names, resolving its path against the config file's folder. */
export function readConfiguredCatalog(loaded: LoadedConfig): Promise<Catalog> {
  const { catalogue, photometry } = loaded.config;
  return readCatalog({ path: resolveConfigPath(loaded, catalogue.path), catalogue, photometry });
}

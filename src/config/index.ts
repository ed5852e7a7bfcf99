export { configSchema, type CoevalConfig } from './schema.js';
export { loadConfig, parseConfigText, resolveConfigPath, runDirectory, type LoadedConfig, type LoadOptions } from './load.js';
export { configuredBands, type BandColumns, type PhotometryConfig } from './sections/photometry.js';
export { CATALOGUE_FORMATS, type CatalogueConfig, type CutConfig } from './sections/catalogue.js';
export type { OutputConfig } from './sections/output.js';
export { likelihoodSection, type LikelihoodConfig } from './sections/likelihood.js';

export { configSchema, type CoevalConfig } from './schema.js';
export { loadConfig, loadGridMap, loadSimulationConfig, parseConfigText, parseSimulationConfigText, resolveConfigPath, runDirectory, type LoadedConfig, type LoadedSimulationConfig, type LoadOptions } from './load.js';
export { simulateSection, simulationConfigSchema, SIMULATION_FORMATS, type SimulateConfig, type SimulationConfig } from './sections/simulate.js';
export { configuredBands, type BandColumns, type PhotometryConfig } from './sections/photometry.js';
export { CATALOGUE_FORMATS, type CatalogueConfig, type CutConfig } from './sections/catalogue.js';
export type { OutputConfig } from './sections/output.js';
export { likelihoodSection, type LikelihoodConfig } from './sections/likelihood.js';
export { GRID_PHASE_NAMES, gridSection, type GridConfig } from './sections/grid.js';
export { locateKey } from './locateKey.js';

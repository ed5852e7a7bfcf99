/** The coeval library: what the CLI uses, for scripts and notebooks. Re-exports only. */
export * from './core/errors.js';
export { BANDS, BAND_IDS, isBandId, type BandId, type BandInfo } from './core/bands.js';
export { quantileSorted } from './core/quantile.js';
export * from './config/index.js';
export * from './catalog/index.js';
export * from './pipeline/index.js';
export * from './stellar/grid/index.js';
export * from './likelihood/index.js';

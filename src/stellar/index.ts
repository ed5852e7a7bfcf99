/** The stellar stage's public names: model types, the built-in model, photometry, extinction. */
export * from './types.js';
export { isochrone, builtinModel, LOG_AGE_RANGE, builtinProvenance, builtinCaveats, type IsochroneOptions, type BuiltinModelOptions } from './isochrone/index.js';
export { fehToZ, zToFeh, metallicityMH, MODEL_SOLAR_Z, evolveStar, DEFAULT_REIMERS_ETA } from './evolution/index.js';
export { builtinPhotometry, PHOTOMETRY_BANDS, PHOTOMETRY_CAVEATS, PHOTOMETRY_PROVENANCE, M_BOL_SUN } from './photometry/index.js';
export { extinctionModel, extinctionCurve, ccm89, odonnell94, fitzpatrick99, EXTINCTION_LAWS, LAW_CITATIONS, RV_RANGE, type ExtinctionLaw, type ExtinctionOptions, type BuiltinExtinctionModel } from './extinction/index.js';
export { GridSource, loadGridSource, importGrid, readGridArrow, writeGridArrow, buildGrid, type GridTable, type GridImportSpec } from './grid/index.js';

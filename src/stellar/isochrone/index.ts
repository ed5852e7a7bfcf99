export { isochrone, LOG_AGE_RANGE, type IsochroneOptions } from './isochrone.js';
export { builtinModel, type BuiltinModelOptions } from './builtinModel.js';
export { builtinProvenance, builtinCaveats, EVOLUTION_SOURCE } from './provenance.js';

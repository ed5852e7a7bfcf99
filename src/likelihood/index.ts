/** The mixture likelihood over the colour-magnitude diagram: public names. */
export { CmdLikelihood, type CatalogArrays, type EvaluationStatus, type Responsibilities } from './cmdLikelihood.js';
export { DEFAULT_LIKELIHOOD_OPTIONS, withDefaults, type BandLimits, type FieldOptions, type LikelihoodOptions, type ParallaxOptions } from './options.js';
export { THETA_INFO, THETA_NAMES, parallaxMasFromDm, thetaObject, thetaVector, type ClusterParameters } from './theta.js';
export { catalogArrays, createLikelihoodFromSpec, type LikelihoodSpec, type ModuleRef } from './spec.js';
export { COMPONENT_NAMES, simulateCatalog, type SimulatedCatalog, type SimulationSpec } from './simulate.js';
export { makeImf, type Imf, type ImfName } from './imf.js';

export type { Prior } from './prior.js';
export { uniformPrior } from './uniform.js';
export { normalPrior } from './normal.js';
export { truncatedNormalPrior } from './truncatedNormal.js';
export { logUniformPrior } from './logUniform.js';
export { ageGyrPrior } from './ageGyrPrior.js';
export { priorFromSpec, type PriorSpec } from './spec.js';
export { buildParameterSpace, type ParameterSpace, type ParameterSpaceOptions, type PriorSpecs } from './parameterSpace.js';

export { evolveStar, phaseEnds, type StarState, type EvolveOptions } from './star.js';
export { evolutionModel, clearEvolutionCache, massLimits, Z_RANGE, Z_MAX_ACCEPTED } from './model.js';
export { fehToZ, zToFeh, metallicityMH, MODEL_SOLAR_Z } from './metallicity.js';
export { DEFAULT_REIMERS_ETA, massLossRate } from './massLoss.js';
export type { EvolutionModel } from './types.js';

export { ccm89, odonnell94, CCM89_X_RANGE } from './cardelli1989.js';
export { fitzpatrick99, fitzpatrick1999Curve, F99_X_RANGE } from './fitzpatrick1999.js';
export { extinctionCurve, EXTINCTION_LAWS, LAW_CITATIONS, RV_RANGE, type ExtinctionLaw } from './laws.js';
export { gaiaExtinctionRatioCod, GAIA_COEFFICIENT_COLOUR_RANGE, type GaiaBand } from './gaiaCoefficients.js';
export { extinctionModel, extinctionWavenumber, type BuiltinExtinctionModel, type ExtinctionOptions } from './extinctionModel.js';

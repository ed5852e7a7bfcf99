/** Convergence diagnostics: pure functions over chains of draws (see chains.ts for the layout). */
export type { Chains } from './chains.js';
export { chainsFromBuffer, drawsPerChain, dropFirst, pool } from './chains.js';
export { CITATIONS, THRESHOLDS } from './citations.js';
export { autocovariance, meanAutocovariance, meanAutocorrelation } from './autocovariance.js';
export { autocorrTime, autocorrTimeSeries, type AutocorrTime, type AutocorrTimeOptions, type AutocorrTimePoint } from './autocorrTime.js';
export { splitChains } from './splitChains.js';
export { rankNormalize, averageRanks } from './rankNormalize.js';
export { normalQuantile } from './normalQuantile.js';
export { argsort, sortedCopy } from './radixSort.js';
export { fold } from './fold.js';
export { quantileSorted, sortedDraws, medianOf } from './quantile.js';
export { rhat, rhatBasic, rhatBulk, rhatFolded } from './rhat.js';
export { essBasic, essBulk, essTail, essMean, essQuantile } from './ess.js';
export { parameterDiagnostics, REPORTED_QUANTILES, type ParameterDiagnostics, type QuantileDiagnostics } from './parameterDiagnostics.js';
export { mcseMean, mcseQuantile, mcseQuantiles, mcseQuantileFromEss } from './mcse.js';

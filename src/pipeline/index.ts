export { catalogueStep, CHECK_STEPS, checkConfig, configStep, type CheckContext, type CheckReport, type CheckSection, type CheckStep } from './check.js';
export { summarizeCatalogue, type BandSummary, type CatalogueSummary } from './catalogueSummary.js';
export { formatCheckReport } from './formatCheckReport.js';
export { gridStep, type GridCheck } from './gridCheck.js';
export { gridImportSpec, gridSourceFromConfig, loadConfiguredGrid, stellarSetupFromConfig, type LoadedGrid } from './gridModel.js';
export { builtinSetup, type StellarSetup } from './stellarModel.js';
export { isochroneTable, isochroneCsv, PHASE_LABELS, type IsochroneTable } from './isochroneTable.js';

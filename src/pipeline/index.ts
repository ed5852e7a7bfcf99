export { catalogueStep, CHECK_STEPS, checkConfig, configStep, type CheckContext, type CheckReport, type CheckSection, type CheckStep } from './check.js';
export { summarizeCatalogue, type BandSummary, type CatalogueSummary } from './catalogueSummary.js';
export { formatCheckReport } from './formatCheckReport.js';

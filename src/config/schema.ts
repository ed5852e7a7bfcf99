import { z } from 'zod';
import { catalogueSection } from './sections/catalogue.js';
import { likelihoodSection } from './sections/likelihood.js';
import { gridSection } from './sections/grid.js';
import { modelSection } from './sections/model.js';
import { outputSection } from './sections/output.js';
import { photometrySection } from './sections/photometry.js';
import { samplerSection } from './sections/sampler.js';
import { priorsSection } from './sections/priors.js';

/**
 * The whole config: one key per section. To add a section (model, priors, sampler, ...), write
 * `sections/<name>.ts` exporting a strict zod object whose fields carry their defaults, then add one
 * line here. A section that users may omit entirely takes `.default({})` (or `.optional()`).
 * Unknown sections and keys are errors, with the nearest valid name suggested.
 */
export const configSchema = z.strictObject({
  catalogue: catalogueSection,
  photometry: photometrySection,
  output: outputSection.default({ overwrite: false }),
  sampler: samplerSection.prefault({}),
  priors: priorsSection.optional(),
  likelihood: likelihoodSection.prefault({}),
  grid: gridSection.optional(),
  model: modelSection.prefault({}),
});

export type CoevalConfig = z.infer<typeof configSchema>;

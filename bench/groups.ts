import { catalogBench } from './catalog.js';
import { chainsBench } from './chains.js';
import { gridsBench } from './grids.js';
import type { BenchGroup } from './harness.js';
import { likelihoodBench } from './likelihood.js';
import { photometryBench } from './photometry.js';
import { samplerBench } from './sampler.js';
import { startupBench } from './startup.js';
import { stellarBench } from './stellar.js';

/** Every benchmark group; `npm run bench <name>` runs one. Add new groups here. */
export const GROUPS: readonly BenchGroup[] = [startupBench, catalogBench, samplerBench, photometryBench, stellarBench, chainsBench, gridsBench, likelihoodBench];

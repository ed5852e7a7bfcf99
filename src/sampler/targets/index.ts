/**
 * Analytic targets for tests and benchmarks, and specs that let workers and child processes build them.
 */
import { compiledSibling } from '../compiledPath.js';
import type { LogDensitySpec } from '../logDensitySpec.js';

export { gaussianDensity, choleskyLower, identity, type GaussianArgs } from './gaussian.js';
export { rosenbrockDensity } from './rosenbrock.js';
export { bimodalDensity, type BimodalArgs } from './bimodal.js';
export { faultyDensity } from './faulty.js';
export { costlyDensity } from './costly.js';

const FILES = {
  gaussianDensity: 'gaussian.js',
  rosenbrockDensity: 'rosenbrock.js',
  bimodalDensity: 'bimodal.js',
  faultyDensity: 'faulty.js',
  costlyDensity: 'costly.js',
} as const;

/** A worker-loadable spec for one of the analytic targets. */
export function targetSpec(name: keyof typeof FILES, args?: unknown): LogDensitySpec {
  return { modulePath: compiledSibling(import.meta.url, FILES[name]), exportName: name, args };
}

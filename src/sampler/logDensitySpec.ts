/**
 * How a log-density reaches a worker thread. Functions cannot be sent to workers, so the density is
 * described by a structured-cloneable spec, an ES module and the name of a factory it exports, plus the
 * factory's argument, and each worker builds its own copy. Typed arrays in `args` backed by a
 * SharedArrayBuffer are shared with the workers, not copied (this is how a large catalogue can be read once).
 */
import { isAbsolute } from 'node:path';
import { pathToFileURL } from 'node:url';
import { SamplingError } from '../core/errors.js';
import type { LogDensity } from './types.js';

export interface LogDensitySpec {
  /** Absolute path (or file: URL) of a compiled ES module. */
  modulePath: string;
  /** The export to call: a `LogDensityFactory`. */
  exportName: string;
  /** The factory's argument; must survive structured cloning. */
  args?: unknown;
}

/** Builds a log-density from its argument. May be async (e.g. to read a file once per worker). */
export type LogDensityFactory<A = unknown> = (args: A) => LogDensity | Promise<LogDensity>;

/** Import the module of `spec` and call its factory. */
export async function loadLogDensity(spec: LogDensitySpec): Promise<LogDensity> {
  const url = spec.modulePath.startsWith('file:') ? spec.modulePath : isAbsolute(spec.modulePath) ? pathToFileURL(spec.modulePath).href : undefined;
  if (url === undefined) {
    throw new SamplingError(`the log-density module path must be absolute, got "${spec.modulePath}"`, {
      hint: 'resolve the path before building the spec (workers do not share the caller\'s working directory assumptions)',
    });
  }
  let mod: Record<string, unknown>;
  try {
    mod = (await import(url)) as Record<string, unknown>;
  } catch (err) {
    throw new SamplingError(`could not load the log-density module ${spec.modulePath}: ${(err as Error).message}`, {
      cause: err,
      hint: 'check the path; a TypeScript module must be compiled first (npm run build)',
    });
  }
  const factory = mod[spec.exportName];
  if (typeof factory !== 'function') {
    throw new SamplingError(`the module ${spec.modulePath} has no function export "${spec.exportName}"`, {
      found: Object.keys(mod),
      expected: 'the name of an exported factory (args) => LogDensity',
    });
  }
  const density = (await (factory as LogDensityFactory)(spec.args)) as LogDensity;
  if (!density || typeof density.evaluate !== 'function' || !Number.isInteger(density.ndim) || density.ndim < 1 || !Array.isArray(density.blobNames)) {
    throw new SamplingError(`the factory ${spec.exportName} of ${spec.modulePath} did not return a LogDensity`, {
      expected: '{ ndim: positive integer, blobNames: string[], evaluate(theta, blobsOut): number }',
    });
  }
  return density;
}

/**
 * Building the likelihood from plain, structured-cloneable data, so that each worker thread can construct
 * its own copy: the catalogue's typed arrays (views on SharedArrayBuffers are shared, not copied, by
 * postMessage), the options, and references to the factories that make the isochrone source and the
 * extinction model (a module path, an export name and plain arguments, resolved with a dynamic import in the
 * worker; the same `{ modulePath, exportName, args }` shape the sampler uses for its log-density).
 */
import type { Catalog } from '../catalog/types.js';
import { ModelError } from '../core/errors.js';
import type { ExtinctionModel, IsochroneSource } from '../stellar/types.js';
import { CmdLikelihood, type CatalogArrays } from './cmdLikelihood.js';
import type { LikelihoodOptions } from './options.js';

export interface ModuleRef {
  /** An absolute path or file URL of an ES module. */
  modulePath: string;
  exportName: string;
  /** Plain data passed to the export when it is a function; ignored when the export is the object itself. */
  args?: unknown[];
}

export interface LikelihoodSpec {
  catalog: CatalogArrays;
  options: Partial<LikelihoodOptions>;
  isochrones: ModuleRef;
  extinction: ModuleRef;
}

/** The numeric arrays of a catalogue, without ids or file details (which need not travel to workers). */
export function catalogArrays(c: Catalog): CatalogArrays {
  return { bands: [...c.bands], nStars: c.nStars, mag: c.mag, err: c.err, membership: c.membership, parallaxMas: c.parallaxMas, parallaxErrorMas: c.parallaxErrorMas };
}

async function resolveRef<T>(ref: ModuleRef, what: string): Promise<T> {
  const mod = (await import(ref.modulePath)) as Record<string, unknown>;
  const x = mod[ref.exportName];
  if (x === undefined) throw new ModelError(`module ${ref.modulePath} has no export "${ref.exportName}" for the ${what}`);
  // A factory function is called with the arguments (awaited if async); anything else is used as it is.
  return (typeof x === 'function' ? await (x as (...a: unknown[]) => unknown)(...(ref.args ?? [])) : x) as T;
}

/** Construct the likelihood from a spec (in any thread). */
export async function createLikelihoodFromSpec(spec: LikelihoodSpec): Promise<CmdLikelihood> {
  const source = await resolveRef<IsochroneSource>(spec.isochrones, 'isochrone source');
  const extinction = await resolveRef<ExtinctionModel>(spec.extinction, 'extinction model');
  return new CmdLikelihood(spec.catalog, source, extinction, spec.options);
}

/** The catalogue arrays restricted to the stars at `rows` (indices in increasing order). */
export function selectStars(c: CatalogArrays, rows: Int32Array): CatalogArrays {
  const pick = (a: Float64Array): Float64Array => Float64Array.from(rows, (i) => a[i]);
  return {
    bands: [...c.bands],
    nStars: rows.length,
    mag: c.mag.map(pick),
    err: c.err.map(pick),
    membership: c.membership && pick(c.membership),
    parallaxMas: c.parallaxMas && pick(c.parallaxMas),
    parallaxErrorMas: c.parallaxErrorMas && pick(c.parallaxErrorMas),
  };
}

/**
 * The log-posterior of a fit, as a module that worker threads load (the sampler's `{ modulePath,
 * exportName, args }` spec): `createLogPosterior(args)` rebuilds the stellar model, the likelihood and the
 * priors from plain data (the catalogue's arrays on SharedArrayBuffers travel without a copy) and returns a
 * LogDensity over the sampled parameters, with blobs `log_prior` and `log_likelihood` (the chain files'
 * columns). A point outside the prior's support is -Infinity before any likelihood work.
 */
import type { GridConfig } from '../config/sections/grid.js';
import type { ModelConfig } from '../config/sections/model.js';
import { CLUSTER_PARAMETER_NAMES } from '../core/parameters.js';
import type { CatalogArrays } from '../likelihood/cmdLikelihood.js';
import type { CmdLikelihood } from '../likelihood/cmdLikelihood.js';
import type { LikelihoodOptions } from '../likelihood/options.js';
import { buildParameterSpace, type ParameterSpace, type PriorSpecs } from '../priors/index.js';
import type { LogDensity } from '../sampler/types.js';

export const POSTERIOR_BLOBS = ['log_prior', 'log_likelihood'] as const;

/** Everything a worker needs to build the posterior: plain, structured-cloneable data. */
export interface PosteriorArgs {
  catalog: CatalogArrays;
  likelihood: Partial<LikelihoodOptions>;
  model: ModelConfig;
  grid?: GridConfig;
  /** The folder a `[grid]` section's paths resolve against. */
  baseDir: string;
  priors: PriorSpecs;
  /** The catalogue gives membership probabilities (then f_field is not a parameter). */
  membershipGiven: boolean;
}

const F_FIELD = CLUSTER_PARAMETER_NAMES.indexOf('f_field');

/** The log-posterior over a parameter space, from a likelihood that is already built. */
export function logPosterior(likelihood: CmdLikelihood, space: ParameterSpace): LogDensity {
  const full = new Float64Array(CLUSTER_PARAMETER_NAMES.length);
  return {
    ndim: space.free.length,
    blobNames: POSTERIOR_BLOBS,
    evaluate(theta, blobsOut) {
      const lp = space.logPrior(theta);
      if (!(lp > -Infinity)) {
        blobsOut[0] = Number.isNaN(lp) ? Number.NaN : -Infinity;
        blobsOut[1] = Number.NaN;
        return Number.isNaN(lp) ? Number.NaN : -Infinity;
      }
      space.expand(theta, full);
      // With per-star memberships f_field is unused, but the likelihood checks that it is a fraction.
      if (Number.isNaN(full[F_FIELD])) full[F_FIELD] = 0;
      const ll = likelihood.evaluate(full);
      blobsOut[0] = lp;
      blobsOut[1] = ll;
      return lp + ll;
    },
  };
}

/** The stellar model, likelihood and parameter space of a fit, from its plain arguments. */
export async function buildPosteriorParts(args: PosteriorArgs): Promise<{ likelihood: CmdLikelihood; space: ParameterSpace }> {
  const { stellarSetupFromConfig } = await import('./gridModel.js');
  const { CmdLikelihood } = await import('../likelihood/cmdLikelihood.js');
  const setup = await stellarSetupFromConfig({ config: { model: args.model, grid: args.grid } as never, baseDir: args.baseDir, overrides: [] });
  const likelihood = new CmdLikelihood(args.catalog, setup.source, setup.extinction, args.likelihood);
  const space = buildParameterSpace(args.priors, { membershipGiven: args.membershipGiven });
  return { likelihood, space };
}

/** The factory worker threads call (LogDensityFactory). */
export async function createLogPosterior(args: PosteriorArgs): Promise<LogDensity> {
  const { likelihood, space } = await buildPosteriorParts(args);
  return logPosterior(likelihood, space);
}

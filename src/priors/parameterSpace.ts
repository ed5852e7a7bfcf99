import { ConfigError } from '../core/errors.js';
import { CLUSTER_PARAMETERS, CLUSTER_PARAMETER_NAMES, type ClusterParameterName, type ParameterInfo } from '../core/parameters.js';
import type { Prior } from './prior.js';
import { logAgePriorFromAgeGyr, priorFromSpec, type PriorSpec } from './spec.js';

/** Priors per parameter as the config gives them; the age may be given on log_age or on age_gyr. */
export type PriorSpecs = Partial<Record<ClusterParameterName | 'age_gyr', PriorSpec>>;

/**
 * The sampled ("free") parameters and the fixed ones. The sampler moves in the free parameters only;
 * the likelihood receives the full vector in the canonical order of CLUSTER_PARAMETER_NAMES.
 */
export interface ParameterSpace {
  /** Free parameters in sampling order (canonical order, fixed ones left out). */
  readonly free: readonly ParameterInfo[];
  readonly priors: readonly Prior[];
  /** Values of the fixed parameters. */
  readonly fixed: Readonly<Partial<Record<ClusterParameterName, number>>>;
  /** For each canonical parameter, its index among the free ones, or -1 when fixed. */
  readonly freeIndex: readonly number[];
  /** Sum of the free parameters' log prior densities. */
  logPrior(thetaFree: ArrayLike<number>): number;
  /** Fill the canonical full vector from the free values. */
  expand(thetaFree: ArrayLike<number>, full: Float64Array): Float64Array;
  /** Draw the free parameters from the prior with uniform numbers supplied by the caller. */
  drawFromPrior(uniform: () => number, out: Float64Array): Float64Array;
  /** Text per free parameter, e.g. `log_age ~ uniform(9.8, 10.2)`, and per fixed one. */
  describe(): string[];
}

export interface ParameterSpaceOptions {
  /** When the catalogue gives each star's membership probability, f_field is not a parameter. */
  membershipGiven?: boolean;
}

const REQUIRED: readonly ClusterParameterName[] = ['feh', 'dm', 'ebv'];

export function buildParameterSpace(specs: PriorSpecs | undefined, options: ParameterSpaceOptions = {}): ParameterSpace {
  if (!specs) {
    throw new ConfigError('the config has no [priors] section', {
      where: { key: 'priors' },
      expected: 'a prior for each of log_age (or age_gyr), feh, dm and ebv',
      hint: 'add e.g. [priors] log_age = { kind = "uniform", min = 9.8, max = 10.2 }',
    });
  }
  if (specs.log_age === undefined && specs.age_gyr === undefined) {
    throw new ConfigError('no prior for the age', { where: { key: 'priors.log_age' }, expected: 'log_age (log10 yr) or age_gyr (Gyr)' });
  }
  for (const name of REQUIRED) {
    if (specs[name] === undefined) {
      throw new ConfigError(`no prior for ${name}`, {
        where: { key: `priors.${name}` },
        expected: `a prior for ${CLUSTER_PARAMETERS[name].label}, or a fixed value`,
        hint: `add ${name} = { kind = "uniform", min = ..., max = ... } or ${name} = <value> to [priors]`,
      });
    }
  }

  const free: ParameterInfo[] = [];
  const priors: Prior[] = [];
  const fixed: Partial<Record<ClusterParameterName, number>> = {};
  const freeIndex: number[] = [];
  for (const name of CLUSTER_PARAMETER_NAMES) {
    if (name === 'f_field' && options.membershipGiven) {
      fixed.f_field = Number.NaN; // unused: each star's membership prior replaces it
      freeIndex.push(-1);
      continue;
    }
    const viaAge = name === 'log_age' && specs.age_gyr !== undefined;
    const spec = viaAge ? specs.age_gyr : specs[name];
    const key = `priors.${viaAge ? 'age_gyr' : name}`;
    if (spec === undefined) throw new ConfigError(`no prior for ${name}`, { where: { key } });
    if (spec.kind === 'fixed') {
      fixed[name] = viaAge ? Math.log10(spec.value) + 9 : spec.value;
      freeIndex.push(-1);
      continue;
    }
    freeIndex.push(free.length);
    free.push(CLUSTER_PARAMETERS[name]);
    priors.push(viaAge ? logAgePriorFromAgeGyr(spec, key) : priorFromSpec(spec, key));
  }
  if (free.length === 0) {
    throw new ConfigError('every parameter is fixed: there is nothing to fit', { where: { key: 'priors' }, hint: 'give at least one parameter a prior distribution' });
  }

  return {
    free,
    priors,
    fixed,
    freeIndex,
    logPrior(theta) {
      let s = 0;
      for (let j = 0; j < priors.length; j++) {
        s += priors[j].logDensity(theta[j]);
        if (s === -Infinity) return s;
      }
      return s;
    },
    expand(theta, full) {
      for (let i = 0; i < CLUSTER_PARAMETER_NAMES.length; i++) {
        const j = freeIndex[i];
        full[i] = j >= 0 ? theta[j] : (fixed[CLUSTER_PARAMETER_NAMES[i]] as number);
      }
      return full;
    },
    drawFromPrior(uniform, out) {
      for (let j = 0; j < priors.length; j++) out[j] = priors[j].fromUnit(uniform());
      return out;
    },
    describe() {
      const lines = free.map((p, j) => `${p.name} ~ ${priors[j].describe()}`);
      for (const [name, v] of Object.entries(fixed)) {
        lines.push(Number.isNaN(v) ? `${name}: replaced by per-star membership priors` : `${name} = ${v} (fixed)`);
      }
      return lines;
    },
  };
}

import { ConfigError } from '../core/errors.js';
import { ageGyrPrior } from './ageGyrPrior.js';
import { logUniformPrior } from './logUniform.js';
import { normalPrior } from './normal.js';
import type { Prior } from './prior.js';
import { truncatedNormalPrior } from './truncatedNormal.js';
import { uniformPrior } from './uniform.js';

/** A prior as written in a config (the `[priors]` section validates this shape). */
export type PriorSpec =
  | { kind: 'uniform'; min: number; max: number }
  | { kind: 'normal'; mean: number; sd: number }
  | { kind: 'truncated_normal'; mean: number; sd: number; min: number; max: number }
  | { kind: 'log_uniform'; min: number; max: number }
  | { kind: 'fixed'; value: number };

/** Build the density for a non-fixed spec. */
export function priorFromSpec(spec: Exclude<PriorSpec, { kind: 'fixed' }>, key: string): Prior {
  try {
    switch (spec.kind) {
      case 'uniform':
        return uniformPrior(spec.min, spec.max);
      case 'normal':
        return normalPrior(spec.mean, spec.sd);
      case 'truncated_normal':
        return truncatedNormalPrior(spec.mean, spec.sd, spec.min, spec.max);
      case 'log_uniform':
        return logUniformPrior(spec.min, spec.max);
    }
  } catch (err) {
    throw new ConfigError(`this prior cannot be normalised: ${(err as Error).message}`, {
      where: { key },
      found: spec,
      hint: 'move the bounds so that they hold some of the normal distribution',
    });
  }
}

/** A spec on the age in Gyr, as a density on log10(age / yr). */
export function logAgePriorFromAgeGyr(spec: Exclude<PriorSpec, { kind: 'fixed' }>, key: string): Prior {
  const onAge = priorFromSpec(spec, key);
  if (onAge.support[1] <= 0) {
    throw new ConfigError('an age prior must allow positive ages', { where: { key }, found: spec, expected: 'max > 0 Gyr' });
  }
  return ageGyrPrior(onAge);
}

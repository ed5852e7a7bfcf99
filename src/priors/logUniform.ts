import type { Prior } from './prior.js';

/** p(x) proportional to 1/x on [min, max], min > 0: scale-free, for scatter terms. */
export function logUniformPrior(min: number, max: number): Prior {
  const logMin = Math.log(min);
  const logSpan = Math.log(max) - logMin;
  return {
    kind: 'log_uniform',
    support: [min, max],
    logDensity: (x) => (x >= min && x <= max ? -Math.log(x) - Math.log(logSpan) : -Infinity),
    fromUnit: (u) => Math.exp(logMin + u * logSpan),
    describe: () => `log-uniform(${min}, ${max})`,
  };
}

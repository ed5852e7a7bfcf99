import type { Prior } from './prior.js';

export function uniformPrior(min: number, max: number): Prior {
  const logWidth = Math.log(max - min);
  return {
    kind: 'uniform',
    support: [min, max],
    logDensity: (x) => (x >= min && x <= max ? -logWidth : -Infinity),
    fromUnit: (u) => min + u * (max - min),
    describe: () => `uniform(${min}, ${max})`,
  };
}

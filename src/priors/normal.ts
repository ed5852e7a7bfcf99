import type { Prior } from './prior.js';
import { stdNormalQuantile } from './standardNormal.js';

const LOG_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

export function normalPrior(mean: number, sd: number): Prior {
  const logNorm = -Math.log(sd) - LOG_SQRT_2PI;
  return {
    kind: 'normal',
    support: [-Infinity, Infinity],
    logDensity: (x) => {
      const z = (x - mean) / sd;
      return logNorm - 0.5 * z * z;
    },
    fromUnit: (u) => mean + sd * stdNormalQuantile(u),
    describe: () => `normal(mean ${mean}, sd ${sd})`,
  };
}

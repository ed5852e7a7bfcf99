import type { Prior } from './prior.js';
import { stdNormalCdf as cdf, stdNormalQuantile as quantile } from './standardNormal.js';

const LOG_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

/**
 * A normal density cut to [min, max] and renormalised. Typical use: E(B-V) from a reddening map, which
 * cannot be negative. The mass inside the bounds is computed from whichever tail is smaller, so a cut far
 * in one tail keeps its precision.
 */
export function truncatedNormalPrior(mean: number, sd: number, min: number, max: number): Prior {
  const a = (min - mean) / sd;
  const b = (max - mean) / sd;
  // P(a < Z < b), from the side where the CDF differences do not cancel.
  const mass = a > 0 ? cdf(-a) - cdf(-b) : cdf(b) - cdf(a);
  if (!(mass > 0)) throw new RangeError(`truncated normal has no mass in [${min}, ${max}]`);
  const logNorm = -Math.log(sd) - LOG_SQRT_2PI - Math.log(mass);
  const cdfA = cdf(a);
  const upperA = cdf(-a);
  return {
    kind: 'truncated_normal',
    support: [min, max],
    logDensity: (x) => {
      if (x < min || x > max) return -Infinity;
      const z = (x - mean) / sd;
      return logNorm - 0.5 * z * z;
    },
    fromUnit: (u) => {
      const z = a > 0 ? -quantile(upperA - u * mass) : quantile(cdfA + u * mass);
      return Math.min(max, Math.max(min, mean + sd * z));
    },
    describe: () => `normal(mean ${mean}, sd ${sd}) truncated to [${min}, ${max}]`,
  };
}

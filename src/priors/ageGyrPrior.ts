import type { Prior } from './prior.js';

const LN10 = Math.LN10;

/**
 * A prior stated on the age in Gyr, turned into a density on log10(age / yr), which is what the sampler
 * moves in. Change of variables: age = 10^(l - 9) Gyr, d age / d l = age * ln 10, so
 * p_l(l) = p_age(age) * age * ln 10. A flat prior in age is therefore not flat in log age: it weights old
 * ages more, which is exactly the difference a prior-sensitivity check should expose.
 */
export function ageGyrPrior(onAge: Prior): Prior {
  const [lo, hi] = onAge.support;
  const toLog = (ageGyr: number): number => (ageGyr > 0 ? Math.log10(ageGyr) + 9 : -Infinity);
  return {
    kind: `age_gyr:${onAge.kind}`,
    support: [toLog(Math.max(lo, 0)), toLog(hi)],
    logDensity: (l) => {
      const age = 10 ** (l - 9);
      return onAge.logDensity(age) + Math.log(age * LN10);
    },
    fromUnit: (u) => toLog(onAge.fromUnit(u)),
    describe: () => `${onAge.describe()} on age in Gyr`,
  };
}

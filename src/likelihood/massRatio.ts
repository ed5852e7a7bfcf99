/**
 * The distribution of binary mass ratios q = M2/M1 on [qMin, 1]: uniform by default (close to what is
 * observed for solar-type binaries above q of about 0.1: Raghavan et al. 2010, ApJS 190, 1, from memory),
 * or a power law g(q) ∝ q^gamma.
 */
export interface MassRatioDistribution {
  readonly qMin: number;
  /** 0 for the uniform distribution. */
  readonly gamma: number;
}

/** log g(q), normalised on [qMin, 1]. */
export function logMassRatioDensity(d: MassRatioDistribution, q: number): number {
  const g1 = d.gamma + 1;
  const norm = Math.abs(g1) < 1e-12 ? -Math.log(d.qMin) : (1 - Math.pow(d.qMin, g1)) / g1;
  return d.gamma * Math.log(q) - Math.log(norm);
}

/** Inverse of the cumulative distribution, for the simulator. */
export function sampleMassRatio(d: MassRatioDistribution, u: number): number {
  const g1 = d.gamma + 1;
  if (Math.abs(g1) < 1e-12) return d.qMin * Math.pow(1 / d.qMin, u);
  const a = Math.pow(d.qMin, g1);
  return Math.pow(a + u * (1 - a), 1 / g1);
}

/**
 * A one-dimensional prior density. `fromUnit` is the inverse CDF, so drawing from the prior needs only
 * uniform numbers (which the sampler draws from its own saved generator, keeping runs reproducible).
 */
export interface Prior {
  readonly kind: string;
  /** The interval outside which the density is zero (may be infinite). */
  readonly support: readonly [number, number];
  /** Normalised log density; -Infinity outside the support. */
  logDensity(x: number): number;
  /** Inverse CDF: maps u in (0, 1) to a draw from the prior. */
  fromUnit(u: number): number;
  /** Human-readable form for manifests and reports, e.g. `uniform(9.8, 10.2)`. */
  describe(): string;
}

import erfc from '@stdlib/math-base-special-erfc';
import erfcinv from '@stdlib/math-base-special-erfcinv';

/**
 * Standard normal CDF and quantile that keep their relative precision in both tails. A quantile written
 * through erfinv(2p - 1) loses digits as p -> 0 (2p - 1 rounds towards -1); through erfcinv(2p) it does not.
 * Truncated priors evaluate exactly such tails.
 */
export function stdNormalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

/** z such that P(Z < z) = p. */
export function stdNormalQuantile(p: number): number {
  return p <= 0.5 ? -Math.SQRT2 * erfcinv(2 * p) : Math.SQRT2 * erfcinv(2 * (1 - p));
}

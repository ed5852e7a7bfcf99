/**
 * Logarithms of normal probabilities that stay accurate far in the tails. The segment integrals of the
 * likelihood need log(Phi(hi) - Phi(lo)) for arguments anywhere from -40 to +40: a star far from a segment's
 * foot point must still get a finite, correct log-density (never log(0) = -Infinity, which would be a
 * fake "impossible"). erfc and its scaled form erfcx come from fastErfc.ts (a table built from @stdlib's).
 */
import { erfcxNonNegative as erfcx, fastErfc as erfc } from './fastErfc.js';

const SQRT1_2 = Math.SQRT1_2;
const LN_HALF = -Math.LN2;

/** log Phi(x), the standard normal CDF, accurate for any x. */
export function logNormalCdf(x: number): number {
  if (x > 5) return Math.log1p(-0.5 * erfc(x * SQRT1_2));
  if (x > -5) return Math.log(0.5 * erfc(-x * SQRT1_2));
  // Lower tail: Phi(x) = erfc(z)/2 = erfcx(z) exp(-z^2) / 2 with z = -x/sqrt2 > 0.
  const z = -x * SQRT1_2;
  return LN_HALF + Math.log(erfcx(z)) - z * z;
}

/** Phi(x) itself. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x * SQRT1_2);
}

/**
 * log(Phi(hi) - Phi(lo)) for lo <= hi. Both in the upper tail is mirrored to the lower tail, where the
 * difference of two tiny numbers is taken in log space; straddling zero, the two tail masses are
 * subtracted from 1. Returns -Infinity only for lo === hi.
 */
export function logNormalDiff(lo: number, hi: number): number {
  if (lo < -8.3 && hi > 8.3) return 0; // both tails below 5e-17: the difference is 1 to double precision
  if (lo >= 0) {
    const t = lo;
    lo = -hi;
    hi = -t;
  }
  if (hi <= 0) {
    const a = logNormalCdf(hi);
    const b = logNormalCdf(lo);
    if (b >= a) return -Infinity;
    return a + Math.log1p(-Math.exp(b - a));
  }
  // lo < 0 < hi: 1 - Phi(-hi) - Phi(lo), each tail at most 1/2.
  return Math.log1p(-(0.5 * erfc(hi * SQRT1_2) + 0.5 * erfc(-lo * SQRT1_2)));
}

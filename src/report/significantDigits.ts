/**
 * How many decimals a posterior summary deserves. The rule (stated in every summary):
 *   1. Monte Carlo error: show digits down to the place of the leading digit of 2 x MCSE, so the last digit
 *      shown is uncertain by about one unit from the sampling, and no digit beyond it is pure noise.
 *      (For MCSE 0.013: 2 MCSE = 0.026, two decimals.)
 *   2. Meaningful precision: never more than two significant digits in the smaller error bar, as
 *      uncertainties are quoted in papers (common practice), however long the chains.
 * The decimals are the smaller of the two, and never negative.
 */
export const DIGITS_RULE =
  'decimals: down to the leading digit of 2 x MCSE, but no more than two significant digits of the smaller error bar';

/** Decimal places that put the last digit at the leading digit of x (x > 0). */
function decimalsAtLeadingDigit(x: number): number {
  return -Math.floor(Math.log10(x));
}

/**
 * Decimals for a value whose estimate has Monte Carlo error `mcse` and whose error bars are `errMinus`
 * and `errPlus` (positive).
 */
export function decimalsFor(mcse: number, errMinus: number, errPlus: number): number {
  const byMcse = Number.isFinite(mcse) && mcse > 0 ? decimalsAtLeadingDigit(2 * mcse) : Infinity;
  const err = Math.min(errMinus, errPlus);
  const byErr = Number.isFinite(err) && err > 0 ? decimalsAtLeadingDigit(err) + 1 : Infinity;
  const d = Math.min(byMcse, byErr);
  return Number.isFinite(d) ? Math.max(0, d) : 3;
}

/** x with `decimals` decimals; minus zero printed as 0. */
export function fixed(x: number, decimals: number): string {
  if (!Number.isFinite(x)) return String(x);
  const s = x.toFixed(Math.min(decimals, 20));
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

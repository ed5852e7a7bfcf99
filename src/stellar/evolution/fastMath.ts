/**
 * Powers through exp and log. V8's Math.pow (and `**`) with a non-integer exponent costs about twice an
 * exp plus a log, and most formulae here raise the same mass to several powers: with ln M computed once,
 * each power is one exp. Arguments must be positive.
 */
export function pow(x: number, y: number): number {
  return Math.exp(y * Math.log(x));
}

/** 10^x. */
export function exp10(x: number): number {
  return Math.exp(x * Math.LN10);
}

/** M^y given ln M. */
export function powLn(lnx: number, y: number): number {
  return Math.exp(y * lnx);
}

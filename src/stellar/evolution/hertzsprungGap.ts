/**
 * Hertzsprung gap (HG): HPT2000 section 5.2. L and R move geometrically from their end-of-main-sequence
 * values to those at the end of the gap (eqs. 26-27), and the core grows from rho Mc,EHG to Mc,EHG
 * (eqs. 28-30). The end of the gap is the base of the giant branch, or helium ignition for M >= M_FGB.
 */

/** rho of eq. (29): the core mass at the end of the main sequence as a fraction of Mc,EHG. */
export function coreFractionTMS(m: number): number {
  const x = Math.exp(5.25 * Math.log(m));
  return (1.586 + x) / (2.434 + 1.02 * x);
}

export class HertzsprungGap {
  tMS = 0;
  tBGB = 0;
  logLTMS = 0;
  logRTMS = 0;
  logLEnd = 0;
  logREnd = 0;
  mcEnd = 0;
  rho = 0;

  fill(m: number, tMS: number, tBGB: number, logLTMS: number, logRTMS: number, lEnd: number, rEnd: number, mcEnd: number): this {
    this.tMS = tMS;
    this.tBGB = tBGB;
    this.logLTMS = logLTMS;
    this.logRTMS = logRTMS;
    this.logLEnd = Math.log10(lEnd);
    this.logREnd = Math.log10(rEnd);
    this.mcEnd = mcEnd;
    this.rho = coreFractionTMS(m);
    return this;
  }

  fraction(t: number): number {
    const span = this.tBGB - this.tMS;
    return span > 0 ? Math.min(1, Math.max(0, (t - this.tMS) / span)) : 1;
  }

  /** log L, log R and Mc at phase fraction tau: out[0..2]. */
  at(tau: number, out: Float64Array): void {
    out[0] = this.logLTMS + tau * (this.logLEnd - this.logLTMS);
    out[1] = this.logRTMS + tau * (this.logREnd - this.logRTMS);
    out[2] = ((1 - tau) * this.rho + tau) * this.mcEnd;
  }
}

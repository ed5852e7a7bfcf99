/**
 * Stellar-wind mass loss: HPT2000 section 7.1. The rate is the largest of
 *  - Reimers (1975): 4e-13 eta L R / M, for every star past the main sequence (eta configurable; the paper's
 *    value is 0.5);
 *  - Nieuwenhuijzen & de Jager (1990): 9.6e-15 (Z/0.02)^0.5 R^0.81 L^1.24 M^0.16, where L > 4000 Lsun;
 *  - Vassiliadis & Wood (1993) on the AGB: log Mdot = -11.4 + 0.0125 [P0 - 100 max(M - 2.5, 0)], with
 *    log P0 = min(3.3, -2.07 - 0.9 log M + 1.94 log R) (P0 in days, at most 2000 d), and at most the
 *    superwind rate 1.36e-9 L.
 * The paper's Wolf-Rayet-like and LBV terms act only on stars with very thin envelopes or L > 6e5 Lsun,
 * outside the isochrone domain; they are left out (see the model caveats). Units: Msun/yr, Lsun, Rsun.
 */

import { exp10 } from './fastMath.js';

export const DEFAULT_REIMERS_ETA = 0.5;

export function massLossRate(Z: number, eta: number, l: number, r: number, m: number, onAGB: boolean): number {
  let rate = (4e-13 * eta * l * r) / m;
  if (l > 4000) rate = Math.max(rate, 9.6e-15 * Math.sqrt(Z / 0.02) * Math.exp(0.81 * Math.log(r) + 1.24 * Math.log(l) + 0.16 * Math.log(m)));
  if (onAGB) {
    const p0 = exp10(Math.min(3.3, -2.07 - 0.9 * Math.log10(m) + 1.94 * Math.log10(r)));
    const vw = Math.min(exp10(-11.4 + 0.0125 * (p0 - 100 * Math.max(m - 2.5, 0))), 1.36e-9 * l);
    rate = Math.max(rate, vw);
  }
  return rate;
}

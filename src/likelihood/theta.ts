/**
 * The cluster parameters the likelihood takes, by name or as a Float64Array in THETA_NAMES order.
 */
import type { ParameterInfo } from '../core/parameters.js';

export interface ClusterParameters {
  /** log10(age / yr). */
  logAgeYr: number;
  /** [Fe/H], dex. */
  feh: number;
  /** True distance modulus (m - M)_0, mag. */
  dm: number;
  /** E(B-V), mag. */
  ebv: number;
  /** Binary fraction (see LikelihoodOptions.binaryFractionOf). */
  fBinary: number;
  /** Fraction of catalogue stars that are field stars; ignored when the catalogue gives memberships. */
  fField: number;
  /** Extra scatter added in quadrature to every band's error, mag. */
  sigmaExtra: number;
}

/** The order of a theta vector. */
export const THETA_NAMES = ['log_age', 'feh', 'dm', 'ebv', 'f_binary', 'f_field', 'sigma_extra'] as const;

export const THETA_INFO: readonly ParameterInfo[] = [
  { name: 'log_age', label: 'log10(age / yr)', unit: 'dex' },
  { name: 'feh', label: '[Fe/H]', unit: 'dex' },
  { name: 'dm', label: '(m - M)_0', unit: 'mag' },
  { name: 'ebv', label: 'E(B-V)', unit: 'mag' },
  { name: 'f_binary', label: 'binary fraction', unit: '' },
  { name: 'f_field', label: 'field fraction', unit: '' },
  { name: 'sigma_extra', label: 'extra scatter', unit: 'mag' },
];

export function thetaVector(p: ClusterParameters): Float64Array {
  return Float64Array.of(p.logAgeYr, p.feh, p.dm, p.ebv, p.fBinary, p.fField, p.sigmaExtra);
}

export function thetaObject(t: ArrayLike<number>): ClusterParameters {
  return { logAgeYr: t[0], feh: t[1], dm: t[2], ebv: t[3], fBinary: t[4], fField: t[5], sigmaExtra: t[6] };
}

/** Parallax in mas of a cluster at true distance modulus dm: 1000 / d(pc), d = 10^(dm/5 + 1). */
export function parallaxMasFromDm(dm: number): number {
  return Math.pow(10, 2 - dm / 5);
}

/**
 * Cardelli, Clayton & Mathis 1989 (ApJ 345, 245), the R_V-dependent mean extinction law: A_lambda/A_V =
 * a(x) + b(x)/R_V in x = 1/lambda (inverse micrometres), with their eqs. 2 (infrared, 0.3 <= x < 1.1),
 * 3 (optical and near infrared, 1.1 <= x < 3.3), 4 (ultraviolet, 3.3 <= x < 8) and 5 (far ultraviolet,
 * 8 <= x <= 10). O'Donnell 1994 (ApJ 422, 158, eq. 2) replaced the optical polynomials; `odonnell94` is CCM89
 * with that replacement, the usual "CCM89 + O'Donnell 1994" law.
 */
import { ModelError } from '../../core/errors.js';

export const CCM89_X_RANGE = [0.3, 10] as const;

/** CCM89 eq. 3 (y = x - 1.82). */
const CCM_OPT_A = [1, 0.17699, -0.50447, -0.02427, 0.72085, 0.01979, -0.7753, 0.32999];
const CCM_OPT_B = [0, 1.41338, 2.28305, 1.07233, -5.38434, -0.62251, 5.3026, -2.09002];
/** O'Donnell 1994 eq. 2 (y = x - 1.82). */
const OD_OPT_A = [1, 0.104, -0.609, 0.701, 1.137, -1.718, -0.827, 1.647, -0.505];
const OD_OPT_B = [0, 1.952, 2.908, -3.989, -7.985, 11.102, 5.491, -10.805, 3.347];

function horner(c: readonly number[], y: number): number {
  let s = 0;
  for (let i = c.length - 1; i >= 0; i--) s = s * y + c[i];
  return s;
}

function law(xInvUm: number, rv: number, optA: readonly number[], optB: readonly number[], name: string): number {
  const x = xInvUm;
  if (!(x >= CCM89_X_RANGE[0] && x <= CCM89_X_RANGE[1])) {
    throw new ModelError(`${name} is defined for 0.3 <= x <= 10 per micrometre (1000 A to 3.33 micrometres)`, {
      found: x,
      expected: 'a wavenumber within 0.3-10 per micrometre',
    });
  }
  let a: number;
  let b: number;
  if (x < 1.1) {
    const p = x ** 1.61;
    a = 0.574 * p;
    b = -0.527 * p;
  } else if (x < 3.3) {
    const y = x - 1.82;
    a = horner(optA, y);
    b = horner(optB, y);
  } else if (x < 8) {
    let fa = 0;
    let fb = 0;
    if (x >= 5.9) {
      const y = x - 5.9;
      fa = -0.04473 * y * y - 0.009779 * y * y * y;
      fb = 0.213 * y * y + 0.1207 * y * y * y;
    }
    a = 1.752 - 0.316 * x - 0.104 / ((x - 4.67) ** 2 + 0.341) + fa;
    b = -3.09 + 1.825 * x + 1.206 / ((x - 4.62) ** 2 + 0.263) + fb;
  } else {
    const y = x - 8;
    a = -1.073 - 0.628 * y + 0.137 * y * y - 0.07 * y * y * y;
    b = 13.67 + 4.257 * y - 0.42 * y * y + 0.374 * y * y * y;
  }
  return a + b / rv;
}

/** A_lambda / A_V of Cardelli, Clayton & Mathis 1989 at wavenumber x (per micrometre) for R_V = rv. */
export function ccm89(xInvUm: number, rv: number): number {
  return law(xInvUm, rv, CCM_OPT_A, CCM_OPT_B, 'the CCM89 law');
}

/** A_lambda / A_V of CCM89 with O'Donnell 1994's optical coefficients. */
export function odonnell94(xInvUm: number, rv: number): number {
  return law(xInvUm, rv, OD_OPT_A, OD_OPT_B, "the CCM89 + O'Donnell 1994 law");
}

/**
 * Fitzpatrick 1999 (PASP 111, 63), the R_V-dependent extinction curve. Ultraviolet (lambda <= 2700 A): the
 * Fitzpatrick & Massa 1990 form k(x) = E(lambda-V)/E(B-V) = c1 + c2 x + c3 D(x) + c4 F(x), with x0 = 4.596,
 * gamma = 0.99, c3 = 3.23, c4 = 0.41, c2 = -0.824 + 4.717/R_V, c1 = 2.030 - 3.007 c2 (F99 Table 3 and
 * Sect. 3.2). Optical and infrared: a natural cubic spline through anchor points of A_lambda/E(B-V) at
 * x = 0 and 1e4/[26500, 12200, 6000, 5470, 4670, 4110] A, joined to the ultraviolet through its values at
 * 2700 and 2600 A (F99 Sect. 3.2). The optical anchor values are the R_V polynomials that E. Fitzpatrick
 * distributed after the paper (with the IDL routine FM_UNRED), which supersede F99 Table 4; the reference
 * library python3-extinction uses the same values, and we cross-check against it.
 *
 * Defined here for 1/6 <= x <= 1/0.091 per micrometre (the reference library's 910 A - 6 micrometres).
 */
import { ModelError } from '../../core/errors.js';
import { naturalCubicSpline, type CubicSpline } from './naturalCubicSpline.js';

export const F99_X_RANGE = [1 / 6, 1e4 / 910] as const;

const X0 = 4.596;
const GAMMA = 0.99;
const C3 = 3.23;
const C4 = 0.41;
const X_UV_EDGE = 1e4 / 2700;

function uvCurve(x: number, rv: number): number {
  const c2 = -0.824 + 4.717 / rv;
  const c1 = 2.03 - 3.007 * c2;
  const x2 = x * x;
  const drude = x2 / ((x2 - X0 * X0) ** 2 + x2 * GAMMA * GAMMA);
  const y = x - 5.9;
  const farUv = x >= 5.9 ? 0.5392 * y * y + 0.05644 * y * y * y : 0;
  return c1 + c2 * x + C3 * drude + C4 * farUv + rv; // A_lambda / E(B-V)
}

const ANCHOR_X = [0, 1e4 / 26500, 1e4 / 12200, 1e4 / 6000, 1e4 / 5470, 1e4 / 4670, 1e4 / 4110, 1e4 / 2700, 1e4 / 2600];

function poly(c: readonly number[], v: number): number {
  let s = 0;
  for (let i = c.length - 1; i >= 0; i--) s = s * v + c[i];
  return s;
}

/** The optical/infrared spline of A_lambda/E(B-V) for one R_V. */
function opticalSpline(rv: number): CubicSpline {
  const ir = rv / 3.1;
  const ys = [
    0,
    0.26469 * ir,
    0.82925 * ir,
    poly([-4.22809e-1, 1.0027, 2.13572e-4], rv),
    poly([-5.1354e-2, 1.00216, -7.35778e-5], rv),
    poly([7.00127e-1, 1.00184, -3.32598e-5], rv),
    poly([1.19456, 1.01707, -5.46959e-3, 7.97809e-4, -4.45636e-5], rv),
    uvCurve(1e4 / 2700, rv),
    uvCurve(1e4 / 2600, rv),
  ];
  return naturalCubicSpline(ANCHOR_X, ys);
}

/** A_lambda / A_V of the Fitzpatrick 1999 curve, for any number of wavenumbers at one R_V. */
export function fitzpatrick1999Curve(rv: number): (xInvUm: number) => number {
  const spline = opticalSpline(rv);
  return (x: number) => {
    if (!(x >= F99_X_RANGE[0] && x <= F99_X_RANGE[1])) {
      throw new ModelError('the Fitzpatrick 1999 law is defined for 910 A to 6 micrometres', {
        found: x,
        expected: 'a wavenumber within 1/6-10.99 per micrometre',
      });
    }
    return (x >= X_UV_EDGE ? uvCurve(x, rv) : spline(x)) / rv;
  };
}

/** A_lambda / A_V of Fitzpatrick 1999 at wavenumber x (per micrometre) for R_V = rv. */
export function fitzpatrick99(xInvUm: number, rv: number): number {
  return fitzpatrick1999Curve(rv)(xInvUm);
}

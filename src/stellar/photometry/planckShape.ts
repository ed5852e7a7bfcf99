/**
 * Shapes for carrying a calibration beyond the edge of its validity range.
 *
 * Empirical colour-temperature relations cover roughly 4000-8000 K, yet isochrones reach hot blue
 * horizontal-branch stars (10 000-30 000 K in metal-poor clusters) and M dwarfs and giants below 3500 K.
 * Beyond an edge at log Teff_e, a quantity Q (a colour or a bolometric correction) continues along a shape
 * S, a function of log Teff with a physical reason to run parallel to Q:
 *
 *     Q(T) = Q_e + s_far [S(T) - S(T_e)] + (s_edge - s_far) S'(T_e) w tanh((log T - log T_e) / w),
 *
 * where s_edge = Q'(T_e) / S'(T_e) matches the relation's slope at the edge (so Q and dQ/dlogT are
 * continuous there) and s_far is the slope ratio far from it (the modes below say which). Shapes used: a
 * black body's colour or bolometric correction at the bands' effective wavelengths (colours then flatten
 * towards the Rayleigh-Jeans limit when hot and redden ever faster when cool, and never turn over), and,
 * where a published relation covers the region, its shape (Flower 1996 B-V and BC_V, which reach O stars).
 * Slope ratios are kept within bounds (default [1/4, 4]; cool side of colours [1/2, 5/2], the range M
 * stars show against a black body), so an implausible edge slope is never amplified.
 *
 * This is an approximation: a black body has no Balmer jump and no molecular bands. The dwarf-sequence
 * tests measure the result, and provenance.ts states it.
 */

import { pow10 } from './smooth.js';

/** Second radiation constant hc/k in micrometre kelvin (CODATA 2018, exact in SI). */
const C2_UM_K = 14387.7688;
const LN10 = Math.LN10;

/**
 * Effective wavelengths in micrometres, used only for the shape of the extensions (the slope is matched
 * to the relation, so these values matter little). From memory: Bessell, Castelli & Plez 1998 (Table A2)
 * for U B V Rc Ic, Gaia DR3 passband pivot wavelengths, Cohen, Wheaton & Megeath 2003 for 2MASS.
 */
export const EFFECTIVE_WAVELENGTH_UM = {
  U: 0.366,
  B: 0.438,
  V: 0.545,
  R: 0.641,
  I: 0.798,
  G: 0.622,
  BP: 0.511,
  RP: 0.777,
  J: 1.235,
  H: 1.662,
  Ks: 2.159,
} as const;

/** A function of log10 Teff with its derivative. */
export interface Shape {
  value(logTeff: number): number;
  slope(logTeff: number): number;
}

/** x / (1 - exp(-x)), the logarithmic derivative of (e^x - 1) times x, computed without overflow. */
function xOverOneMinusExpMinus(x: number): number {
  return x / -Math.expm1(-x);
}

/** log10(e^x - 1) without overflow for large x. */
function log10ExpM1(x: number): number {
  return x > 30 ? x / LN10 : Math.log10(Math.expm1(x));
}

/**
 * Black-body colour m1 - m2 between wavelengths lambda1 and lambda2 (micrometres), up to a constant:
 * 2.5 log10[(e^x1 - 1) / (e^x2 - 1)] with x = c2 / (lambda T).
 */
export function planckColourShape(lambda1Um: number, lambda2Um: number): Shape {
  return {
    value(logTeff) {
      const t = pow10(logTeff);
      return 2.5 * (log10ExpM1(C2_UM_K / (lambda1Um * t)) - log10ExpM1(C2_UM_K / (lambda2Um * t)));
    },
    slope(logTeff) {
      // d/dlnT log10(e^x - 1) = -x e^x / (e^x - 1) / ln 10; and d/dlog10T = ln10 d/dlnT.
      const t = pow10(logTeff);
      const x1 = C2_UM_K / (lambda1Um * t);
      const x2 = C2_UM_K / (lambda2Um * t);
      return 2.5 * (-xOverOneMinusExpMinus(x1) + xOverOneMinusExpMinus(x2));
    },
  };
}

/**
 * Black-body bolometric correction at wavelength lambda, up to a constant: 2.5 log10(B_lambda(T) / T^4),
 * i.e. -2.5 log10(e^x - 1) - 10 log10 T.
 */
export function planckBcShape(lambdaUm: number): Shape {
  return {
    value(logTeff) {
      const t = pow10(logTeff);
      return -2.5 * log10ExpM1(C2_UM_K / (lambdaUm * t)) - 10 * logTeff;
    },
    slope(logTeff) {
      const t = pow10(logTeff);
      return 2.5 * xOverOneMinusExpMinus(C2_UM_K / (lambdaUm * t)) - 10;
    },
  };
}

/** Default bounds on the slope ratio s. */
export const SLOPE_RATIO_RANGE = [0.25, 4] as const;

/**
 * How an extension follows its shape far from the edge (near the edge it always has the relation's own
 * slope). `scaled`: Q - Q_e = s [S(T) - S(T_e)] with the edge's slope ratio s kept all the way (for
 * black-body shapes on the cool side: real colours of cool stars keep reddening faster than a black
 * body's). `offset`: the slope mismatch is absorbed within about OFFSET_SATURATION_DEX of the edge, after
 * which Q runs parallel to S (for an empirical shape that is right up to a zero point). `secant`: beyond that
 * width the ratio is the relation's mean slope ratio over its last SECANT_DEX inside the range rather than
 * its slope at the very edge, which for a fitted polynomial is the least constrained point.
 */
export type ExtensionMode = 'scaled' | 'offset' | 'secant';

/** Default width in log Teff over which the slope converges from the edge's to the far-field one. */
export const OFFSET_SATURATION_DEX = 0.05;
/** Span inside the range over which the `secant` mode measures the slope ratio. */
export const SECANT_DEX = 0.1;

function clampRatio(s: number, range: readonly [number, number]): number {
  if (!(s >= range[0])) return range[0];
  return s > range[1] ? range[1] : s;
}

/** An extension fixed by its edge: everything but the shape's value at the target temperature. */
export interface Extension {
  logTeffEdge: number;
  qEdge: number;
  shape: Shape;
  shapeEdge: number;
  /** Slope ratio at the edge and far from it (equal in the `scaled` mode). */
  near: number;
  far: number;
  /** (near - far) S'(T_e) w, the amplitude of the saturating correction over width w. */
  correction: number;
  saturationDex: number;
}

/**
 * The extension beyond an edge at logTeffEdge where the relation has value qEdge and slope dQ/dlogTeff =
 * slopeEdge, continued along `shape` (see the module comment). `farRatio` is the far-field slope ratio of
 * the `secant` mode.
 */
export function prepareExtension(
  logTeffEdge: number,
  qEdge: number,
  slopeEdge: number,
  shape: Shape,
  mode: ExtensionMode = 'scaled',
  slopeRatioRange: readonly [number, number] = SLOPE_RATIO_RANGE,
  farRatio = 1,
  saturationDex = OFFSET_SATURATION_DEX,
): Extension {
  const shapeSlope = shape.slope(logTeffEdge);
  const near = clampRatio(slopeEdge / shapeSlope, slopeRatioRange);
  const far = mode === 'scaled' ? near : mode === 'offset' ? 1 : clampRatio(farRatio, slopeRatioRange);
  return {
    logTeffEdge,
    qEdge,
    shape,
    shapeEdge: shape.value(logTeffEdge),
    near,
    far,
    correction: (near - far) * shapeSlope * saturationDex,
    saturationDex,
  };
}

/** Q at logTeff on an extension. Q and dQ/dlogTeff are continuous at the edge in every mode. */
export function evaluateExtension(x: Extension, logTeff: number): number {
  const q = x.qEdge + x.far * (x.shape.value(logTeff) - x.shapeEdge);
  // d tanh(u)/du = 1 at u = 0: the correction supplies the edge's own slope and then saturates.
  return x.correction === 0 ? q : q + x.correction * Math.tanh((logTeff - x.logTeffEdge) / x.saturationDex);
}

/** One-off form of prepareExtension + evaluateExtension. */
export function extendBeyondEdge(
  logTeff: number,
  logTeffEdge: number,
  qEdge: number,
  slopeEdge: number,
  shape: Shape,
  mode: ExtensionMode = 'scaled',
  slopeRatioRange: readonly [number, number] = SLOPE_RATIO_RANGE,
  farRatio = 1,
): number {
  return evaluateExtension(prepareExtension(logTeffEdge, qEdge, slopeEdge, shape, mode, slopeRatioRange, farRatio), logTeff);
}

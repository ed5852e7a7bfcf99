/**
 * The closed-form Gaussian line integral along one segment of an isochrone polyline.
 *
 * Derivation (for a referee). A segment runs from node a to node b in magnitude space; t in [0, 1] is the
 * position along it, so the model magnitudes are mu_b(t) = mu_b(a) + t e_b with e_b = mu_b(b) - mu_b(a).
 * Star i has magnitudes m_b in the bands it has, with variances v_b = s_b^2 + sigmaExtra^2. With
 * r_b = m_b - mu_b(a), the squared Mahalanobis distance from the star to the point t is
 *
 *     Q(t) = sum_b (r_b - t e_b)^2 / v_b = A t^2 - 2 B t + C,
 *     A = sum_b e_b^2 / v_b,   B = sum_b e_b r_b / v_b,   C = sum_b r_b^2 / v_b.
 *
 * The number of stars per unit t along the segment (the IMF weight, see imf.ts) is written
 * w(t) = exp(c0 + c1 t + c2 t^2). This is exact, not an approximation, for the model we define: along a
 * segment log(mass) is linear in t, so a power-law IMF piece gives c2 = 0 and the log-normal piece of
 * Chabrier (2003) gives c2 < 0 (imf.ts, segmentLogWeight). The segment's contribution to the star's
 * integral over mass, without the Gaussian's constant factor prod_b (2 pi v_b)^(-1/2), is
 *
 *     I = int_0^1 exp(c0 + c1 t + c2 t^2 - Q(t)/2) dt
 *       = exp(c0 - C/2) int_0^1 exp(-(a/2) t^2 + beta t) dt,   a = A - 2 c2 >= 0,  beta = B + c1.
 *
 * Completing the square with t0 = beta / a:  -(a/2) t^2 + beta t = -(a/2)(t - t0)^2 + beta^2 / (2a), and
 * int_0^1 exp(-(a/2)(t - t0)^2) dt = sqrt(2 pi / a) [Phi(sqrt(a)(1 - t0)) - Phi(-sqrt(a) t0)]. Hence
 *
 *     log I = c0 - C/2 + beta^2/(2a) + (1/2) log(2 pi / a) + log[Phi(sqrt(a)(1 - t0)) - Phi(-sqrt(a) t0)].
 *
 * beta^2/(2a) - C/2 can be large and positive only when the exponent is tiny elsewhere; the sum stays
 * finite for every finite input. When a -> 0 (a segment that moves only in bands the star lacks, with a
 * pure power-law weight) the integral is that of exp(beta t), done separately to avoid 0/0.
 */
import { logNormalDiff } from './normalTail.js';

const HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);

/** log int_0^1 exp(c0 + c1 t + c2 t^2 - (A t^2 - 2 B t + C)/2) dt. */
export function logSegmentIntegral(A: number, B: number, C: number, c0: number, c1: number, c2: number): number {
  const a = A - 2 * c2;
  const beta = B + c1;
  if (a < 1e-10) return c0 - 0.5 * C + logExpIntegral(beta);
  const sa = Math.sqrt(a);
  const t0 = beta / a;
  return c0 - 0.5 * C + (0.5 * beta * beta) / a + HALF_LOG_2PI - Math.log(sa) + logNormalDiff(-sa * t0, sa * (1 - t0));
}

/** log int_0^1 exp(beta t) dt, stable for any beta. */
export function logExpIntegral(beta: number): number {
  if (Math.abs(beta) < 1e-8) return 0.5 * beta;
  if (beta > 0) return beta + Math.log(-Math.expm1(-beta) / beta);
  return Math.log(Math.expm1(beta) / beta);
}

/**
 * The squared Mahalanobis distance from the star to the nearest point of the segment: min over t in
 * [0, 1] of Q(t). Used for pruning.
 */
export function segmentMinQ(A: number, B: number, C: number): number {
  if (A <= 0) return C;
  if (B <= 0) return C;
  if (B >= A) return A - 2 * B + C;
  return Math.max(0, C - (B * B) / A);
}

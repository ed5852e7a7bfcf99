/**
 * The "Rosenbrock density" of Goodman & Weare (2010, CAMCoS 5, 65, section 5):
 * p(x1, x2) ∝ exp(-(100 (x2 - x1^2)^2 + (1 - x1)^2) / 20), a curved, narrow banana.
 * Integrating x2 out leaves x1 ~ N(1, 10) exactly, with x2 | x1 ~ N(x1^2, 0.1); so E[x2] = 11 and
 * Var[x2] = Var[x1^2] + 0.1 = 2 Var[x1]^2 + 4 E[x1]^2 Var[x1] + 0.1 = 240.1 (moments of a normal square).
 */
import type { LogDensity } from '../types.js';

export function rosenbrockDensity(): LogDensity {
  return {
    ndim: 2,
    blobNames: [],
    evaluate(theta) {
      const a = theta[1] - theta[0] * theta[0];
      const b = 1 - theta[0];
      return -(100 * a * a + b * b) / 20;
    },
  };
}

/**
 * A function of one variable tabulated once with its derivative and evaluated by cubic Hermite
 * interpolation: continuous with a continuous first derivative, and exact at the nodes. Used for shapes that
 * are themselves inverses of published relations (Flower's B-V at a given Teff), which would otherwise cost
 * a root-find at every evaluation. Beyond the nodes it continues linearly with the end slope.
 */
import type { Shape } from './planckShape.js';

export function tabulatedShape(f: (x: number) => number, df: (x: number) => number, min: number, max: number, step: number): Shape {
  const n = Math.round((max - min) / step) + 1;
  const v = new Float64Array(n);
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = min + i * step;
    v[i] = f(x);
    d[i] = df(x);
  }
  const last = min + (n - 1) * step;
  const cell = (x: number) => Math.min(Math.max(Math.floor((x - min) / step), 0), n - 2);
  return {
    value(x) {
      if (x <= min) return v[0] + d[0] * (x - min);
      if (x >= last) return v[n - 1] + d[n - 1] * (x - last);
      const i = cell(x);
      const t = (x - (min + i * step)) / step;
      const t2 = t * t;
      const t3 = t2 * t;
      return (2 * t3 - 3 * t2 + 1) * v[i] + (t3 - 2 * t2 + t) * step * d[i] + (-2 * t3 + 3 * t2) * v[i + 1] + (t3 - t2) * step * d[i + 1];
    },
    slope(x) {
      if (x <= min) return d[0];
      if (x >= last) return d[n - 1];
      const i = cell(x);
      const t = (x - (min + i * step)) / step;
      const t2 = t * t;
      return ((6 * t2 - 6 * t) * v[i]) / step + (3 * t2 - 4 * t + 1) * d[i] + ((-6 * t2 + 6 * t) * v[i + 1]) / step + (3 * t2 - 2 * t) * d[i + 1];
    },
  };
}

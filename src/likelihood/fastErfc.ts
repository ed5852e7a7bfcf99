/**
 * erfc and the scaled erfcx(x) = exp(x^2) erfc(x), fast enough for the likelihood's inner loop.
 *
 * Why not call @stdlib directly: each segment integral needs two erfc values, and an evaluation of 10^4
 * stars with binaries needs a few million. @stdlib's erfc (the fdlibm algorithm) is accurate to an ulp but
 * costs about 100 ns here (it splits x into words to square it exactly and calls exp twice); its erfcx
 * dispatches over a 100-case switch and costs about 65 ns. The likelihood needs about 1e-13 relative, not
 * an ulp. So this module tabulates @stdlib's own erfcx once, at load: on [0, 8) in pieces of width 1/8, each
 * piece the degree-9 polynomial that interpolates erfcx at the 10 Chebyshev points of the piece (erfcx is
 * analytic there, so the interpolant converges geometrically: the largest relative error measured against
 * @stdlib's erfcx over 10^6 points on [0, 12] is 2.8e-15, tests/likelihood/fastErfc.test.ts). Beyond 8 it defers to
 * @stdlib's erfcx (its continued fraction), which the likelihood reaches rarely. The table holds no
 * hand-copied constants: it is rebuilt from the library on every start.
 *
 * erfc(x) = exp(-x^2) erfcx(x) for x >= 0 (the rounding of x^2 costs at most x^2 * 1.1e-16 relative, below
 * 1e-13 up to x = 26; measured against @stdlib's erfc on [-7, 26]: 5.7e-14 at most), and 2 - erfc(-x) for
 * x < 0. Beyond 26 erfc is subnormal (below 1e-294) and its relative accuracy means nothing; beyond 27.3 it is 0.
 */
import erfcxStdlib from '@stdlib/math-base-special-erfcx';

const X_MAX = 8;
const PIECES_PER_UNIT = 8;
const N_PIECES = X_MAX * PIECES_PER_UNIT;
const DEGREE = 9;
const STRIDE = DEGREE + 1;

/** COEF[p * STRIDE + k]: coefficient of u^k on piece p, with u = 2 (x - centre) * PIECES_PER_UNIT in [-1, 1]. */
const COEF = buildTable();

function buildTable(): Float64Array {
  const out = new Float64Array(N_PIECES * STRIDE);
  const n = STRIDE;
  const nodes = new Float64Array(n);
  for (let j = 0; j < n; j++) nodes[j] = Math.cos((Math.PI * (j + 0.5)) / n);
  const f = new Float64Array(n);
  const cheb = new Float64Array(n);
  for (let p = 0; p < N_PIECES; p++) {
    const centre = (p + 0.5) / PIECES_PER_UNIT;
    const half = 0.5 / PIECES_PER_UNIT;
    for (let j = 0; j < n; j++) f[j] = erfcxStdlib(centre + half * nodes[j]);
    // Chebyshev coefficients of the interpolant (discrete orthogonality on the Chebyshev points).
    for (let k = 0; k < n; k++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += f[j] * Math.cos((Math.PI * k * (j + 0.5)) / n);
      cheb[k] = ((k === 0 ? 1 : 2) / n) * s;
    }
    chebyshevToMonomial(cheb, out, p * STRIDE);
  }
  return out;
}

/** Rewrite sum_k c_k T_k(u) as sum_k a_k u^k (exact recurrences; well conditioned at degree 9 on [-1, 1]). */
function chebyshevToMonomial(c: Float64Array, out: Float64Array, at: number): void {
  const n = c.length;
  let prev = new Float64Array(n); // T_{k-1}
  let cur = new Float64Array(n); // T_k
  prev[0] = 1;
  cur[1] = 1;
  for (let i = 0; i < n; i++) out[at + i] = 0;
  out[at] += c[0];
  if (n > 1) out[at + 1] += c[1];
  for (let k = 2; k < n; k++) {
    const next = new Float64Array(n);
    for (let i = 0; i < n; i++) next[i] = (i > 0 ? 2 * cur[i - 1] : 0) - prev[i];
    for (let i = 0; i < n; i++) out[at + i] += c[k] * next[i];
    prev = cur;
    cur = next;
  }
}

/** exp(x^2) erfc(x) for x >= 0. */
export function erfcxNonNegative(x: number): number {
  if (x >= X_MAX) return erfcxStdlib(x);
  const s = x * PIECES_PER_UNIT;
  const p = s | 0;
  const u = 2 * (s - p) - 1;
  const o = p * STRIDE;
  const c = COEF;
  return c[o] + u * (c[o + 1] + u * (c[o + 2] + u * (c[o + 3] + u * (c[o + 4] + u * (c[o + 5] + u * (c[o + 6] + u * (c[o + 7] + u * (c[o + 8] + u * c[o + 9]))))))));
}

/** The complementary error function, to about 1e-13 relative (NaN for NaN). */
export function fastErfc(x: number): number {
  if (x >= 0) return x > 27.3 ? 0 : Math.exp(-x * x) * erfcxNonNegative(x);
  if (x < 0) return x < -6 ? 2 : 2 - Math.exp(-x * x) * erfcxNonNegative(-x);
  return Number.NaN;
}

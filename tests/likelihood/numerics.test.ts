/**
 * The closed forms against independent numerical integration (composite Gauss-Legendre on fine grids), and
 * the IMFs against their published definitions.
 */
import { describe, expect, it } from 'vitest';
import { imfCumulative, logImfDensity, makeImf, segmentLogWeight } from '../../src/likelihood/imf.js';
import { logNormalCdf, logNormalDiff } from '../../src/likelihood/normalTail.js';
import { gregoryWeight } from '../../src/likelihood/qGrid.js';
import { logSegmentIntegral } from '../../src/likelihood/segmentIntegral.js';

const GL_X = [-0.9602898564975363, -0.7966664774136267, -0.525532409916329, -0.1834346424956498, 0.1834346424956498, 0.525532409916329, 0.7966664774136267, 0.9602898564975363];
const GL_W = [0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.362683783378362, 0.362683783378362, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763];

/** log of int_a^b exp(f(x)) dx by 8-point Gauss-Legendre on n panels, in log space. */
function logQuad(f: (x: number) => number, a: number, b: number, n = 4000): number {
  let mx = -Infinity;
  const vals: number[] = [];
  for (let p = 0; p < n; p++) {
    for (let g = 0; g < 8; g++) {
      const x = a + ((p + 0.5 + 0.5 * GL_X[g]) * (b - a)) / n;
      const v = f(x) + Math.log((0.5 * GL_W[g] * (b - a)) / n);
      vals.push(v);
      if (v > mx) mx = v;
    }
  }
  return mx + Math.log(vals.reduce((s, v) => s + Math.exp(v - mx), 0));
}

describe('normal tails', () => {
  it('log Phi matches direct integration of the density, deep into both tails', () => {
    for (const x of [-38, -20, -8.5, -3, -0.5, 0, 1.7, 6, 12]) {
      const ref = logQuad((t) => -0.5 * t * t - 0.5 * Math.log(2 * Math.PI), x - 60, x);
      expect(Math.abs(logNormalCdf(x) - ref)).toBeLessThan(1e-9 * Math.max(1, Math.abs(ref)));
    }
  });
  it('log(Phi(hi) - Phi(lo)) is accurate for narrow and far intervals', () => {
    const cases: [number, number][] = [[-30, -29.9], [29.9, 30], [-1e-3, 1e-3], [5, 40], [-40, -6], [-2, 3], [7.9, 8.0]];
    for (const [lo, hi] of cases) {
      const ref = logQuad((t) => -0.5 * t * t - 0.5 * Math.log(2 * Math.PI), lo, hi, 200);
      expect(Math.abs(logNormalDiff(lo, hi) - ref)).toBeLessThan(1e-9 * Math.max(1, Math.abs(ref)));
    }
  });
});

describe('closed-form segment integral', () => {
  it('equals direct integration for weights that are log-linear and log-quadratic, near and far', () => {
    const cases = [
      [50, 10, 4, 0.3, -1.2, 0], // foot inside, moderate length
      [1e4, 3e3, 1000, -2, 1.5, 0], // long segment, foot inside
      [0.5, 3, 30, 0, 0, 0], // short segment, star far off its end
      [200, -600, 2000, 1, -0.5, -0.8], // log-normal weight, foot before the start
      [4e5, 3.9e5, 4e5, 0, 2, -3], // very far star, foot near the end
      [1e-14, 0, 3, 0.1, 0.7, 0], // degenerate: segment moves only in bands the star lacks
    ];
    for (const [A, B, C, c0, c1, c2] of cases) {
      const ref = logQuad((t) => c0 + c1 * t + c2 * t * t - 0.5 * (A * t * t - 2 * B * t + C), 0, 1, 2000);
      const got = logSegmentIntegral(A, B, C, c0, c1, c2);
      expect(Math.abs(got - ref)).toBeLessThan(1e-9 * Math.max(1, Math.abs(ref)));
    }
  });
});

describe('initial mass functions', () => {
  it('Kroupa 2001: slopes 1.3 and 2.3 on either side of 0.5 Msun, continuous at the breaks (Kroupa 2001 eq. 2)', () => {
    const imf = makeImf('kroupa2001');
    const slope = (m: number) => -(logImfDensity(imf, m * 1.01) - logImfDensity(imf, m)) / Math.log(1.01);
    expect(slope(0.2)).toBeCloseTo(1.3, 10);
    expect(slope(2)).toBeCloseTo(2.3, 10);
    expect(slope(0.03)).toBeCloseTo(0.3, 10);
    for (const b of [0.08, 0.5]) expect(Math.abs(logImfDensity(imf, b * (1 - 1e-12)) - logImfDensity(imf, b * (1 + 1e-12)))).toBeLessThan(1e-9);
  });
  it('Salpeter 1955: slope 2.35', () => {
    const imf = makeImf('salpeter1955');
    expect(-(logImfDensity(imf, 3) - logImfDensity(imf, 1)) / Math.log(3)).toBeCloseTo(2.35, 12);
  });
  it('Chabrier 2003: log-normal peak of dN/dlogM at 0.079 Msun with sigma 0.69, slope 2.3 above 1 Msun, continuous', () => {
    const imf = makeImf('chabrier2003');
    // dN/dlog M = M ln10 dN/dM; its log10 M derivative vanishes at m_c.
    const perLog = (m: number) => logImfDensity(imf, m) + Math.log(m);
    expect(perLog(0.079 * 1.001)).toBeCloseTo(perLog(0.079 / 1.001), 8);
    // Curvature: ln xi drops by 1/(2 sigma^2) per dex^2.
    expect(perLog(0.079) - perLog(0.79)).toBeCloseTo(1 / (2 * 0.69 * 0.69), 8);
    expect(-(logImfDensity(imf, 4) - logImfDensity(imf, 2)) / Math.log(2)).toBeCloseTo(2.3, 10);
    expect(Math.abs(logImfDensity(imf, 1 - 1e-12) - logImfDensity(imf, 1 + 1e-12))).toBeLessThan(1e-9);
  });
  it('segment weights integrate to the exact number of stars between the masses', () => {
    for (const name of ['kroupa2001', 'salpeter1955', 'chabrier2003'] as const) {
      const imf = makeImf(name);
      for (const [ma, mb] of [[0.1, 0.3], [0.6, 0.9], [0.2, 0.45], [1.2, 3], [0.85, 0.8500001]]) {
        const c = [new Float64Array(1), new Float64Array(1), new Float64Array(1)];
        segmentLogWeight(imf, Math.log(ma), Math.log(mb), c[0], c[1], c[2], 0);
        const viaWeights = Math.exp(logSegmentIntegral(0, 0, 0, c[0][0], c[1][0], c[2][0]));
        const exact = imfCumulative(imf, mb) - imfCumulative(imf, ma);
        // The reference is a difference of two cumulative counts: for the 1e-7-wide segment it keeps only
        // about 1e-16 / 1e-7 of relative precision.
        expect(Math.abs(viaWeights / exact - 1)).toBeLessThan(mb / ma - 1 < 1e-5 ? 1e-6 : 1e-9);
      }
    }
  });
});

describe('Gregory-corrected trapezoid weights', () => {
  it('integrate cubics exactly on [0, n]', () => {
    for (const n of [8, 32, 64]) {
      for (const p of [0, 1, 2, 3]) {
        let s = 0;
        for (let i = 0; i <= n; i++) s += gregoryWeight(i, n) * Math.pow(i, p);
        expect(s / (Math.pow(n, p + 1) / (p + 1))).toBeCloseTo(1, 12);
      }
    }
  });
});

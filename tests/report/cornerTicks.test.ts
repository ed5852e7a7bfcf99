/**
 * Corner-plot tick values (cornerPlot.ts innerTicks). Layout rules, common practice for small multiples:
 * each axis gets at least two labelled ticks at a round step (1, 2 or 5 x 10^k), and none within 10% of a
 * panel's ends, where its label would run into the neighbouring panel's.
 */
import { describe, expect, it } from 'vitest';
import { innerTicks } from '../../src/report/plots/cornerPlot.js';

const RANGES: [number, number][] = [
  [10.0762, 10.0819], // a log age posterior 0.006 dex wide
  [15.1966, 15.2052],
  [-1.6187, -1.5843],
  [0.0367, 0.0591],
  [0.00953, 0.01044],
  [0, 1],
  [-250, 1300],
];

describe('corner-plot ticks', () => {
  for (const r of RANGES) {
    it(`[${r[0]}, ${r[1]}]: 2-5 round ticks inside the inner 80%`, () => {
      const { values, format } = innerTicks(r);
      const w = r[1] - r[0];
      expect(values.length).toBeGreaterThanOrEqual(2);
      expect(values.length).toBeLessThanOrEqual(5);
      for (const v of values) {
        expect(v).toBeGreaterThanOrEqual(r[0] + 0.1 * w - 1e-12);
        expect(v).toBeLessThanOrEqual(r[1] - 0.1 * w + 1e-12);
      }
      const step = values[1] - values[0];
      const mantissa = step / Math.pow(10, Math.floor(Math.log10(step) + 1e-9));
      expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-6)).toBe(true);
      // Enough decimals to tell neighbouring ticks apart.
      const decimals = Number(/\.(\d+)f/.exec(format)?.[1]);
      expect(values.map((v) => v.toFixed(decimals)).every((s, i, a) => i === 0 || s !== a[i - 1])).toBe(true);
    });
  }
});

import { describe, expect, it } from 'vitest';
import { decimalsFor, fixed } from '../../src/report/significantDigits.js';
import { latexValue } from '../../src/report/summaryFormats.js';
import type { ParameterSummary } from '../../src/report/summary.js';

function param(median: number, p16: number, p84: number, decimals: number): ParameterSummary {
  return { info: { name: 'dm', label: '(m-M)_0', unit: 'mag' }, median, p16, p84, p2_5: NaN, p97_5: NaN, mean: median, sd: 0, map: median, essBulk: 1000, essTail: 1000, rhat: 1, mcseMedian: 0, mcseMean: 0, decimals };
}

describe('digits from the Monte Carlo error (the rule in significantDigits.ts)', () => {
  it('stops at the leading digit of 2 MCSE', () => {
    expect(decimalsFor(0.013, 0.4, 0.4)).toBe(2); // 2 MCSE = 0.026
    expect(decimalsFor(0.05, 0.4, 0.4)).toBe(1); // 2 MCSE = 0.1
    expect(decimalsFor(0.3, 0.4, 0.4)).toBe(1); // 2 MCSE = 0.6
    expect(decimalsFor(0.6, 4, 4)).toBe(0); // 2 MCSE = 1.2
    expect(decimalsFor(7, 100, 100)).toBe(0); // never negative
  });

  it('never shows more than two significant digits of the smaller error bar', () => {
    expect(decimalsFor(1e-6, 0.43, 0.5)).toBe(2);
    expect(decimalsFor(1e-6, 4.3, 5)).toBe(1);
    expect(decimalsFor(NaN, 0.012, 0.02)).toBe(3);
  });

  it('writes the LaTeX form of the issue: $12.1^{+0.4}_{-0.5}$', () => {
    const d = decimalsFor(0.05, 0.5, 0.4);
    expect(latexValue(param(12.1234, 12.1234 - 0.5, 12.1234 + 0.4, d))).toBe('$12.1^{+0.4}_{-0.5}$');
    expect(fixed(-0.0001, 2)).toBe('0.00');
  });
});

/**
 * The column map: sentinels, flux conversion, cuts, value checks. Tables are built in memory; expected
 * magnitudes follow the definition m = zp - 2.5 log10(f) (Pogson's ratio; common practice) and the
 * first-order error 2.5/ln(10) * sigma_f / f (common practice).
 */
import { describe, expect, it } from 'vitest';
import { buildCatalog, type ColumnTable } from '../../src/catalog/index.js';
import { parseConfigText } from '../../src/config/index.js';
import { InputError } from '../../src/core/errors.js';

function table(numbers: Record<string, number[]>, texts: Record<string, string[]> = {}): ColumnTable {
  const n = Object.values(numbers)[0]?.length ?? 0;
  return {
    path: 'mem.csv',
    format: 'csv',
    nRows: n,
    names: [...Object.keys(numbers), ...Object.keys(texts)],
    units: new Map(),
    numbers: new Map(Object.entries(numbers).map(([k, v]) => [k, Float64Array.from(v)])),
    texts: new Map(Object.entries(texts)),
    locate: (row, column) => ({ file: 'mem.csv', line: row + 2, field: column }),
  };
}

function config(text: string) {
  return parseConfigText(`[catalogue]\npath = "mem.csv"\n${text}`).config;
}

const VI = `
[photometry.V]
mag = "V"
err = "eV"
[photometry.I]
mag = "I"
err = "eI"
`;

function build(t: ColumnTable, text: string) {
  const c = config(text);
  return buildCatalog(t, c.catalogue, c.photometry);
}
function error(t: ColumnTable, text: string): InputError {
  try {
    build(t, text);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('buildCatalog', () => {
  it('converts fluxes, treating a non-positive flux as no measurement', () => {
    const t = table({ f: [1e4, 0, -5, 100], sf: [100, 1, 1, 5], V: [15, 16, 17, 18], eV: [0.01, 0.01, 0.01, 0.01] });
    const c = build(t, `[photometry.G]\nflux = "f"\nflux_err = "sf"\nzero_point = 25\n[photometry.V]\nmag = "V"\nerr = "eV"\n`);
    // 25 - 2.5 log10(1e4) = 15 exactly; 25 - 2.5 log10(100) = 20. Errors: 1.0857 * 0.01 and 1.0857 * 0.05.
    expect(c.bands).toEqual(['G', 'V']); // bands keep the order of the config
    expect(c.mag[0][0]).toBe(15);
    expect(c.mag[0][3]).toBe(20);
    expect(c.err[0][0]).toBeCloseTo(0.010857362, 9);
    expect(c.err[0][3]).toBeCloseTo(0.054286810, 9);
    expect(Number.isNaN(c.mag[0][1]) && Number.isNaN(c.mag[0][2])).toBe(true);
    expect(Number.isNaN(c.err[0][1])).toBe(true);
  });

  it('applies catalogue-wide and per-band sentinels, and keeps mag and err missing together', () => {
    const t = table({ V: [15, 99.999, 16, 17], eV: [0.01, 0.01, -1, 0.02], I: [14, 15, 0, 16], eI: [0.01, 0.01, 0.01, NaN] });
    const c = build(t, `missing = [99.999, -1]\n[photometry.V]\nmag = "V"\nerr = "eV"\n[photometry.I]\nmag = "I"\nerr = "eI"\nmissing = [0]\n`);
    // Row 3 (V error -1, I = 0) has no magnitude left and is dropped; row 4 has no I error, so no I.
    expect(Array.from(c.mag[0])).toEqual([15, NaN, 17]);
    expect(Array.from(c.err[0])).toEqual([0.01, NaN, 0.02]);
    expect(Array.from(c.mag[1])).toEqual([14, 15, NaN]);
    expect(Array.from(c.err[1])).toEqual([0.01, 0.01, NaN]);
    expect(c.filters.at(-1)).toEqual({ rule: 'no magnitude in any band', dropped: 1 });
    expect(c.nStars).toBe(3);
  });

  it('applies cuts in order and reports what each dropped', () => {
    const t = table(
      { V: [15, 16, 17, 18, 19], eV: [0.01, 0.01, 0.01, 0.01, 0.01], I: [14, 15, 16, 17, 18], eI: [0.01, 0.01, 0.01, 0.01, 0.01], p: [0.9, 0.1, NaN, 0.8, 0.7], flag: [0, 0, 0, 1, 0] },
      { q: ['A', 'A', 'A', 'A', 'B'] },
    );
    const c = build(t, `membership = "p"\n[[catalogue.cuts]]\ncolumn = "p"\nmin = 0.5\n[[catalogue.cuts]]\ncolumn = "flag"\nequals = false\n[[catalogue.cuts]]\ncolumn = "q"\nequals = "A"\n${VI}`);
    expect(c.filters).toEqual([
      { rule: 'p >= 0.5', dropped: 2 },
      { rule: 'flag == false', dropped: 1 },
      { rule: 'q == "A"', dropped: 1 },
      { rule: 'no magnitude in any band', dropped: 0 },
    ]);
    expect(c.nStars).toBe(1);
    expect(Array.from(c.membership as Float64Array)).toEqual([0.9]);
  });

  it('checks errors only on stars the cuts keep', () => {
    const t = table({ V: [15, 16], eV: [0.01, 0], I: [14, 15], eI: [0.01, 0.01] });
    expect(build(t, `[[catalogue.cuts]]\ncolumn = "eV"\nmin = 0.001\n${VI}`).nStars).toBe(1);
    const e = error(t, VI);
    expect(e.where).toEqual({ file: 'mem.csv', line: 3, field: 'eV' });
    expect(e.message).toMatch(/band V: the magnitude error is zero/);
  });

  it('refuses a membership probability outside [0, 1] and recognises percentages', () => {
    const e = error(table({ V: [15, 16], eV: [0.01, 0.01], I: [14, 15], eI: [0.01, 0.01], p: [95, 40] }), `membership = "p"\n${VI}`);
    expect(e.message).toMatch(/outside \[0, 1\]/);
    expect(e.hint).toMatch(/percentage/);
  });

  it('refuses a zero parallax error', () => {
    const e = error(table({ V: [15], eV: [0.01], I: [14], eI: [0.01], w: [0.5], sw: [0] }), `parallax = "w"\nparallax_error = "sw"\n${VI}`);
    expect(e.message).toMatch(/parallax error is zero/);
  });

  it('says when the cuts leave no star, or no star in one band', () => {
    const t = table({ V: [15, NaN], eV: [0.01, NaN], I: [14, 15], eI: [0.01, 0.01] });
    expect(error(t, `[[catalogue.cuts]]\ncolumn = "V"\nmin = 20\n${VI}`).message).toMatch(/no star is left after the filters/);
    expect(error(t, `[[catalogue.cuts]]\ncolumn = "I"\nmin = 14.5\n${VI}`).message).toMatch(/no star has a magnitude in band V/);
  });

  it('builds every array on shared memory', () => {
    const c = build(table({ V: [15], eV: [0.01], I: [14], eI: [0.01] }), VI);
    expect(c.mag[0].buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(c.err[1].buffer).toBeInstanceOf(SharedArrayBuffer);
  });
});

import { describe, expect, it } from 'vitest';
import { ModelError } from '../../../src/core/errors.js';
import {
  bcTable,
  bolometricCorrection,
  builtinPhotometry,
  gridPosition,
  interpolate,
  newGridPosition,
  PHOTOMETRY_BANDS,
  PHOTOMETRY_PROVENANCE,
} from '../../../src/stellar/photometry/index.js';

describe('builtinPhotometry: the PhotometryModel contract', () => {
  const model = builtinPhotometry();

  it('covers B V R I, Gaia G BP RP and 2MASS J H Ks, each with a provenance string', () => {
    expect([...model.bands]).toEqual(['B', 'V', 'R', 'I', 'G', 'BP', 'RP', 'J', 'H', 'Ks']);
    for (const b of model.bands) {
      const p = model.provenance[b] as string;
      expect(p.length).toBeGreaterThan(80);
      expect(p).toMatch(/\d{4}/); // cites a year
    }
    expect(model.provenance).toBe(PHOTOMETRY_PROVENANCE);
  });

  it('refuses U (no calibration) with a ModelError that says what to do', () => {
    const out = [new Float64Array(1)];
    let error: unknown;
    try {
      model.absoluteMagnitudes(['U'], Float64Array.of(0), Float64Array.of(3.76), Float64Array.of(4.4), 0, out, 1);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ModelError);
    expect((error as ModelError).hint).toMatch(/U is not modelled/);
  });

  it('returns NaN for a star with a NaN input, and finite values for inputs beyond the table (held at its edge)', () => {
    const out = [new Float64Array(4), new Float64Array(4)];
    model.absoluteMagnitudes(['V', 'G'], Float64Array.of(0, NaN, 0, 0), Float64Array.of(3.76, 3.76, 5.5, 3.0), Float64Array.of(4.4, 4.4, 9, -3), NaN, out, 4);
    expect(out[0].every(Number.isNaN)).toBe(true); // [Fe/H] NaN: every star
    model.absoluteMagnitudes(['V', 'G'], Float64Array.of(0, NaN, 0, 0), Float64Array.of(3.76, 3.76, 5.5, 3.0), Float64Array.of(4.4, 4.4, 9, -3), 0, out, 4);
    expect(Number.isFinite(out[0][0])).toBe(true);
    expect(Number.isNaN(out[0][1])).toBe(true);
    expect(Number.isFinite(out[0][2]) && Number.isFinite(out[1][3])).toBe(true);
  });

  it('writes only the first n entries, in the order of the bands asked for', () => {
    const out = [new Float64Array(3).fill(99), new Float64Array(3).fill(99)];
    model.absoluteMagnitudes(['G', 'V'], Float64Array.of(1, 2, 3), Float64Array.of(3.76, 3.76, 3.76), Float64Array.of(4.4, 4.4, 4.4), 0, out, 2);
    expect(out[0][2]).toBe(99);
    expect(out[0][0] - out[0][1]).toBeCloseTo(2.5, 10); // 1 dex in L is 2.5 mag at fixed Teff
    const one = [new Float64Array(1)];
    model.absoluteMagnitudes(['V'], Float64Array.of(1), Float64Array.of(3.76), Float64Array.of(4.4), 0, one, 1);
    expect(out[1][0]).toBe(one[0][0]);
  });
});

/*
 * The table against the calibration it tabulates, at random points where stars exist (dwarfs: log g
 * 3.8-5.2, 3000-28 000 K; giants: log g -0.5-3.8, 3550-20 000 K; [Fe/H] -2.5 to +0.3), seed fixed. The
 * bounds say the table adds nothing a fit would notice next to the calibration's own uncertainty (about
 * 0.02 mag for relations with 60-80 K scatter): rms at most a quarter of that, 0.005 mag; no single point
 * off by more than 0.1 mag (the largest differences sit where an extension swings with [Fe/H] between the
 * 0.1 dex nodes, such as B of metal-poor giants below 3700 K).
 */
describe('lookup table against direct evaluation', () => {
  it('agrees to rms <= 0.005 mag, max <= 0.1 mag in every band', () => {
    let seed = 12345;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const pos = newGridPosition();
    for (const band of PHOTOMETRY_BANDS) {
      const table = bcTable(band);
      let sum2 = 0;
      let worst = 0;
      const n = 400;
      for (let k = 0; k < n; k++) {
        const dwarf = rnd() < 0.5;
        const logTeff = dwarf ? 3.48 + rnd() * 0.97 : 3.55 + rnd() * 0.75;
        const logg = dwarf ? 3.8 + rnd() * 1.4 : -0.5 + rnd() * 4.3;
        const feh = -2.5 + rnd() * 2.8;
        gridPosition(logTeff, logg, feh, pos);
        const d = interpolate(table, pos) - bolometricCorrection(band, logTeff, logg, feh);
        sum2 += d * d;
        worst = Math.max(worst, Math.abs(d));
      }
      expect(Math.sqrt(sum2 / n), `${band} rms`).toBeLessThanOrEqual(0.005);
      expect(worst, `${band} max`).toBeLessThanOrEqual(0.1);
    }
  });
});

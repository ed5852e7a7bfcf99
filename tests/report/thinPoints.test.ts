import mt19937 from '@stdlib/random-base-mt19937';
import { describe, expect, it } from 'vitest';
import { describeThinning, thinPoints } from '../../src/report/plots/thinPoints.js';

describe('thinning a crowded scatter plot', () => {
  it('keeps every point when there are few, and skips non-finite ones', () => {
    const t = thinPoints([0, 1, Number.NaN, 3], [0, 1, 2, Number.POSITIVE_INFINITY], { maxPoints: 10 });
    expect(Array.from(t.index)).toEqual([0, 1]);
    expect(t.fraction).toBe(1);
    expect(describeThinning(t)).toBe('all 2 stars drawn');
  });

  it('keeps the same fraction of every crowded cell, and every star of the sparse ones', () => {
    // Two clumps of 20,000 and 5,000 points, each inside one cell, and 50 isolated points (one per cell).
    // The grid spans x 0..40 and y 0..130.
    const rand = mt19937.factory({ seed: 5 });
    const u = (): number => (rand() + 0.5) / 4294967296;
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < 20000; i++) {
      x.push(0.1 * u());
      y.push(0.1 * u());
    }
    for (let i = 0; i < 5000; i++) {
      x.push(20 + 0.1 * u());
      y.push(30 + 0.1 * u());
    }
    // In a column at x = 40, 2.6 apart: the grid's cells are (130 / 50 =) 2.6 high, one star each.
    for (let k = 0; k < 50; k++) {
      x.push(40);
      y.push(1.3 + 2.6 * k);
    }
    const t = thinPoints(x, y, { maxPoints: 1000, seed: 3 });
    expect(t.index.length).toBeLessThanOrEqual(1000);
    const kept = new Set(t.index);
    for (let k = 0; k < 50; k++) expect(kept.has(25000 + k)).toBe(true);
    const big = Array.from(t.index).filter((i) => i < 20000).length;
    const small = Array.from(t.index).filter((i) => i >= 20000 && i < 25000).length;
    // Each clump keeps f n of its n, rounded up or down: the 4:1 ratio holds to the rounding.
    expect(Math.abs(big - t.fraction * 20000)).toBeLessThan(1);
    expect(Math.abs(small - t.fraction * 5000)).toBeLessThan(1);
    expect(big + small + 50).toBeGreaterThan(995);
    expect(describeThinning(t)).toMatch(/^(\d{3}|1,000) of 25,050 stars drawn: on a 40 x 50 grid over the diagram, every star of the cells holding at most 2, and a random 3\.\d% of the stars of every other cell/);
    // The same seed gives the same stars.
    expect(Array.from(thinPoints(x, y, { maxPoints: 1000, seed: 3 }).index)).toEqual(Array.from(t.index));
  });
});

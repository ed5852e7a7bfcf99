import mt19937 from '@stdlib/random-base-mt19937';
import { describe, expect, it } from 'vitest';
import { describeThinning, thinPoints } from '../../src/report/plots/thinPoints.js';

describe('thinning a crowded scatter plot', () => {
  it('keeps every point when there are few, and skips non-finite ones', () => {
    const t = thinPoints([0, 1, Number.NaN, 3], [0, 1, 2, Number.POSITIVE_INFINITY], { maxPoints: 10 });
    expect(Array.from(t.index)).toEqual([0, 1]);
    expect(t.cap).toBe(Infinity);
    expect(describeThinning(t)).toBe('all 2 stars drawn');
  });

  it('thins only the crowded cells and keeps every star of the sparse ones', () => {
    // 20,000 points in a tight clump, and 60 scattered far from it (one per cell along a diagonal).
    const rand = mt19937.factory({ seed: 5 });
    const u = (): number => (rand() + 0.5) / 4294967296;
    const n = 20000;
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i < n; i++) {
      x.push(0.1 * u());
      y.push(0.1 * u());
    }
    for (let k = 0; k < 60; k++) {
      x.push(1 + k);
      y.push(1 + k * 1.3);
    }
    const t = thinPoints(x, y, { maxPoints: 1000, nx: 60, ny: 80, seed: 3 });
    expect(t.index.length).toBeLessThanOrEqual(1000);
    const kept = new Set(t.index);
    for (let k = 0; k < 60; k++) expect(kept.has(n + k)).toBe(true);
    // The clump falls in one cell (the grid spans 0..61 in x): it keeps exactly the cap.
    const clump = Array.from(t.index).filter((i) => i < n).length;
    expect(clump).toBe(t.cap);
    expect(t.cap).toBe(1000 - 60);
    expect(describeThinning(t)).toMatch(/^1,000 of 20,060 stars drawn: .* random 940 of their stars/);
    // The same seed gives the same stars.
    expect(Array.from(thinPoints(x, y, { maxPoints: 1000, nx: 60, ny: 80, seed: 3 }).index)).toEqual(Array.from(t.index));
  });
});

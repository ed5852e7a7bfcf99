/**
 * The corner plot's filled regions hold the posterior mass they are labelled with. Check against the
 * bivariate normal, whose highest-density regions are circles (for unit variances): the region of mass p
 * has radius R with R^2 = -2 ln(1 - p), since r^2 is chi-square with 2 degrees of freedom (textbook; e.g.
 * any statistics handbook's chi-square table, and common practice in corner plots).
 */
import mt19937 from '@stdlib/random-base-mt19937';
import { describe, expect, it } from 'vitest';
import { cornerPlotSpec } from '../../src/report/plots/cornerPlot.js';

function normals(n: number, seed: number): Float64Array {
  const rand = mt19937.factory({ seed });
  const u = (): number => (rand() + 0.5) / 4294967296;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i += 2) {
    const r = Math.sqrt(-2 * Math.log(u()));
    const t = 2 * Math.PI * u();
    out[i] = r * Math.cos(t);
    if (i + 1 < n) out[i + 1] = r * Math.sin(t);
  }
  return out;
}

interface Ring {
  x: number;
  y: number;
  i: number;
  id: number;
  region: string;
  hole: boolean;
}

/** Even-odd point-in-polygon over every ring (outer rings and holes) of one region. */
function inside(rings: Map<number, Ring[]>, x: number, y: number): boolean {
  let odd = false;
  for (const ring of rings.values()) {
    for (let k = 0, j = ring.length - 1; k < ring.length; j = k++) {
      const a = ring[k];
      const b = ring[j];
      if (a.y > y !== b.y > y && x < ((b.x - a.x) * (y - a.y)) / (b.y - a.y) + a.x) odd = !odd;
    }
  }
  return odd;
}

describe('corner plot regions', () => {
  const n = 40000;
  const x = normals(n, 11);
  const y = normals(n, 12);
  const spec = cornerPlotSpec([
    { name: 'a', label: 'a', draws: x },
    { name: 'b', label: 'b', draws: y },
  ]) as unknown as { concat: { layer?: { data: { values: Ring[] } }[] }[] };
  // Panels row-major: [a-marginal, empty, joint(a, b), b-marginal].
  const values = spec.concat[2].layer![0].data.values;
  const byRegion = (region: string): Map<number, Ring[]> => {
    const m = new Map<number, Ring[]>();
    for (const v of values.filter((r) => r.region === region)) m.set(v.id, [...(m.get(v.id) ?? []), v]);
    return m;
  };
  const fresh = { x: normals(50000, 21), y: normals(50000, 22) };

  it.each([
    ['68%', 0.68],
    ['95%', 0.95],
  ])('the %s region holds that share of the normal distribution', (region, p) => {
    const rings = byRegion(region);
    expect(rings.size).toBeGreaterThan(0);
    let hits = 0;
    for (let i = 0; i < fresh.x.length; i++) if (inside(rings, fresh.x[i], fresh.y[i])) hits++;
    const share = hits / fresh.x.length;
    // What the smoothed histogram estimates is the normal broadened by the cells (variance dx^2 / 12) and
    // the smoothing kernel (sd 1.2 dx): a region of mass p of that broader normal (variance s2 per axis)
    // holds 1 - (1 - p)^s2 of the true one. dx: the axes span the 0.5-99.5% range (+-2.576) widened by
    // 8% each side, over 40 cells.
    const dx = (2 * 2.5758 * 1.16) / 40;
    const s2 = 1 + dx * dx / 12 + (1.2 * dx) ** 2;
    const expected = 1 - (1 - p) ** s2;
    // Tolerance: 4 binomial standard errors of the histogram's draws and of the fresh draws (the region is
    // set by the first, its share counted with the second), plus the mass of one cell at the peak, the
    // granularity of the cumulative-mass cut (phi(0) dx^2 = dx^2 / (2 pi)).
    const se = Math.sqrt(p * (1 - p) * (1 / n + 1 / fresh.x.length));
    const tol = 4 * se + (dx * dx) / (2 * Math.PI);
    expect(Math.abs(share - expected), `share ${share.toFixed(4)}, expected ${expected.toFixed(4)}, tolerance ${tol.toFixed(4)}`).toBeLessThan(tol);
  });
});

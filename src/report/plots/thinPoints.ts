/**
 * Fewer points for a scatter plot of a large catalogue, without distorting it and without losing its
 * rare stars. The plane is cut into cells. A cell with at most `sparse` stars keeps them all: the rare
 * stars that sit nearly alone (bright giants, blue stragglers, outliers). Every other cell keeps the same
 * random fraction f of its stars (f n rounded up or down at random, so that on average exactly f n), so
 * densities stay to scale across the main sequence and the field alike. f is chosen so that the total is
 * at most `maxPoints`. Captions should say what was done (`describeThinning`).
 */
import mt19937 from '@stdlib/random-base-mt19937';

export interface ThinOptions {
  /** Most points to keep (the floors alone may exceed it on a very spread-out catalogue). */
  maxPoints: number;
  /** Cells across x and y (default 40 x 50: a CMD is taller than wide). */
  nx?: number;
  ny?: number;
  /** Cells with at most this many stars keep them all (default 2). */
  sparse?: number;
  seed?: number;
}

export interface Thinned {
  /** Indices of the kept points (finite x and y), ascending. */
  index: Int32Array;
  /** Points with finite coordinates. */
  finite: number;
  /** Fraction of each crowded cell's stars kept (1 when nothing was thinned). */
  fraction: number;
  sparse: number;
  nx: number;
  ny: number;
}

export function thinPoints(x: ArrayLike<number>, y: ArrayLike<number>, o: ThinOptions): Thinned {
  const nx = o.nx ?? 40;
  const ny = o.ny ?? 50;
  const sparse = o.sparse ?? 2;
  const finite: number[] = [];
  let x0 = Infinity;
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) continue;
    finite.push(i);
    x0 = Math.min(x0, x[i]);
    x1 = Math.max(x1, x[i]);
    y0 = Math.min(y0, y[i]);
    y1 = Math.max(y1, y[i]);
  }
  if (finite.length <= o.maxPoints) return { index: Int32Array.from(finite), finite: finite.length, fraction: 1, sparse, nx, ny };

  const cellOf = new Int32Array(finite.length);
  const counts = new Int32Array(nx * ny);
  const sx = nx / (x1 - x0 || 1);
  const sy = ny / (y1 - y0 || 1);
  finite.forEach((i, k) => {
    const cx = Math.min(nx - 1, Math.floor((x[i] - x0) * sx));
    const cy = Math.min(ny - 1, Math.floor((y[i] - y0) * sy));
    cellOf[k] = cy * nx + cx;
    counts[cellOf[k]]++;
  });
  // mt19937 takes seeds 1 .. 2^32 - 1.
  const rand = mt19937.factory({ seed: ((o.seed ?? 1) >>> 0) || 1 });
  const u = (): number => (rand() + 0.5) / 4294967296;
  // Random rounding offsets, one per cell, drawn once: the kept total then grows with f.
  const offset = Float64Array.from(counts, () => u());
  const quotas = (f: number): Int32Array => Int32Array.from(counts, (c, k) => (c <= sparse ? c : Math.min(c, Math.floor(f * c + offset[k]))));
  const total = (q: Int32Array): number => q.reduce((s, c) => s + c, 0);
  let lo = 0;
  let hi = 1;
  for (let it = 0; it < 50; it++) {
    const mid = 0.5 * (lo + hi);
    if (total(quotas(mid)) <= o.maxPoints) lo = mid;
    else hi = mid;
  }
  const fraction = lo;
  const quota = quotas(fraction);
  // Visit the stars in a random order (Fisher-Yates with the seeded generator) and keep each while its
  // cell is below its quota: a uniform random subset of every cell.
  const order = Int32Array.from(finite.keys());
  for (let k = order.length - 1; k > 0; k--) {
    const j = rand() % (k + 1);
    const t = order[k];
    order[k] = order[j];
    order[j] = t;
  }
  const taken = new Int32Array(nx * ny);
  const keep: number[] = [];
  for (const k of order) {
    const c = cellOf[k];
    if (taken[c] < quota[c]) {
      taken[c]++;
      keep.push(finite[k]);
    }
  }
  keep.sort((a, b) => a - b);
  return { index: Int32Array.from(keep), finite: finite.length, fraction, sparse, nx, ny };
}

/** A caption clause: what was drawn. */
export function describeThinning(t: Thinned): string {
  if (t.fraction >= 1) return `all ${t.finite.toLocaleString('en-US')} stars drawn`;
  const pct = 100 * t.fraction;
  return (
    `${t.index.length.toLocaleString('en-US')} of ${t.finite.toLocaleString('en-US')} stars drawn: on a ${t.nx} x ${t.ny} grid over the diagram, every star of the cells holding at most ${t.sparse}, ` +
    `and a random ${pct >= 1 ? pct.toPrecision(2) : pct.toPrecision(1)}% of the stars of every other cell, so that relative densities are kept and the rarest stars are all shown`
  );
}

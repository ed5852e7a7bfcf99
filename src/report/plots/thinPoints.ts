/**
 * Fewer points for a scatter plot of a large catalogue, without losing its sparse parts. The plane is cut
 * into cells; every cell keeps all its stars up to a common cap, and crowded cells keep a random subset of
 * that size. The cap is the largest that keeps the total within `maxPoints`. So giants, blue stragglers and
 * field stars are all drawn, and only the crowded main sequence is thinned, where a drawn point would hide
 * behind its neighbours anyway. Captions should say so (`describeThinning`).
 */
import mt19937 from '@stdlib/random-base-mt19937';

export interface ThinOptions {
  /** Most points to keep. */
  maxPoints: number;
  /** Cells across x and y (default 60 x 80: a CMD is taller than wide). */
  nx?: number;
  ny?: number;
  seed?: number;
}

export interface Thinned {
  /** Indices of the kept points (finite x and y), ascending. */
  index: Int32Array;
  /** Points with finite coordinates. */
  finite: number;
  /** Stars kept per cell at most; Infinity when nothing was thinned. */
  cap: number;
  nx: number;
  ny: number;
}

export function thinPoints(x: ArrayLike<number>, y: ArrayLike<number>, o: ThinOptions): Thinned {
  const nx = o.nx ?? 60;
  const ny = o.ny ?? 80;
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
  if (finite.length <= o.maxPoints) return { index: Int32Array.from(finite), finite: finite.length, cap: Infinity, nx, ny };

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
  // The largest cap whose kept total fits (the kept total grows with the cap): bisection.
  const kept = (cap: number): number => counts.reduce((s, c) => s + Math.min(c, cap), 0);
  let lo = 0;
  let hi = Math.max(...counts);
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (kept(mid) <= o.maxPoints) lo = mid;
    else hi = mid;
  }
  const cap = Math.max(1, lo);
  // Visit the stars in a random order (Fisher-Yates with a seeded generator) and keep each while its
  // cell is below the cap: a uniform random subset of every crowded cell.
  const rand = mt19937.factory({ seed: (o.seed ?? 1) >>> 0 });
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
    if (taken[c] < cap) {
      taken[c]++;
      keep.push(finite[k]);
    }
  }
  keep.sort((a, b) => a - b);
  return { index: Int32Array.from(keep), finite: finite.length, cap, nx, ny };
}

/** A caption clause: what was drawn. */
export function describeThinning(t: Thinned): string {
  if (!Number.isFinite(t.cap)) return `all ${t.finite.toLocaleString('en-US')} stars drawn`;
  return `${t.index.length.toLocaleString('en-US')} of ${t.finite.toLocaleString('en-US')} stars drawn: on a ${t.nx} x ${t.ny} grid over the diagram, crowded cells show a random ${t.cap} of their stars and sparser cells all of theirs`;
}

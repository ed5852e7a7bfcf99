/**
 * Smoothed 2-D histograms and the density levels that enclose given posterior masses, for corner plots.
 * A cell's "level" is the posterior mass of all cells at least as dense as it, so cells with level <= 0.68
 * form the 68% highest-density region (of the smoothed histogram).
 */
export interface Grid2d {
  nx: number;
  ny: number;
  x0: number;
  dx: number;
  y0: number;
  dy: number;
  /** Smoothed mass per cell, row-major (iy * nx + ix), as a fraction of all finite draws (so summing to at most 1). */
  mass: Float64Array;
  /** Enclosed-mass level of each cell. */
  level: Float64Array;
}

export function smoothedHistogram2d(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  xRange: [number, number],
  yRange: [number, number],
  bins = 40,
  smoothCells = 1,
): Grid2d {
  const nx = bins;
  const ny = bins;
  const dx = (xRange[1] - xRange[0]) / nx || 1;
  const dy = (yRange[1] - yRange[0]) / ny || 1;
  const raw = new Float64Array(nx * ny);
  let n = 0;
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) continue;
    n++;
    const ix = Math.floor((x[i] - xRange[0]) / dx);
    const iy = Math.floor((y[i] - yRange[0]) / dy);
    if (ix < 0 || iy < 0 || ix >= nx || iy >= ny) continue;
    raw[iy * nx + ix] += 1;
  }
  const mass = gaussianSmooth(raw, nx, ny, smoothCells);
  // Fractions of all draws, not of those inside the grid: a region labelled 95% must hold 95% of the
  // posterior, including the draws beyond the plotted range (about 1% for a corner plot's 0.5-99.5%
  // axes) and the smoothing kernel's tails that fall off the grid's edge.
  if (n > 0) for (let k = 0; k < mass.length; k++) mass[k] /= n;
  return { nx, ny, x0: xRange[0], dx, y0: yRange[0], dy, mass, level: enclosedLevels(mass) };
}

/** Separable Gaussian blur with sigma in cells (kernel truncated at 3 sigma). */
function gaussianSmooth(a: Float64Array, nx: number, ny: number, sigma: number): Float64Array {
  if (sigma <= 0) return a.slice();
  const r = Math.ceil(3 * sigma);
  const w = new Float64Array(2 * r + 1);
  for (let k = -r; k <= r; k++) w[k + r] = Math.exp((-0.5 * k * k) / (sigma * sigma));
  // Unit total weight, so that mass is conserved (except what falls off the grid's edges).
  const sum = w.reduce((a, b) => a + b, 0);
  for (let k = 0; k < w.length; k++) w[k] /= sum;
  const tmp = new Float64Array(a.length);
  const out = new Float64Array(a.length);
  for (let iy = 0; iy < ny; iy++)
    for (let ix = 0; ix < nx; ix++) {
      let s = 0;
      for (let k = -r; k <= r; k++) {
        const j = ix + k;
        if (j >= 0 && j < nx) s += w[k + r] * a[iy * nx + j];
      }
      tmp[iy * nx + ix] = s;
    }
  for (let iy = 0; iy < ny; iy++)
    for (let ix = 0; ix < nx; ix++) {
      let s = 0;
      for (let k = -r; k <= r; k++) {
        const j = iy + k;
        if (j >= 0 && j < ny) s += w[k + r] * tmp[j * nx + ix];
      }
      out[iy * nx + ix] = s;
    }
  return out;
}

function enclosedLevels(mass: Float64Array): Float64Array {
  const order = Array.from(mass.keys()).sort((i, j) => mass[j] - mass[i]);
  const level = new Float64Array(mass.length);
  let cum = 0;
  for (const k of order) {
    cum += mass[k];
    level[k] = cum;
  }
  return level;
}

/**
 * The density (smoothed cell mass) whose upper set holds `mass` of the posterior: the region
 * {cell mass >= threshold} is the `mass` highest-density region of the smoothed histogram.
 */
export function hdrThreshold(g: Grid2d, mass: number): number {
  let t = Infinity;
  let densest = 0;
  for (let k = 0; k < g.mass.length; k++) {
    densest = Math.max(densest, g.mass[k]);
    if (g.level[k] <= mass && g.mass[k] > 0) t = Math.min(t, g.mass[k]);
  }
  // When even the densest cell holds more than `mass`, the region is that cell alone.
  return t === Infinity ? densest : t;
}

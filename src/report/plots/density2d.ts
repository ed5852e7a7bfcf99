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
  /** Smoothed mass per cell, row-major (iy * nx + ix), summing to 1. */
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
    const ix = Math.floor((x[i] - xRange[0]) / dx);
    const iy = Math.floor((y[i] - yRange[0]) / dy);
    if (ix < 0 || iy < 0 || ix >= nx || iy >= ny) continue;
    raw[iy * nx + ix] += 1;
    n++;
  }
  const mass = gaussianSmooth(raw, nx, ny, smoothCells);
  let total = 0;
  for (const m of mass) total += m;
  if (total > 0) for (let k = 0; k < mass.length; k++) mass[k] /= total;
  void n;
  return { nx, ny, x0: xRange[0], dx, y0: yRange[0], dy, mass, level: enclosedLevels(mass) };
}

/** Separable Gaussian blur with sigma in cells (kernel truncated at 3 sigma). */
function gaussianSmooth(a: Float64Array, nx: number, ny: number, sigma: number): Float64Array {
  if (sigma <= 0) return a.slice();
  const r = Math.ceil(3 * sigma);
  const w = new Float64Array(2 * r + 1);
  for (let k = -r; k <= r; k++) w[k + r] = Math.exp((-0.5 * k * k) / (sigma * sigma));
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

import type { TopLevelSpec } from 'vega-lite';
import { contours } from 'd3-contour';
import { hdrThreshold, smoothedHistogram2d } from './density2d.js';
import { PLOT_CONFIG } from './theme.js';

export interface CornerParameter {
  name: string;
  label: string;
  /** Posterior draws (all chains pooled). */
  draws: ArrayLike<number>;
  /** A value to mark, e.g. the truth of a simulated cluster. */
  marker?: number;
  /** Title of the marginal panel; default `label = median +err -err` with three significant digits. */
  title?: string;
}

const FILL_68 = '#3b5b92';
const FILL_95 = '#a9bde0';

/**
 * A corner plot: 1-D marginals on the diagonal (histogram with the median and the 16-84% interval
 * marked), and below it each pair's joint posterior as a smoothed 2-D histogram with its 68% and 95%
 * highest-density regions filled. The regions' edges are contours of the smoothed histogram (marching
 * squares with linear interpolation, d3-contour), so they are smooth and the SVG stays small.
 */
export function cornerPlotSpec(params: CornerParameter[], opts: { panel?: number; title?: string } = {}): TopLevelSpec {
  const size = opts.panel ?? 120;
  const ranges = params.map((p) => robustRange(p.draws));
  const d = params.length;
  const panels: object[] = [];
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      const last = i === d - 1;
      if (j === i) panels.push(marginalPanel(params[i], ranges[i], size, last));
      else if (j < i) panels.push(jointPanel(params[j], params[i], ranges[j], ranges[i], size, j === 0, last));
      else panels.push({ width: size, height: size, data: { values: [] }, mark: 'point', view: { stroke: null } });
    }
  }
  // A wrapped concat with one column per parameter aligns every column; flush bounds lay out by the
  // panels alone, so axis labels and the wide titles of the diagonal do not push columns apart (they
  // fall on the outer edges or over the empty upper triangle).
  return {
    bounds: 'flush',
    spacing: 8,
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: { ...PLOT_CONFIG, concat: { spacing: 6 } },
    ...(opts.title ? { title: opts.title } : {}),
    columns: d,
    concat: panels,
  } as TopLevelSpec;
}

const X_LABELS = { labelAngle: -45, labelAlign: 'right', labelBaseline: 'top' } as const;

/**
 * Tick values at a round step (1, 2 or 5 x 10^k, two to five per axis) kept at least 10% of the range
 * away from both ends: panels sit a few pixels apart, and a label at a panel's end runs into its
 * neighbour's. The x labels are also turned by 45 degrees (see X_LABELS), since a corner plot's narrow
 * posteriors need five or six digits per label.
 */
export function innerTicks(range: [number, number]): { values: number[]; format: string } {
  const [lo, hi] = range;
  const w = hi - lo;
  if (!(w > 0)) return { values: [lo], format: '.4~g' };
  // The largest round step that puts at least two ticks inside the inner 80% (at most five then).
  const a = lo + 0.1 * w;
  const b = hi - 0.1 * w;
  let step = Math.pow(10, Math.ceil(Math.log10(w)));
  for (let k = 0; k < 12 && Math.floor(b / step) - Math.ceil(a / step) + 1 < 2; k++) step = [0.5, 0.4, 0.5][k % 3] * step;
  const values: number[] = [];
  for (let v = Math.ceil(a / step) * step; v <= b + 1e-12 * w; v += step) values.push(Number(v.toPrecision(12)));
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return { values, format: `.${decimals}f` };
}

function marginalPanel(p: CornerParameter, range: [number, number], size: number, showX: boolean): object {
  const bins = 30;
  const width = (range[1] - range[0]) / bins || 1;
  const counts = new Array<number>(bins).fill(0);
  for (let i = 0; i < p.draws.length; i++) {
    const k = Math.floor((p.draws[i] - range[0]) / width);
    if (k >= 0 && k < bins) counts[k]++;
  }
  const bars = counts.map((c, k) => ({ x0: range[0] + k * width, x1: range[0] + (k + 1) * width, c }));
  const [q16, q50, q84] = quantiles(p.draws, [0.16, 0.5, 0.84]);
  const rules = [q16, q50, q84].map((v, k) => ({ v, dash: k === 1 ? 0 : 1 }));
  const x = { scale: { domain: range, nice: false, zero: false }, axis: showX ? { title: p.label, ...innerTicks(range), ...X_LABELS } : { labels: false, title: null, ticks: false } };
  const layer: object[] = [
    { data: { values: bars }, mark: { type: 'rect', color: FILL_68, opacity: 0.8 }, encoding: { x: { field: 'x0', type: 'quantitative', ...x }, x2: { field: 'x1' }, y: { field: 'c', type: 'quantitative', axis: null }, y2: { datum: 0 } } },
    { data: { values: rules }, mark: { type: 'rule', color: '#222' }, encoding: { x: { field: 'v', type: 'quantitative' }, strokeDash: { field: 'dash', type: 'nominal', scale: { range: [[1, 0], [4, 3]] }, legend: null } } },
  ];
  if (p.marker !== undefined) layer.push({ data: { values: [{ v: p.marker }] }, mark: { type: 'rule', color: '#D55E00', strokeWidth: 1.5 }, encoding: { x: { field: 'v', type: 'quantitative' } } });
  return {
    width: size,
    height: size,
    title: { text: p.title ?? `${p.label} = ${fmt(q50)} +${fmt(q84 - q50)} -${fmt(q50 - q16)}`, fontSize: 10 },
    layer,
  };
}

function jointPanel(px: CornerParameter, py: CornerParameter, xr: [number, number], yr: [number, number], size: number, showY: boolean, showX: boolean): object {
  const g = smoothedHistogram2d(px.draws, py.draws, xr, yr, 40, 1.2);
  // The 95% region first, then the 68% one on top; a hole in a region is painted in the colour beneath it.
  const rings: { x: number; y: number; i: number; id: number; fill: string; region: string; hole: boolean }[] = [];
  const levels: [string, number, string, string][] = [
    ['95%', hdrThreshold(g, 0.95), FILL_95, 'white'],
    ['68%', hdrThreshold(g, 0.68), FILL_68, FILL_95],
  ];
  let ringId = 0;
  for (const [region, threshold, fill, holeFill] of levels) {
    for (const polygon of contours().size([g.nx, g.ny]).thresholds([threshold])(Array.from(g.mass))[0].coordinates) {
      polygon.forEach((ring, r) => {
        const id = ringId++;
        // d3-contour puts cell (ix, iy) at (ix + 0.5, iy + 0.5): grid coordinate gx is x0 + gx dx.
        ring.forEach(([gx, gy], i) => rings.push({ x: g.x0 + gx * g.dx, y: g.y0 + gy * g.dy, i, id, fill: r === 0 ? fill : holeFill, region, hole: r > 0 }));
      });
    }
  }
  const scale = (domain: [number, number]) => ({ domain, nice: false, zero: false });
  const layer: object[] = [
    {
      data: { values: rings },
      mark: { type: 'line', interpolate: 'linear-closed', strokeWidth: 0.6, clip: true },
      encoding: {
        x: { field: 'x', type: 'quantitative', scale: scale(xr), axis: showX ? { title: px.label, ...innerTicks(xr), ...X_LABELS } : { labels: false, title: null, ticks: false } },
        y: { field: 'y', type: 'quantitative', scale: scale(yr), axis: showY ? { title: py.label, ...innerTicks(yr) } : { labels: false, title: null, ticks: false } },
        order: { field: 'i', type: 'quantitative' },
        detail: { field: 'id', type: 'nominal' },
        fill: { field: 'fill', type: 'nominal', scale: null },
        stroke: { field: 'fill', type: 'nominal', scale: null },
      },
    },
  ];
  if (px.marker !== undefined && py.marker !== undefined) {
    layer.push({ data: { values: [{ x: px.marker, y: py.marker }] }, mark: { type: 'point', shape: 'cross', color: '#D55E00', size: 60, filled: true }, encoding: { x: { field: 'x', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' } } });
  }
  return { width: size, height: size, layer };
}

/** The 0.5%-99.5% range, widened slightly, so that a few stray draws do not squash the panel. */
function robustRange(d: ArrayLike<number>): [number, number] {
  const [lo, hi] = quantiles(d, [0.005, 0.995]);
  const pad = (hi - lo) * 0.08 || Math.abs(lo) * 1e-3 || 1e-3;
  return [lo - pad, hi + pad];
}

export function quantiles(d: ArrayLike<number>, qs: number[]): number[] {
  const s = Float64Array.from(d).sort();
  return qs.map((q) => {
    const h = (s.length - 1) * q;
    const i = Math.floor(h);
    return i + 1 < s.length ? s[i] + (h - i) * (s[i + 1] - s[i]) : s[i];
  });
}

function fmt(v: number): string {
  const a = Math.abs(v);
  return a >= 100 ? v.toFixed(1) : a >= 1 ? v.toFixed(3) : v.toPrecision(2);
}

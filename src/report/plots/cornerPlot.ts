import type { TopLevelSpec } from 'vega-lite';
import { smoothedHistogram2d } from './density2d.js';
import { PLOT_CONFIG } from './theme.js';

export interface CornerParameter {
  name: string;
  label: string;
  /** Posterior draws (all chains pooled). */
  draws: ArrayLike<number>;
  /** A value to mark, e.g. the truth of a simulated cluster. */
  marker?: number;
}

const FILL_68 = '#3b5b92';
const FILL_95 = '#a9bde0';

/**
 * A corner plot: 1-D marginals on the diagonal (histogram with the median and the 16-84% interval
 * marked), and below it each pair's joint posterior as a smoothed 2-D histogram with its 68% and 95%
 * highest-density regions filled.
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
  const x = { scale: { domain: range, nice: false, zero: false }, axis: showX ? { title: p.label, tickCount: 4 } : { labels: false, title: null, ticks: false } };
  const layer: object[] = [
    { data: { values: bars }, mark: { type: 'rect', color: FILL_68, opacity: 0.8 }, encoding: { x: { field: 'x0', type: 'quantitative', ...x }, x2: { field: 'x1' }, y: { field: 'c', type: 'quantitative', axis: null }, y2: { datum: 0 } } },
    { data: { values: rules }, mark: { type: 'rule', color: '#222' }, encoding: { x: { field: 'v', type: 'quantitative' }, strokeDash: { field: 'dash', type: 'nominal', scale: { range: [[1, 0], [4, 3]] }, legend: null } } },
  ];
  if (p.marker !== undefined) layer.push({ data: { values: [{ v: p.marker }] }, mark: { type: 'rule', color: '#D55E00', strokeWidth: 1.5 }, encoding: { x: { field: 'v', type: 'quantitative' } } });
  return {
    width: size,
    height: size,
    title: { text: `${p.label} = ${fmt(q50)} +${fmt(q84 - q50)} -${fmt(q50 - q16)}`, fontSize: 10 },
    layer,
  };
}

function jointPanel(px: CornerParameter, py: CornerParameter, xr: [number, number], yr: [number, number], size: number, showY: boolean, showX: boolean): object {
  const g = smoothedHistogram2d(px.draws, py.draws, xr, yr, 40, 1.2);
  const cells = [];
  for (let iy = 0; iy < g.ny; iy++)
    for (let ix = 0; ix < g.nx; ix++) {
      const lv = g.level[iy * g.nx + ix];
      if (lv > 0.95 || g.mass[iy * g.nx + ix] === 0) continue;
      cells.push({ x0: g.x0 + ix * g.dx, x1: g.x0 + (ix + 1) * g.dx, y0: g.y0 + iy * g.dy, y1: g.y0 + (iy + 1) * g.dy, r: lv <= 0.68 ? '68%' : '95%' });
    }
  const layer: object[] = [
    {
      data: { values: cells },
      // Cells are stroked in their own colour so that no hairline gaps show between them.
      mark: { type: 'rect', strokeWidth: 0.6 },
      encoding: {
        x: { field: 'x0', type: 'quantitative', scale: { domain: xr, nice: false, zero: false }, axis: showX ? { title: px.label, tickCount: 4 } : { labels: false, title: null, ticks: false } },
        x2: { field: 'x1' },
        y: { field: 'y0', type: 'quantitative', scale: { domain: yr, nice: false, zero: false }, axis: showY ? { title: py.label, tickCount: 4 } : { labels: false, title: null, ticks: false } },
        y2: { field: 'y1' },
        color: { field: 'r', type: 'nominal', scale: { domain: ['68%', '95%'], range: [FILL_68, FILL_95] }, title: 'credible region' },
        stroke: { field: 'r', type: 'nominal', scale: { domain: ['68%', '95%'], range: [FILL_68, FILL_95] }, legend: null },
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

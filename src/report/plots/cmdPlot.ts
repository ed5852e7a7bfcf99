import type { TopLevelSpec } from 'vega-lite';
import { LINE_COLOURS, PLOT_CONFIG, wrapTitle } from './theme.js';

/** A sequence to draw as a line in the CMD (an isochrone, or a band of them). */
export interface CmdCurve {
  label: string;
  colour: ArrayLike<number>;
  mag: ArrayLike<number>;
  /** Break the line where this changes (e.g. between the giant branch and the horizontal branch). */
  segment?: ArrayLike<number>;
  /** Line opacity, for posterior bands drawn as many faint lines. */
  opacity?: number;
  /** Line width in pixels (default 1.4). */
  width?: number;
}

/** Stars to draw as points, optionally shaded by a value in [0, 1] such as cluster membership. */
export interface CmdStars {
  colour: ArrayLike<number>;
  mag: ArrayLike<number>;
  shade?: ArrayLike<number>;
  shadeTitle?: string;
}

export interface CmdPlotOptions {
  title?: string;
  /** A second, smaller title line (e.g. the stellar model that made the curves). */
  subtitle?: string;
  xTitle: string;
  yTitle: string;
  curves?: CmdCurve[];
  stars?: CmdStars;
  width?: number;
  height?: number;
  /** Axis ranges; by default they fit the data. */
  xDomain?: [number, number];
  yDomain?: [number, number];
}

/**
 * A colour-magnitude diagram: colour on x, magnitude on y with bright stars at the top.
 * Returns a vega-lite spec; render it with report/render.ts.
 */
export function cmdPlotSpec(o: CmdPlotOptions): TopLevelSpec {
  const layers: NonNullable<Extract<TopLevelSpec, { layer: unknown }>['layer']> = [];
  const x = { field: 'x', type: 'quantitative' as const, title: o.xTitle, scale: { zero: false, nice: false, ...(o.xDomain ? { domain: o.xDomain } : {}) } };
  const y = { field: 'y', type: 'quantitative' as const, title: o.yTitle, scale: { zero: false, nice: false, reverse: true, ...(o.yDomain ? { domain: o.yDomain } : {}) } };

  if (o.stars) {
    const s = o.stars;
    const values = [];
    // Stars beyond fixed axis ranges are left out, not just clipped: they would only bloat the SVG (and
    // points far outside the canvas make resvg 2.6.2 panic when rasterising).
    const inX = (v: number): boolean => !o.xDomain || (v >= Math.min(...o.xDomain) && v <= Math.max(...o.xDomain));
    const inY = (v: number): boolean => !o.yDomain || (v >= Math.min(...o.yDomain) && v <= Math.max(...o.yDomain));
    for (let i = 0; i < s.mag.length; i++) {
      if (Number.isFinite(s.mag[i]) && Number.isFinite(s.colour[i]) && inX(s.colour[i]) && inY(s.mag[i])) values.push({ x: s.colour[i], y: s.mag[i], s: s.shade ? s.shade[i] : 1 });
    }
    layers.push({
      data: { values },
      // Smaller points the more there are (area in square pixels), so that crowded sequences keep their shape.
      mark: { type: 'square', size: Math.min(8, Math.max(2.5, 8 * Math.sqrt(1000 / Math.max(1, values.length)))), opacity: 0.6, strokeWidth: 0 },
      encoding: {
        x,
        y,
        ...(s.shade
          ? { color: { field: 's', type: 'quantitative', title: s.shadeTitle ?? 'membership', scale: { domain: [0, 1], range: ['#d9d9d9', '#1b1b1b'] } } }
          : { color: { value: '#333333' } }),
      },
    });
  }

  const curves = o.curves ?? [];
  if (curves.length > 0) {
    // One layer for all curves: curves sharing a label share a colour and a legend entry, and each
    // curve (and each segment of it) is drawn as its own polyline.
    const values = [];
    const labels: string[] = [];
    for (let k = 0; k < curves.length; k++) {
      const c = curves[k];
      if (!labels.includes(c.label)) labels.push(c.label);
      for (let i = 0; i < c.mag.length; i++) {
        if (Number.isFinite(c.mag[i]) && Number.isFinite(c.colour[i])) {
          values.push({ x: c.colour[i], y: c.mag[i], i, line: `${k}:${c.segment ? c.segment[i] : 0}`, label: c.label, a: c.opacity ?? 1, w: c.width ?? 1.4 });
        }
      }
    }
    layers.push({
      data: { values },
      mark: { type: 'line', clip: true },
      encoding: {
        x,
        y,
        order: { field: 'i', type: 'quantitative' },
        detail: { field: 'line', type: 'nominal' },
        opacity: { field: 'a', type: 'quantitative', scale: null, legend: null },
        strokeWidth: { field: 'w', type: 'quantitative', scale: null, legend: null },
        color: {
          field: 'label',
          type: 'nominal',
          title: null,
          scale: { domain: labels, range: LINE_COLOURS.slice(0, Math.max(1, labels.length)) },
          // One curve needs no legend: the title names it.
          ...(labels.length === 1 ? { legend: null } : { legend: { orient: 'right', labelLimit: 260 } }),
        },
      },
    });
  }

  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: PLOT_CONFIG,
    ...(o.title ? { title: { text: o.title, ...(o.subtitle ? { subtitle: wrapTitle(o.subtitle, o.width ?? 420, 10), subtitleFontSize: 10, subtitleColor: '#555' } : {}) } } : {}),
    width: o.width ?? 420,
    height: o.height ?? 520,
    layer: layers,
  };
}

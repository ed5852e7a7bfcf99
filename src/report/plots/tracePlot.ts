import type { TopLevelSpec } from 'vega-lite';
import { LINE_COLOURS, PLOT_CONFIG } from './theme.js';

export interface TraceParameter {
  label: string;
  /** values[w][s]: the parameter for walker w at stored step s. */
  walkers: ArrayLike<number>[];
  /** A group per walker (e.g. its ensemble): lines are coloured by group, with a legend. */
  groups?: number[];
}

/**
 * Trace plots: one panel per parameter, a line per walker against step, and the suggested burn-in marked.
 * Only a subset of walkers should be passed in; dozens of overlapping lines hide rather than show.
 */
export function tracePlotSpec(params: TraceParameter[], steps: ArrayLike<number>, opts: { burnIn?: number; width?: number } = {}): TopLevelSpec {
  const panels = params.map((p, k) => {
    const values = [];
    for (let w = 0; w < p.walkers.length; w++) {
      const series = p.walkers[w];
      const g = p.groups ? p.groups[w] : 0;
      for (let s = 0; s < series.length; s++) values.push({ step: steps[s], v: series[s], w, g });
    }
    const last = k === params.length - 1;
    const layer: object[] = [
      {
        data: { values },
        mark: { type: 'line', strokeWidth: 0.6, opacity: 0.7 },
        encoding: {
          x: { field: 'step', type: 'quantitative', scale: { nice: false }, axis: last ? { title: 'step' } : { labels: false, title: null } },
          // A fixed label extent keeps the panels aligned; an un-niced y domain keeps tick labels off the panel ends (flush end labels would crowd their neighbours).
          y: { field: 'v', type: 'quantitative', scale: { zero: false, nice: false, padding: 4 }, title: p.label, axis: { labelFlush: true, minExtent: 48, maxExtent: 48, tickCount: 4 } },
          detail: { field: 'w', type: 'nominal' },
          color: p.groups
            ? { field: 'g', type: 'nominal', title: 'ensemble', scale: { range: LINE_COLOURS } }
            : { value: '#3b5b92' },
        },
      },
    ];
    if (opts.burnIn !== undefined) {
      layer.push({ data: { values: [{ b: opts.burnIn }] }, mark: { type: 'rule', color: '#D55E00', strokeDash: [4, 3] }, encoding: { x: { field: 'b', type: 'quantitative' } } });
    }
    return { width: opts.width ?? 560, height: 90, layer };
  });
  return { $schema: 'https://vega.github.io/schema/vega-lite/v6.json', config: PLOT_CONFIG, bounds: 'flush', spacing: 22, vconcat: panels } as TopLevelSpec;
}

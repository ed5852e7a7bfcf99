import type { TopLevelSpec } from 'vega-lite';
import { LINE_COLOURS, PLOT_CONFIG } from './theme.js';

/**
 * The integrated autocorrelation time estimated on growing prefixes of the chain, per parameter, with the
 * line tau = N / 50: a chain is long enough (common practice documented with emcee) once every curve
 * lies below that line and has flattened.
 */
export function tauPlotSpec(lengths: ArrayLike<number>, tau: { label: string; values: ArrayLike<number> }[], opts: { width?: number } = {}): TopLevelSpec {
  const values = [];
  for (const t of tau) for (let i = 0; i < lengths.length; i++) if (Number.isFinite(t.values[i])) values.push({ n: lengths[i], tau: t.values[i], p: t.label });
  const nMax = lengths.length ? lengths[lengths.length - 1] : 1;
  const guide = [
    { n: lengths.length ? lengths[0] : 1, tau: (lengths.length ? lengths[0] : 1) / 50 },
    { n: nMax, tau: nMax / 50 },
  ];
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: PLOT_CONFIG,
    width: opts.width ?? 480,
    height: 300,
    layer: [
      {
        data: { values: guide },
        mark: { type: 'line', color: '#777', strokeDash: [5, 4] },
        encoding: { x: { field: 'n', type: 'quantitative', title: 'steps' }, y: { field: 'tau', type: 'quantitative' } },
      },
      {
        data: { values },
        mark: { type: 'line', point: { size: 12 } },
        encoding: {
          x: { field: 'n', type: 'quantitative', title: 'steps' },
          y: { field: 'tau', type: 'quantitative', title: 'estimated τ (steps)' },
          color: { field: 'p', type: 'nominal', title: null, scale: { range: LINE_COLOURS } },
        },
      },
    ],
  } as TopLevelSpec;
}

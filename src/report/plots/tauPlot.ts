import type { TopLevelSpec } from 'vega-lite';
import { LINE_COLOURS, PLOT_CONFIG } from './theme.js';

/**
 * The integrated autocorrelation time estimated on growing prefixes of the chain, per parameter, with the
 * line tau = N / 50: a chain is long enough (common practice documented with emcee) once every curve
 * lies below that line and has flattened. Both axes are logarithmic, as in emcee's documentation, so that
 * the early growth and the flat end are both visible and the guide is a straight line.
 */
export function tauPlotSpec(
  lengths: ArrayLike<number>,
  tau: { label: string; values: ArrayLike<number> }[],
  opts: { width?: number; xTitle?: string; log?: boolean } = {},
): TopLevelSpec {
  const values = [];
  for (const t of tau) for (let i = 0; i < lengths.length; i++) if (Number.isFinite(t.values[i]) && t.values[i] > 0) values.push({ n: lengths[i], tau: t.values[i], p: t.label });
  const n0 = lengths.length ? lengths[0] : 1;
  const nMax = lengths.length ? lengths[lengths.length - 1] : 1;
  const guide = [
    { n: n0, tau: n0 / 50 },
    { n: nMax, tau: nMax / 50 },
  ];
  const log = opts.log ?? true;
  const xTitle = opts.xTitle ?? 'steps';
  const x = { field: 'n', type: 'quantitative' as const, title: xTitle, scale: log ? { type: 'log' as const, nice: false } : { nice: false } };
  const y = { field: 'tau', type: 'quantitative' as const, title: 'estimated τ (steps)', scale: log ? { type: 'log' as const } : {} };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: PLOT_CONFIG,
    width: opts.width ?? 480,
    height: 300,
    layer: [
      {
        data: { values: guide },
        mark: { type: 'line', color: '#777', strokeDash: [5, 4] },
        encoding: { x, y },
      },
      {
        data: { values: [guide[1]] },
        mark: { type: 'text', text: 'τ = N / 50', align: 'right', dx: -4, dy: -8, color: '#555', fontSize: 11 },
        encoding: { x, y },
      },
      {
        data: { values },
        mark: { type: 'line', point: { size: 14 } },
        encoding: {
          x,
          y,
          // Legend in the order the parameters were given, not alphabetical.
          color: { field: 'p', type: 'nominal', title: null, scale: { domain: tau.map((t) => t.label), range: LINE_COLOURS } },
        },
      },
    ],
  } as TopLevelSpec;
}

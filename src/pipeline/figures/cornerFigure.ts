import type { ParameterInfo } from '../../core/parameters.js';
import { cornerPlotSpec } from '../../report/plots/cornerPlot.js';
import { fixed } from '../../report/significantDigits.js';
import type { RunPosterior } from '../runPosterior.js';
import type { RunFigure } from './runFigure.js';

/** An axis label with its unit (dex is left implicit: log ages and [Fe/H] are read in dex). */
export function axisLabel(p: ParameterInfo): string {
  const label = p.label || p.name;
  return p.unit && p.unit !== 'dex' ? `${label} (${p.unit})` : label;
}

/** The corner plot of every sampled parameter, with the truth marked when the run knows it. */
export function cornerFigure(p: RunPosterior): RunFigure {
  const truth = p.fit?.truth as Record<string, number | undefined> | undefined;
  const params = p.run.manifest.parameters.map((info, k) => {
    // The quoted numbers are the summary's, with the decimals its Monte Carlo error allows.
    const s = p.run.summary.parameters[k];
    const f = (x: number): string => fixed(x, s.decimals).replace(/^-/, '−');
    return {
      name: info.name,
      label: axisLabel(info),
      draws: p.draws[info.name],
      marker: truth?.[info.name],
      title: `${info.label || info.name} = ${f(s.median)} +${f(s.p84 - s.median)} −${f(s.median - s.p16)}`,
    };
  });
  const d = params.length;
  const marked = params.some((q) => q.marker !== undefined);
  const nDraws = p.nChains * p.nDraws;
  return {
    name: 'corner',
    title: 'Posterior distributions',
    caption:
      `Diagonal: the marginal posterior of each parameter (histogram of ${nDraws.toLocaleString('en-US')} draws after the burn-in; solid line the median, dashed lines the 16th and 84th percentiles, quoted above each panel). ` +
      `Below the diagonal: each pair's joint posterior, as a histogram on a 40 x 40 grid smoothed with a Gaussian of 1.2 cells, with its 68% (dark) and 95% (light) highest-density regions filled. ` +
      'Axes span the 0.5-99.5% range of the draws.' +
      (marked ? ' Orange lines and crosses mark the true values of the simulated cluster.' : ''),
    spec: cornerPlotSpec(params, { panel: d <= 3 ? 170 : d <= 5 ? 140 : 118 }),
  };
}

import { autocorrTimeSeries, chainsFromBuffer } from '../../diagnostics/index.js';
import { tauPlotSpec } from '../../report/plots/tauPlot.js';
import type { RunPosterior } from '../runPosterior.js';
import type { RunFigure } from './runFigure.js';

/**
 * tau of each parameter estimated on growing stretches of the kept chains (after the burn-in, the draws
 * the verdict judges), against the line tau = steps / 50.
 */
export function tauFigure(p: RunPosterior): RunFigure {
  const lengths: number[] = [];
  const tau = p.run.manifest.parameters.map((info) => {
    const series = autocorrTimeSeries(chainsFromBuffer(p.draws[info.name], p.nDraws, p.nChains), { points: 12, minDraws: 50, skipConstant: true });
    if (lengths.length === 0) for (const s of series) lengths.push(s.n * p.spacing);
    return { label: info.label || info.name, values: series.map((s) => s.tau * p.spacing) };
  });
  const burn = p.run.diagnosis.discard;
  return {
    name: 'tau',
    title: 'Autocorrelation time',
    caption:
      `The integrated autocorrelation time tau of each parameter (emcee's estimator with Sokal's window, c = 5; walkers' autocorrelations averaged), estimated on the first N steps after the burn-in of ${burn.toLocaleString('en-US')} steps, for growing N. ` +
      'Chains are long enough when every curve has flattened and lies below the dashed line tau = N / 50 (the 50 tau rule documented with emcee).',
    spec: tauPlotSpec(lengths, tau, { xTitle: 'steps after the burn-in (N)' }),
  };
}

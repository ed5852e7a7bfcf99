import { readRunChains } from '../../io/index.js';
import { tracePlotSpec } from '../../report/plots/tracePlot.js';
import type { RunPosterior } from '../runPosterior.js';
import { axisLabel } from './cornerFigure.js';
import type { RunFigure } from './runFigure.js';

/** Points per walker line at most: enough to show mixing, few enough for a small SVG. */
const MAX_POINTS = 600;

/**
 * Traces of a few walkers of every ensemble, over the whole run (burn-in included, and marked), read
 * thinned to at most MAX_POINTS points per line.
 */
export function traceFigure(p: RunPosterior, opts: { walkersPerEnsemble?: number } = {}): RunFigure {
  const { manifest, runDir } = p.run;
  const stored = p.run.files.reduce((m, f) => Math.min(m, f.nSteps), Infinity);
  const thin = Math.max(1, Math.ceil(stored / MAX_POINTS));
  const names = manifest.parameters.map((q) => q.name);
  const chains = readRunChains(runDir, manifest, { parameters: names, thin });
  const nw = chains.nWalkers;
  const perEnsemble = Math.min(nw, opts.walkersPerEnsemble ?? Math.max(1, Math.ceil(8 / chains.nEnsembles)));
  // Walkers spread over the ensemble (w = 0, nw / k, 2 nw / k, ...), the same ones in every panel.
  const picked: { ensemble: number; walker: number }[] = [];
  for (let k = 0; k < chains.nEnsembles; k++) for (let j = 0; j < perEnsemble; j++) picked.push({ ensemble: k, walker: Math.floor((j * nw) / perEnsemble) });
  const params = manifest.parameters.map((info) => ({
    label: axisLabel(info),
    walkers: picked.map(({ ensemble, walker }) => {
      const c = ensemble * nw + walker;
      return chains.values[info.name].subarray(c * chains.nDraws, (c + 1) * chains.nDraws);
    }),
    groups: picked.map(({ ensemble }) => ensemble),
  }));
  const steps = chains.steps;
  const burn = p.run.diagnosis.discard;
  return {
    name: 'trace',
    title: 'Walker traces',
    caption:
      `Each parameter against step for ${picked.length} of the ${(chains.nEnsembles * nw).toLocaleString('en-US')} walkers (${perEnsemble} per ensemble, coloured by ensemble)` +
      `${thin * p.spacing > 1 ? `, every ${(thin * p.spacing).toLocaleString('en-US')}th step shown` : ''}. ` +
      `The dashed line marks the end of the burn-in (${burn.toLocaleString('en-US')} steps, ${p.run.discardSource === 'given' ? 'as given' : 'suggested from tau'}); only later steps enter the summary. ` +
      'Well-mixed walkers wander over the same band without trends, steps or stuck stretches.',
    spec: tracePlotSpec(params, steps, { burnIn: burn }),
  };
}

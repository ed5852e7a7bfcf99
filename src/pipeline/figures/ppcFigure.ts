import mt19937 from '@stdlib/random-base-mt19937';
import type { BandId } from '../../core/bands.js';
import type { StarsTable } from '../../io/index.js';
import { cmdPlotSpec } from '../../report/plots/cmdPlot.js';
import { sideBySideSpec } from '../../report/plots/sideBySide.js';
import { describeThinning, thinPoints } from '../../report/plots/thinPoints.js';
import type { CmdAxes } from '../isochronePlot.js';
import { posteriorPredictiveCatalogue, type PredictiveCatalogue } from '../posteriorPredictive.js';
import type { RunPosterior } from '../runPosterior.js';
import type { StellarSetup } from '../stellarModel.js';
import { colourTitle } from './cmdAxes.js';
import { cmdDomain, insideOnly, starColourMag } from './cmdFigure.js';
import type { RunFigure } from './runFigure.js';

const PANEL = { width: 330, height: 460 };

function lawText(b: BandId, l: NonNullable<PredictiveCatalogue['errorLaws'][BandId]>): string {
  return `${b}: ${l.a.toPrecision(2)} + ${l.b.toPrecision(2)} x 10^(0.4 (m - ${l.mRef.toFixed(2)}))`;
}

/**
 * The observed CMD beside one simulated from the posterior with the likelihood's forward model, on the
 * same axes and thinned the same way.
 */
/** A random `n` of `total` indices (seeded), as a mask. */
function randomSubset(total: number, n: number, seed: number): Uint8Array {
  const rand = mt19937.factory({ seed: (seed >>> 0) || 1 });
  const mask = new Uint8Array(total);
  // Selection sampling (Knuth's algorithm S): each index kept with probability (still needed) / (still left).
  let need = n;
  for (let i = 0; i < total && need > 0; i++) {
    if ((rand() + 0.5) / 4294967296 * (total - i) < need) {
      mask[i] = 1;
      need--;
    }
  }
  return mask;
}

export function ppcFigure(p: RunPosterior, stars: StarsTable, setup: StellarSetup, o: { axes: CmdAxes; seed: number; maxPoints: number; maxStars: number }): RunFigure {
  const fit = p.fit!;
  const sim = posteriorPredictiveCatalogue(p, stars, setup, { seed: o.seed, maxStars: o.maxStars });
  const obs = starColourMag(stars, o.axes);
  // A capped simulation is compared with as many observed stars, chosen at random, so that both panels
  // show catalogues of one size (the axes still follow the whole catalogue's members).
  const subset = sim.nStars < stars.nStars ? randomSubset(stars.nStars, sim.nStars, o.seed + 2) : undefined;
  const obsShown = subset ? Float64Array.from(obs.colour, (c, i) => (subset[i] ? c : Number.NaN)) : obs.colour;
  const idx = (b: BandId): Float64Array => sim.mag[sim.bands.indexOf(b)];
  const simColour = idx(o.axes.blue).map((v, i) => v - idx(o.axes.red)[i]);
  const simMag = Float64Array.from(idx(o.axes.mag));
  // Both panels on the observed CMD's axes (cmdFigure's); simulated stars beyond them are counted, not drawn.
  const membership = stars.pSingle.map((v, i) => v + stars.pBinary[i]);
  const dom = cmdDomain(obs.colour, obs.mag, membership);
  const simInside = insideOnly(simColour, simMag, dom);
  let outside = 0;
  for (let i = 0; i < simColour.length; i++) if (Number.isFinite(simColour[i]) && Number.isFinite(simMag[i]) && !Number.isFinite(simInside[i])) outside++;
  const thinObs = thinPoints(insideOnly(obsShown, obs.mag, dom), obs.mag, { maxPoints: o.maxPoints, seed: o.seed });
  const thinSim = thinPoints(simInside, simMag, { maxPoints: o.maxPoints, seed: o.seed + 1 });
  const panel = (title: string, colour: ArrayLike<number>, mag: ArrayLike<number>, keep: Int32Array) =>
    cmdPlotSpec({
      title,
      xTitle: colourTitle(o.axes),
      yTitle: o.axes.mag,
      xDomain: dom.x,
      yDomain: dom.y,
      ...PANEL,
      stars: { colour: Array.from(keep, (i) => colour[i]), mag: Array.from(keep, (i) => mag[i]) },
    });
  const perDraw = Math.round(sim.nStars / sim.nDraws);
  const laws = sim.bands.map((b) => lawText(b, sim.errorLaws[b]!)).join('; ');
  const lawSource = sim.bands.every((b) => sim.errorLaws[b]!.source === 'config') ? 'from the config' : 'fitted to the catalogue\'s errors where the config gives none';
  const nField = sim.component.reduce((s, c) => s + (c === 2 ? 1 : 0), 0);
  return {
    name: 'ppc',
    title: 'Posterior-predictive check',
    caption:
      `Left: ${subset ? `a random ${sim.nStars.toLocaleString('en-US')} of the ${stars.nStars.toLocaleString('en-US')} observed stars, as many as were simulated` : `the ${stars.nStars.toLocaleString('en-US')} observed stars`} (${describeThinning(thinObs)}${!subset && dom.outside > 0 ? `; ${dom.outside.toLocaleString('en-US')} lie beyond the axes` : ''}). ` +
      `Right: ${sim.nStars.toLocaleString('en-US')} stars simulated with the likelihood's own forward model at ${sim.nDraws} draws from the posterior (about ${perDraw.toLocaleString('en-US')} each; ${nField.toLocaleString('en-US')} of them field stars), drawn the same way (${describeThinning(thinSim)}). ` +
      `Same axes as the observed CMD${outside > 0 ? ` (${outside.toLocaleString('en-US')} simulated stars fall beyond them and are not shown)` : ''}. The selection window is ${sim.limitsSource === 'config' ? 'the config\'s limits' : 'the observed range in each band'}, the IMF, binaries and completeness are the config's${sim.kdeField ? ' (but the field is drawn uniform over the window: the forward model has no KDE field)' : ''}, and the photometric errors follow sigma(m) ${lawSource} (${laws}). ` +
      `If the model describes the data, the two panels look alike: compare the width of the main sequence, the turnoff and subgiant branch, the giant branch, the binary sequence and the field, and how many stars each holds. Stars that no panel on the right reproduces (e.g. blue stragglers) are outside the model. Model: ${fit.model.name}.`,
    spec: sideBySideSpec(
      [
        panel(subset ? `observed (random ${sim.nStars.toLocaleString('en-US')} of ${stars.nStars.toLocaleString('en-US')})` : `observed (${stars.nStars.toLocaleString('en-US')} stars)`, obs.colour, obs.mag, thinObs.index),
        panel(`simulated from the posterior (${sim.nStars.toLocaleString('en-US')} stars)`, simColour, simMag, thinSim.index),
      ],
      { title: 'Observed and posterior-predictive CMDs', subtitle: `stellar model: ${fit.model.name}`, widthPx: 2 * PANEL.width },
    ),
  };
}

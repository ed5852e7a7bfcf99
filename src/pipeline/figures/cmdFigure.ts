import { cmdPlotSpec, type CmdCurve } from '../../report/plots/cmdPlot.js';
import { pixelScale, simplifyCurve } from '../../report/plots/simplifyCurve.js';
import { describeThinning, thinPoints } from '../../report/plots/thinPoints.js';
import type { StarsTable } from '../../io/index.js';
import type { CmdAxes } from '../isochronePlot.js';
import type { RunPosterior } from '../runPosterior.js';
import type { StellarSetup } from '../stellarModel.js';
import { colourTitle } from './cmdAxes.js';
import { posteriorIsochrones } from './posteriorIsochrones.js';
import type { RunFigure } from './runFigure.js';

export interface CmdFigureOptions {
  axes: CmdAxes;
  /** Posterior draws whose isochrones form the band. */
  nIsochrones: number;
  /** Most stars drawn (see thinPoints). */
  maxPoints: number;
  seed: number;
}

export const CMD_SIZE = { width: 400, height: 500 };

/** Colour and magnitude of every star on the axes (NaN where a band is missing). */
export function starColourMag(stars: StarsTable, axes: CmdAxes): { colour: Float64Array; mag: Float64Array } {
  const blue = stars.mag[axes.blue] as Float64Array;
  const red = stars.mag[axes.red] as Float64Array;
  return { colour: blue.map((v, i) => v - red[i]), mag: Float64Array.from(stars.mag[axes.mag] as Float64Array) };
}

/** Axis ranges that hold every star, padded by 4% (magnitudes ascending; the plot reverses them). */
export function cmdDomain(colour: ArrayLike<number>, mag: ArrayLike<number>): { x: [number, number]; y: [number, number] } {
  const range = (a: ArrayLike<number>): [number, number] => {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < a.length; i++) {
      if (!Number.isFinite(a[i])) continue;
      lo = Math.min(lo, a[i]);
      hi = Math.max(hi, a[i]);
    }
    const pad = 0.04 * (hi - lo || 1);
    return [lo - pad, hi + pad];
  };
  return { x: range(colour), y: range(mag) };
}

/**
 * The observed CMD: stars shaded by posterior cluster membership, a band of isochrones at posterior draws
 * and the isochrone at the posterior medians.
 */
export function cmdFigure(p: RunPosterior, stars: StarsTable, setup: StellarSetup, o: CmdFigureOptions): RunFigure {
  const fit = p.fit;
  if (!fit) throw new Error('cmdFigure needs a run made by a fit');
  const { colour, mag } = starColourMag(stars, o.axes);
  const membership = stars.pSingle.map((s, i) => s + stars.pBinary[i]);
  const dom = cmdDomain(colour, mag);
  const thin = thinPoints(colour, mag, { maxPoints: o.maxPoints, seed: o.seed });
  // Members last, so that they are drawn on top of the field.
  const order = Array.from(thin.index).sort((a, b) => membership[a] - membership[b]);
  const iso = posteriorIsochrones(p, setup, o.axes, { nDraws: o.nIsochrones, seed: o.seed });
  const scale = pixelScale(CMD_SIZE.width, CMD_SIZE.height, dom.x, dom.y);
  const curves: CmdCurve[] = [...iso.draws, iso.median].map((c) => simplifyCurve(c, scale));
  const nPost = (stars.meta.nDraws ?? stars.meta.draws) as number | undefined;
  const ext = fit.model.extinction;
  return {
    name: 'cmd',
    title: 'Colour-magnitude diagram with the fitted isochrones',
    caption:
      `The ${stars.nStars.toLocaleString('en-US')} catalogue stars the fit used (${describeThinning(thin)}), shaded by their posterior probability of belonging to the cluster (single or binary; black = member, light grey = field)` +
      `${typeof nPost === 'number' ? `, averaged over ${nPost.toLocaleString('en-US')} posterior draws` : ''}. ` +
      `Thin blue lines: isochrones at ${iso.draws.length} random draws from the posterior${iso.failed ? ` (${iso.failed} more fell outside the model's range)` : ''}; vermillion line: the isochrone at the posterior median of each parameter. ` +
      `Each isochrone has its draw's distance modulus and extinction applied (${ext.split(';')[0]}), and shows single stars: unresolved binaries lie up to 0.75 mag above it. Model: ${fit.model.name}.`,
    spec: cmdPlotSpec({
      title: 'Observed CMD and posterior isochrones',
      subtitle: `stellar model: ${fit.model.name}`,
      xTitle: colourTitle(o.axes),
      yTitle: o.axes.mag,
      xDomain: dom.x,
      yDomain: dom.y,
      ...CMD_SIZE,
      stars: { colour: order.map((i) => colour[i]), mag: order.map((i) => mag[i]), shade: order.map((i) => membership[i]), shadeTitle: 'P(member)' },
      curves,
    }),
  };
}

import { cmdPlotSpec, type CmdCurve } from '../../report/plots/cmdPlot.js';
import { quantiles } from '../../report/plots/cornerPlot.js';
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

function padded(lo: number, hi: number, frac: number, min: number): [number, number] {
  const pad = Math.max(frac * (hi - lo), min);
  return [lo - pad, hi + pad];
}

/**
 * Axis ranges. Magnitudes: every star, padded by 4% (ascending; the plot reverses them). Colours: the
 * 0.5-99.5% range of the likely members (posterior membership above one half) when there are at least
 * 20, padded by 10% or 0.15 mag, so that neither a field spread over many magnitudes of colour nor a few
 * stray measurements squash the cluster's sequences; else every star. Stars outside are counted
 * (`outside`), not drawn.
 */
export function cmdDomain(colour: ArrayLike<number>, mag: ArrayLike<number>, membership?: ArrayLike<number>): { x: [number, number]; y: [number, number]; outside: number } {
  let yLo = Infinity;
  let yHi = -Infinity;
  let xLo = Infinity;
  let xHi = -Infinity;
  const memberColours: number[] = [];
  for (let i = 0; i < mag.length; i++) {
    if (!Number.isFinite(mag[i]) || !Number.isFinite(colour[i])) continue;
    yLo = Math.min(yLo, mag[i]);
    yHi = Math.max(yHi, mag[i]);
    xLo = Math.min(xLo, colour[i]);
    xHi = Math.max(xHi, colour[i]);
    if (membership && membership[i] > 0.5) memberColours.push(colour[i]);
  }
  let x = padded(xLo, xHi, 0.04, 0.05);
  if (memberColours.length >= 20) {
    const [lo, hi] = quantiles(memberColours, [0.005, 0.995]);
    x = padded(lo, hi, 0.1, 0.15);
  }
  const y = padded(yLo, yHi, 0.04, 0.05);
  let outside = 0;
  for (let i = 0; i < mag.length; i++) {
    if (!Number.isFinite(mag[i]) || !Number.isFinite(colour[i])) continue;
    if (colour[i] < x[0] || colour[i] > x[1] || mag[i] < y[0] || mag[i] > y[1]) outside++;
  }
  return { x, y, outside };
}

/** A copy of `colour` with NaN where the star lies outside the ranges (so it is neither thinned nor drawn). */
export function insideOnly(colour: ArrayLike<number>, mag: ArrayLike<number>, dom: { x: [number, number]; y: [number, number] }): Float64Array {
  return Float64Array.from(colour, (c, i) => (c >= dom.x[0] && c <= dom.x[1] && mag[i] >= dom.y[0] && mag[i] <= dom.y[1] ? c : Number.NaN));
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
  const dom = cmdDomain(colour, mag, membership);
  const thin = thinPoints(insideOnly(colour, mag, dom), mag, { maxPoints: o.maxPoints, seed: o.seed });
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
      `The ${stars.nStars.toLocaleString('en-US')} catalogue stars the fit used (${describeThinning(thin)}${dom.outside > 0 ? `; ${dom.outside.toLocaleString('en-US')} stars lie beyond the colour range of the likely members and are not shown` : ''}), shaded by their posterior probability of belonging to the cluster (single or binary; black = member, light grey = field)` +
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

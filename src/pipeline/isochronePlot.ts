import type { BandId } from '../core/bands.js';
import { UsageError } from '../core/errors.js';
import { cmdPlotSpec, type CmdCurve } from '../report/plots/cmdPlot.js';
import { renderSvg } from '../report/render.js';
import type { IsochroneTable } from './isochroneTable.js';

/** A colour (`B-V`) and a magnitude (`V`) to plot, checked against the bands at hand. */
export interface CmdAxes {
  blue: BandId;
  red: BandId;
  mag: BandId;
}

export function parseCmdAxes(colour: string, mag: string, bands: readonly BandId[], flags = '--plot-colour / --plot-mag', bandsHint = 'add the bands to --bands, or'): CmdAxes {
  const parts = colour.split('-');
  const known = (b: string): b is BandId => (bands as readonly string[]).includes(b);
  if (parts.length !== 2 || !known(parts[0]) || !known(parts[1]) || !known(mag)) {
    throw new UsageError(`cannot plot colour "${colour}" against magnitude "${mag}"`, {
      expected: `a colour of two requested bands, e.g. ${bands[0]}-${bands[1] ?? bands[0]}, and one requested band (${bands.join(', ')})`,
      hint: `${bandsHint} change ${flags}`,
    });
  }
  return { blue: parts[0], red: parts[1], mag };
}

/**
 * One isochrone as a CMD curve, broken into segments where the evolutionary phase changes with a jump in
 * magnitude: the giant-branch tip and the zero-age horizontal branch share an initial mass but are far
 * apart in the CMD, and must not be joined by a line.
 */
export function isochroneCurve(t: IsochroneTable, axes: CmdAxes, label: string, style: { opacity?: number; width?: number } = {}): CmdCurve {
  const iso = t.isochrone;
  const idx = (b: BandId): number => iso.bands.indexOf(b);
  const blue = t.mags[idx(axes.blue)];
  const red = t.mags[idx(axes.red)];
  const mag = t.mags[idx(axes.mag)];
  const colour = blue.map((v, k) => v - red[k]);
  const segment = new Float64Array(iso.phase.length);
  let seg = 0;
  for (let k = 1; k < iso.phase.length; k++) {
    if (iso.phase[k] !== iso.phase[k - 1] && Math.abs(mag[k] - mag[k - 1]) > 0.2) seg++;
    segment[k] = seg;
  }
  return { label, colour, mag, segment, ...style };
}

/** A quick CMD of one isochrone, one curve per evolutionary phase so that the jump to the HB is not drawn. */
export async function isochronePlotSvg(t: IsochroneTable, axes: CmdAxes): Promise<string> {
  const iso = t.isochrone;
  const ageGyr = 10 ** (iso.logAgeYr - 9);
  const curve = isochroneCurve(t, axes, `${ageGyr.toPrecision(3)} Gyr, [Fe/H] = ${iso.feh}`);
  const prefix = t.apparent ? '' : 'M_';
  return renderSvg(
    cmdPlotSpec({
      title: curve.label,
      subtitle: iso.provenance.model,
      xTitle: `${axes.blue} − ${axes.red}${t.apparent ? '' : ' (intrinsic)'}`,
      yTitle: `${prefix}${axes.mag}`,
      curves: [curve],
    }),
  );
}

/**
 * Which colour and magnitude a run's CMD shows. By default: Gaia's BP-RP against G when the fit has all
 * three (the usual Gaia CMD); otherwise the two bluest fitted bands for the colour (U left out when three or
 * more bands are fitted: U-B is rarely the CMD people look at) and the redder of the two as magnitude,
 * e.g. B-V against V, or V-I against I. Users choose others with --colour and --mag.
 */
import { BANDS, type BandId } from '../../core/bands.js';
import { parseCmdAxes, type CmdAxes } from '../isochronePlot.js';

export function defaultCmdAxes(bands: readonly BandId[]): CmdAxes {
  if (bands.includes('BP') && bands.includes('RP') && bands.includes('G')) return { blue: 'BP', red: 'RP', mag: 'G' };
  let byColour = [...bands].sort((a, b) => BANDS[b].xInvUm - BANDS[a].xInvUm);
  if (byColour.length >= 3) byColour = byColour.filter((b) => b !== 'U');
  const [blue, red] = byColour;
  return { blue, red: red ?? blue, mag: red ?? blue };
}

/** The axes asked for (either may be omitted), checked against the fitted bands. */
export function cmdAxesFor(bands: readonly BandId[], colour?: string, mag?: string): CmdAxes {
  if (colour === undefined && mag === undefined) return defaultCmdAxes(bands);
  const d = defaultCmdAxes(bands);
  const c = colour ?? `${d.blue}-${d.red}`;
  const m = mag ?? (colour !== undefined ? colour.split('-')[1] ?? '' : d.mag);
  return parseCmdAxes(c, m, bands, '--colour / --mag', 'the run fitted only the bands listed;');
}

export function colourTitle(a: CmdAxes): string {
  return `${a.blue} − ${a.red}`;
}

/**
 * Isochrones for the CMD: one at each of a few posterior draws (the band), and one at the posterior
 * medians, all with the draw's distance modulus and extinction applied, as the likelihood compares them
 * with the stars.
 */
import mt19937 from '@stdlib/random-base-mt19937';
import type { BandId } from '../../core/bands.js';
import { CoevalError, InputError } from '../../core/errors.js';
import type { ClusterParameterName } from '../../core/parameters.js';
import type { CmdCurve } from '../../report/plots/cmdPlot.js';
import { isochroneCurve, type CmdAxes } from '../isochronePlot.js';
import { isochroneTable } from '../isochroneTable.js';
import { parameterAt, parameterMedian, type RunPosterior } from '../runPosterior.js';
import type { StellarSetup } from '../stellarModel.js';

const NEEDED: ClusterParameterName[] = ['log_age', 'feh', 'dm', 'ebv'];

export interface PosteriorIsochrones {
  draws: CmdCurve[];
  median: CmdCurve;
  /** Draws whose isochrone the model could not make (outside its domain). */
  failed: number;
}

function axesBands(a: CmdAxes): BandId[] {
  return [...new Set([a.blue, a.red, a.mag])];
}

/** Parameters of one isochrone, from a getter; a missing one is an error naming the manifest key. */
function isochroneParameters(get: (n: ClusterParameterName) => number | undefined, runDir: string): Record<'log_age' | 'feh' | 'dm' | 'ebv', number> {
  const out = {} as Record<'log_age' | 'feh' | 'dm' | 'ebv', number>;
  for (const n of NEEDED) {
    const v = get(n);
    if (v === undefined || !Number.isFinite(v)) {
      throw new InputError(`the run neither samples nor fixes ${n}, so its isochrones cannot be drawn`, {
        where: { file: `${runDir}/manifest.json`, key: `fit.fixed.${n}` },
        expected: `${n} among the sampled parameters or in fit.fixed`,
      });
    }
    out[n as 'log_age'] = v;
  }
  return out;
}

export function posteriorIsochrones(p: RunPosterior, setup: StellarSetup, axes: CmdAxes, o: { nDraws: number; seed: number }): PosteriorIsochrones {
  const bands = axesBands(axes);
  const make = (q: Record<'log_age' | 'feh' | 'dm' | 'ebv', number>, label: string, style: { opacity?: number; width?: number } = {}): CmdCurve =>
    isochroneCurve(isochroneTable(setup.source, setup.extinction, { logAgeYr: q.log_age, feh: q.feh, bands, dm: q.dm, ebv: q.ebv }), axes, label, style);
  const median = make(isochroneParameters((n) => parameterMedian(p, n), p.run.runDir), 'posterior medians', { width: 1.2 });
  const total = p.nChains * p.nDraws;
  const rand = mt19937.factory({ seed: (o.seed >>> 0) || 1 });
  const n = Math.min(o.nDraws, total);
  const draws: CmdCurve[] = [];
  let failed = 0;
  for (let k = 0; k < n; k++) {
    const i = rand() % total;
    try {
      draws.push(make(isochroneParameters((name) => parameterAt(p, name, i), p.run.runDir), `${n} posterior draws`, { opacity: n > 30 ? 0.15 : 0.3, width: 0.8 }));
    } catch (err) {
      // A draw outside the model's domain (possible only at the edge of a prior wider than the model).
      if (err instanceof CoevalError && err.kind === 'model') failed++;
      else throw err;
    }
  }
  return { draws, median, failed };
}

import type { StarsTable } from '../../io/index.js';
import type { CmdAxes } from '../isochronePlot.js';
import type { RunPosterior } from '../runPosterior.js';
import type { StellarSetup } from '../stellarModel.js';
import type { RunFigure } from './runFigure.js';

/** Placeholder until the forward model lands on main. */
export async function ppcFigure(_p: RunPosterior, _stars: StarsTable, _setup: StellarSetup, _o: { axes: CmdAxes; seed: number; maxPoints: number }): Promise<RunFigure> {
  throw new Error('not yet');
}

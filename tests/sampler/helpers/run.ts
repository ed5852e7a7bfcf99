/** Runs K in-thread ensembles on a target and returns their chains, for the statistical checks. */
import { MemorySink } from '../../../src/sampler/chainSink.js';
import { inThreadEvaluator } from '../../../src/sampler/evaluator.js';
import type { InitMethod } from '../../../src/sampler/initialize.js';
import type { Move, WeightedMove } from '../../../src/sampler/moves/move.js';
import { createEnsembles, runEnsembles } from '../../../src/sampler/runEnsembles.js';
import type { LogDensity } from '../../../src/sampler/types.js';

export interface RunResultForTests {
  /** Per ensemble: rows x walkers x ndim after the burn-in. */
  chains: Float64Array[];
  /** Per ensemble: rows x walkers x nBlobs after the burn-in. */
  blobs: Float64Array[];
  nRows: number;
  nWalkers: number;
  ndim: number;
  /** Acceptance fraction of each ensemble over the whole run. */
  acceptance: number[];
  moveAcceptance: number[][];
  /** Per ensemble: steps taken by each move of the mixture. */
  moveSteps: number[][];
}

export async function runTarget(o: {
  density: LogDensity;
  nWalkers: number;
  nEnsembles: number;
  steps: number;
  burn: number;
  seed: number;
  moves?: Move | WeightedMove[];
  init: InitMethod;
}): Promise<RunResultForTests> {
  const evaluator = inThreadEvaluator(o.density);
  const { samplers } = await createEnsembles({ evaluator, seed: o.seed, nEnsembles: o.nEnsembles, nWalkers: o.nWalkers, moves: o.moves, init: o.init });
  const sink = new MemorySink();
  const res = await runEnsembles({ samplers, stop: { kind: 'fixed', steps: o.steps }, sink, handleSignals: false });
  const ndim = o.density.ndim;
  const nBlobs = o.density.blobNames.length;
  const chains: Float64Array[] = [];
  const blobs: Float64Array[] = [];
  for (let e = 0; e < o.nEnsembles; e++) {
    const kept = sink.states[e].filter((s) => s.step > o.burn);
    const c = new Float64Array(kept.length * o.nWalkers * ndim);
    const b = new Float64Array(kept.length * o.nWalkers * nBlobs);
    kept.forEach((s, i) => {
      c.set(s.positions, i * o.nWalkers * ndim);
      b.set(s.blobs, i * o.nWalkers * nBlobs);
    });
    chains.push(c);
    blobs.push(b);
  }
  return {
    chains,
    blobs,
    nRows: o.steps - o.burn,
    nWalkers: o.nWalkers,
    ndim,
    acceptance: res.acceptance,
    moveAcceptance: samplers.map((s) => s.mixture.acceptance()),
    moveSteps: samplers.map((s) => Array.from(s.mixture.proposed, (p) => p / o.nWalkers)),
  };
}

/** Series y_t = mean over walkers of g(x_{w,t}) for each ensemble. */
export function walkerMeanSeries(r: RunResultForTests, g: (x: Float64Array, off: number) => number): Float64Array[] {
  return r.chains.map((c) => {
    const y = new Float64Array(r.nRows);
    for (let t = 0; t < r.nRows; t++) {
      let s = 0;
      for (let w = 0; w < r.nWalkers; w++) s += g(c, (t * r.nWalkers + w) * r.ndim);
      y[t] = s / r.nWalkers;
    }
    return y;
  });
}

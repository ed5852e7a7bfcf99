/**
 * The likelihood's cost per evaluation, isochrone build included: 10^3, 10^4 and 10^5 stars in 3 bands,
 * with binaries and field stars, drawn from the model itself. Until the built-in stellar model lands this
 * uses the synthetic test isochrones (tests/helpers), whose build cost is small. Reference in the same run:
 * the unpruned fast path (every segment integrated for every star) on 10^3 stars.
 */
import { CmdLikelihood } from '../src/likelihood/cmdLikelihood.js';
import { simulateCatalog } from '../src/likelihood/simulate.js';
import { SyntheticIsochrones, TestExtinction } from '../tests/helpers/syntheticIsochrones.js';
import { medianMs, timeRepeated, type BenchGroup } from './harness.js';

const theta = { logAgeYr: 9.9, feh: -1.0, dm: 14.5, ebv: 0.05, fBinary: 0.3, fField: 0.1, sigmaExtra: 0.01 };
const limits = { B: { bright: 12, faint: 22.5 }, V: { bright: 12, faint: 22 }, I: { bright: 11, faint: 21.5 } };
const errorLaw = { B: { a: 0.005, b: 0.05, mRef: 22.5 }, V: { a: 0.005, b: 0.05, mRef: 22 }, I: { a: 0.005, b: 0.05, mRef: 21.5 } };

function build(n: number, prune = true, fBinary = theta.fBinary): CmdLikelihood {
  const src = new SyntheticIsochrones();
  const ext = new TestExtinction();
  const sim = simulateCatalog({ seed: 7, nStars: n, bands: ['B', 'V', 'I'], theta: { ...theta, fBinary }, errorLaw, likelihood: { limits } }, src, ext);
  return new CmdLikelihood(sim.catalog, src, ext, { limits, prune });
}

export const likelihoodBench: BenchGroup = {
  name: 'likelihood',
  describe: 'mixture likelihood: ms per evaluation (isochrone build included), 3 bands, binaries and field',
  async run(ctx) {
    ctx.log('machine shared with other developers (2 cores): timings are noisy');
    const ms: Record<number, number> = {};
    for (const n of [1000, 10000, 100000]) {
      const lik = build(n);
      // Vary the parameters slightly between calls, as a sampler would.
      let k = 0;
      const reps = n >= 100000 ? 5 : 15;
      const t = medianMs(timeRepeated(() => void lik.evaluate({ ...theta, dm: theta.dm + 0.001 * (k++ % 7) }), reps, 2));
      ms[n] = t;
      ctx.record({
        name: `${n} stars`,
        value: t,
        unit: 'ms/eval',
        target: n === 10000 ? { op: '<=', value: 2 } : undefined,
        note: `${((t * 1e6) / n).toFixed(0)} ns/star`,
      });
    }
    ctx.record({ name: 'scaling time(1e5)/time(1e4)', value: ms[100000] / ms[10000], unit: 'x', target: { op: '<=', value: 11 } });
    // Where the time goes: the same 10^4 stars without binaries (f_binary = 0), and the per-parameter
    // preparation alone (isochrone, polyline, binary curves, selection normalisation; no stars).
    const singles = build(10000, true, 0);
    const ts = medianMs(timeRepeated(() => void singles.evaluate({ ...theta, fBinary: 0 }), 15, 2));
    ctx.record({ name: '10000 stars, no binaries', value: ts, unit: 'ms/eval', note: `${((ts * 1e6) / 10000).toFixed(0)} ns/star` });
    const lik = build(1000);
    const tp = medianMs(timeRepeated(() => void lik.prepare(theta, true), 15, 2));
    ctx.record({ name: 'per-parameter preparation alone (binaries on)', value: tp, unit: 'ms' });
    // Reference in the same run: the unpruned fast path (every segment for every star), on 200 stars.
    const small = build(200);
    const unpruned = build(200, false);
    const tpr = medianMs(timeRepeated(() => void small.evaluate(theta), 5, 1));
    const tu = medianMs(timeRepeated(() => void unpruned.evaluate(theta), 3, 1));
    ctx.record({ name: '200 stars, pruned', value: tpr, unit: 'ms/eval', reference: { name: 'unpruned fast path (every segment for every star)', value: tu } });
    ctx.record({ name: 'pruning speed-up, 200 stars', value: tu / tpr, unit: 'x' });
  },
};

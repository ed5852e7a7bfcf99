/**
 * Sampler benchmarks: the speed-up of the worker pool with a log-probability that costs about 1 ms, and
 * the pool's dispatch overhead per evaluation with a nearly free one; each compared, in the same run,
 * with the in-thread evaluator doing the same work. Chains are identical whatever the evaluator (see
 * tests/sampler/workers.test.ts), so only the time differs.
 */
import { inThreadEvaluator, type Evaluator } from '../src/sampler/evaluator.js';
import { loadLogDensity, type LogDensitySpec } from '../src/sampler/logDensitySpec.js';
import { createEnsembles, runEnsembles } from '../src/sampler/runEnsembles.js';
import { targetSpec } from '../src/sampler/targets/index.js';
import { workerEvaluator } from '../src/sampler/workerEvaluator.js';
import { medianMs, type BenchGroup } from './harness.js';

const NDIM = 5;

/**
 * Iterations of costlyDensity's loop that take about `ms` per evaluation in a worker (where the pool
 * runs it; the main thread's compiler state can differ), measured on batches of 32 evaluations.
 */
async function calibrateInWorker(ms: number): Promise<number> {
  let iterations = 50000;
  for (let round = 0; round < 12; round++) {
    const per = await withPool(targetSpec('costlyDensity', { ndim: NDIM, iterations }), 1, async (ev) => {
      const pts = new Float64Array(32 * NDIM).fill(0.1);
      const lp = new Float64Array(32);
      const blobs = new Float64Array(0);
      const trials: number[] = [];
      for (let k = 0; k < 5; k++) {
        const t0 = performance.now();
        await ev.evaluate(pts, 32, lp, blobs);
        trials.push((performance.now() - t0) / 32);
      }
      return medianMs(trials.slice(1));
    });
    if (Math.abs(per - ms) / ms < 0.1) break;
    iterations = Math.max(1000, Math.round((iterations * ms) / per));
  }
  return iterations;
}

/** CPU time (all threads of the process) over wall time of the last timed run: the cores it really got. */
let lastCoresUsed = Number.NaN;

/** Wall time of a run of `steps` steps of K ensembles, median of `repeats` (after one warm-up run). */
async function timeRun(evaluator: Evaluator, o: { nEnsembles: number; nWalkers: number; steps: number; repeats: number }): Promise<number> {
  const samples: number[] = [];
  for (let r = 0; r <= o.repeats; r++) {
    const { samplers } = await createEnsembles({ evaluator, seed: 1 + r, nEnsembles: o.nEnsembles, nWalkers: o.nWalkers, init: { kind: 'ball', center: new Array(NDIM).fill(0), scale: 1 } });
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    await runEnsembles({ samplers, stop: { kind: 'fixed', steps: o.steps }, handleSignals: false });
    const wall = performance.now() - t0;
    const cpu = process.cpuUsage(cpu0);
    lastCoresUsed = (cpu.user + cpu.system) / 1000 / wall;
    if (r > 0) samples.push(wall);
  }
  return medianMs(samples);
}

async function withPool<T>(spec: LogDensitySpec, workers: number, f: (e: Evaluator) => Promise<T>): Promise<T> {
  const ev = await workerEvaluator(spec, { workers });
  try {
    return await f(ev);
  } finally {
    await ev.close();
  }
}

export const samplerBench: BenchGroup = {
  name: 'sampler',
  describe: 'worker-pool speed-up with a 1 ms log-probability, and dispatch overhead per evaluation',
  async run(ctx) {
    // Speed-up: 4 ensembles x 16 walkers, so each half-step offers 4 x 8 evaluations to the pool. Runs
    // with 1 and 2 workers alternate, and the figure is the median of the ratios of neighbouring runs,
    // so that the load of other jobs on the machine, which drifts, weighs on both sides alike.
    const iterations = await calibrateInWorker(1);
    const costly = targetSpec('costlyDensity', { ndim: NDIM, iterations });
    const shape = { nEnsembles: 4, nWalkers: 16, steps: 15, repeats: 1 };
    const evals = shape.nEnsembles * shape.nWalkers * shape.steps;
    const inThread = await timeRun(inThreadEvaluator(await loadLogDensity(costly)), shape);
    const pool1 = await workerEvaluator(costly, { workers: 1 });
    const pool2 = await workerEvaluator(costly, { workers: 2 });
    const ones: number[] = [];
    const twos: number[] = [];
    const cores1: number[] = [];
    const cores2: number[] = [];
    try {
      for (let r = 0; r < 5; r++) {
        ones.push(await timeRun(pool1, shape));
        cores1.push(lastCoresUsed);
        twos.push(await timeRun(pool2, shape));
        cores2.push(lastCoresUsed);
      }
    } finally {
      await pool1.close();
      await pool2.close();
    }
    const one = medianMs(ones);
    const two = medianMs(twos);
    const ratio = medianMs(ones.map((t, i) => t / twos[i]));
    ctx.log(
      `~1 ms log-probability (${iterations} loop iterations, calibrated in a worker): ${evals} evaluations per run; median 1 worker ${one.toFixed(0)} ms (${((one * 1000) / evals).toFixed(0)} µs/evaluation), 2 workers ${two.toFixed(0)} ms, in-thread ${inThread.toFixed(0)} ms; ratios ${ones.map((t, i) => (t / twos[i]).toFixed(2)).join(' ')}`,
    );
    ctx.log(`cores actually obtained (CPU time / wall time): 1 worker ${cores1.map((c) => c.toFixed(2)).join(' ')}; 2 workers ${cores2.map((c) => c.toFixed(2)).join(' ')}`);
    ctx.record({
      name: 'speed-up of 2 workers over 1 (1 ms log-probability)',
      value: ratio,
      unit: 'x',
      target: { op: '>=', value: 1.8 },
      reference: { name: 'in-thread over 1 worker', value: inThread / one },
      note: 'machine has 2 cores shared with other developers: contention lowers this',
    });
    ctx.record({ name: 'time per evaluation, 2 workers (1 ms log-probability)', value: (two * 1000) / evals, unit: 'µs', reference: { name: '1 worker', value: (one * 1000) / evals } });

    // Overhead: a nearly free density (5-D Gaussian, well under 1 µs), so the time is the dispatch.
    const cheap = targetSpec('gaussianDensity', { mean: new Array(NDIM).fill(0) });
    const cheapShape = { nEnsembles: 4, nWalkers: 32, steps: 300, repeats: 3 };
    const cheapEvals = cheapShape.nEnsembles * cheapShape.nWalkers * cheapShape.steps;
    const cheapInThread = await timeRun(inThreadEvaluator(await loadLogDensity(cheap)), cheapShape);
    for (const workers of [1, 2]) {
      const pooled = await withPool(cheap, workers, (e) => timeRun(e, cheapShape));
      ctx.record({
        name: `dispatch overhead per evaluation, ${workers} worker${workers > 1 ? 's' : ''}`,
        value: ((pooled - cheapInThread) * 1000) / cheapEvals,
        unit: 'µs',
        target: { op: '<=', value: 20 },
        reference: { name: 'in-thread time per evaluation, sampler included', value: (cheapInThread * 1000) / cheapEvals },
        note: `${cheapEvals} evaluations in batches of 16 (one half-ensemble), one chunk per worker`,
      });
    }
  },
};

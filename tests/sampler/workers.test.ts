/**
 * The worker pool changes nothing but speed: all random numbers are drawn in the main thread, and each
 * result lands at its walker's index, so chains are bit-identical for 0 (in-thread), 1, 2 or 4 workers.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { MemorySink } from '../../src/sampler/chainSink.js';
import { inThreadEvaluator, type Evaluator } from '../../src/sampler/evaluator.js';
import { loadLogDensity } from '../../src/sampler/logDensitySpec.js';
import { deMove } from '../../src/sampler/moves/deMove.js';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import { walkMove } from '../../src/sampler/moves/walkMove.js';
import { createEnsembles, runEnsembles } from '../../src/sampler/runEnsembles.js';
import { targetSpec } from '../../src/sampler/targets/index.js';
import { workerEvaluator } from '../../src/sampler/workerEvaluator.js';
import { createEvaluator } from '../../src/sampler/createEvaluator.js';
import { SamplingError } from '../../src/core/errors.js';

const NDIM = 5;
const SPEC = targetSpec('gaussianDensity', { mean: [1, 2, 3, 4, 5], cov: covariance(), withBlobs: true });

function covariance(): Float64Array {
  // SharedArrayBuffer-backed, as a catalogue shared with workers would be: the spec must carry it.
  const c = new Float64Array(new SharedArrayBuffer(NDIM * NDIM * 8));
  for (let i = 0; i < NDIM; i++) for (let j = 0; j < NDIM; j++) c[i * NDIM + j] = i === j ? 1 + i : 0.3;
  return c;
}

const open: Evaluator[] = [];
afterAll(async () => {
  await Promise.all(open.map((e) => e.close()));
});

async function chainBytes(evaluator: Evaluator): Promise<Buffer> {
  const { samplers } = await createEnsembles({
    evaluator,
    seed: 2024,
    nEnsembles: 3,
    nWalkers: 12,
    moves: [
      { move: stretchMove(), weight: 0.5 },
      { move: deMove(), weight: 0.3 },
      { move: walkMove(), weight: 0.2 },
    ],
    init: { kind: 'ball', center: [0, 0, 0, 0, 0], scale: 0.5 },
  });
  const sink = new MemorySink();
  await runEnsembles({ samplers, stop: { kind: 'fixed', steps: 150 }, sink, handleSignals: false });
  const parts: Buffer[] = [];
  for (const list of sink.states) for (const s of list) parts.push(Buffer.from(s.positions.buffer), Buffer.from(s.logProb.buffer), Buffer.from(s.blobs.buffer), Buffer.from(s.accepted.buffer));
  return Buffer.concat(parts);
}

describe('worker pool', () => {
  it('gives bit-identical chains with the in-thread evaluator and with 1, 2 and 4 workers', async () => {
    const reference = await chainBytes(inThreadEvaluator(await loadLogDensity(SPEC)));
    expect(reference.length).toBeGreaterThan(0);
    for (const workers of [1, 2, 4]) {
      const ev = await workerEvaluator(SPEC, { workers, chunksPerWorker: workers === 4 ? 3 : 1 });
      open.push(ev);
      expect(ev.workers).toBe(workers);
      const bytes = await chainBytes(ev);
      expect(bytes.equals(reference), `${workers} worker(s) differ from in-thread`).toBe(true);
      await ev.close();
    }
  });

  it('reports the blobs the workers computed, alongside the positions', async () => {
    const ev = await workerEvaluator(SPEC, { workers: 2 });
    open.push(ev);
    expect(ev.blobNames).toEqual(['mahalanobis2']);
    const pts = Float64Array.from({ length: 3 * NDIM }, (_, i) => i / 7);
    const lp = new Float64Array(3);
    const blobs = new Float64Array(3);
    await ev.evaluate(pts, 3, lp, blobs);
    // The blob is the squared Mahalanobis distance and log p = -blob / 2 (gaussian.ts).
    for (let i = 0; i < 3; i++) expect(lp[i]).toBe(-0.5 * blobs[i]);
    await ev.close();
  });

  it('createEvaluator maps the config\'s worker setting: 0 in-thread, a count of workers', async () => {
    const inThread = await createEvaluator(SPEC, 0);
    expect(inThread.workers).toBe(0);
    const pooled = await createEvaluator(SPEC, 2);
    open.push(pooled);
    expect(pooled.workers).toBe(2);
    await pooled.close();
  });

  it('fails at start-up, with the module named, when the log-density cannot be built in a worker', async () => {
    const bad = { ...SPEC, exportName: 'noSuchFactory' };
    const err = await workerEvaluator(bad, { workers: 1 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(SamplingError);
    expect((err as Error).message).toMatch(/noSuchFactory/);
  });
});

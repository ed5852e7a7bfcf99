/**
 * An evaluator over a pool of worker threads (piscina). Each batch (one half-ensemble's proposals) is cut
 * into chunks, one per worker by default, and the chunks of all ensembles share the pool's queue, so K
 * ensembles stepping concurrently keep every worker busy. Results land at their point's index, so the
 * outcome does not depend on which worker evaluated what, nor on how many there are.
 */
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { SamplingError } from '../core/errors.js';
import { compiledSibling } from './compiledPath.js';
import type { WorkerDescription, WorkerTask } from './evaluateWorker.js';
import type { Evaluator } from './evaluator.js';
import type { LogDensitySpec } from './logDensitySpec.js';

export interface WorkerEvaluatorOptions {
  /** Worker threads; default: the machine's available parallelism. */
  workers?: number;
  /**
   * Tasks per worker to aim for across the batches in flight; default 1. A batch is cut into
   * ceil(workers x chunksPerWorker / batches in flight) chunks: a lone batch is split across the
   * workers, while K ensembles submitting together send one task each, which keeps every worker busy with
   * fewer dispatches. More chunks balance uneven costs better. Chunking never changes the results.
   */
  chunksPerWorker?: number;
}

/** Start the pool, build the density in every worker, and return its evaluator. */
export async function workerEvaluator(spec: LogDensitySpec, options: WorkerEvaluatorOptions = {}): Promise<Evaluator> {
  const workers = options.workers ?? availableParallelism();
  if (!Number.isInteger(workers) || workers < 1) throw new RangeError(`the number of workers must be a positive integer, got ${workers}`);
  const chunksPerWorker = options.chunksPerWorker ?? 1;
  const pool = new Piscina<WorkerTask, unknown>({
    filename: compiledSibling(import.meta.url, 'evaluateWorker.js'),
    minThreads: workers,
    maxThreads: workers,
    idleTimeout: Number.POSITIVE_INFINITY,
    workerData: { spec },
  });
  let description: WorkerDescription;
  try {
    // Ask every worker, so that a density that fails to build fails here, at start-up, not mid-run.
    const all = await Promise.all(Array.from({ length: workers }, () => pool.run({ kind: 'describe' }) as Promise<WorkerDescription>));
    description = all[0];
  } catch (err) {
    await pool.destroy();
    throw asSamplingError(err, `could not build the log-density in a worker (${spec.exportName} from ${spec.modulePath})`);
  }
  const { ndim, blobNames } = description;
  const nBlobs = blobNames.length;
  let closed = false;
  let inFlight = 0;
  return {
    ndim,
    blobNames,
    workers,
    async evaluate(positions, n, logProbOut, blobsOut) {
      if (closed) throw new Error('the worker evaluator is closed');
      inFlight++;
      const nChunks = Math.max(1, Math.min(n, Math.ceil((workers * chunksPerWorker) / inFlight)));
      const tasks: Promise<void>[] = [];
      for (let c = 0; c < nChunks; c++) {
        const start = Math.floor((c * n) / nChunks);
        const end = Math.floor(((c + 1) * n) / nChunks);
        const m = end - start;
        const chunk = positions.slice(start * ndim, end * ndim);
        tasks.push(
          (pool.run({ kind: 'evaluate', positions: chunk, n: m }, { transferList: [chunk.buffer] }) as Promise<Float64Array>).then((out) => {
            for (let i = 0; i < m; i++) logProbOut[start + i] = out[i];
            blobsOut.set(out.subarray(m, m + m * nBlobs), start * nBlobs);
          }),
        );
      }
      try {
        await Promise.all(tasks);
      } catch (err) {
        throw asSamplingError(err, 'the log-density threw in a worker');
      } finally {
        inFlight--;
      }
    },
    async close() {
      if (closed) return;
      closed = true;
      await pool.destroy();
    },
  };
}

function asSamplingError(err: unknown, what: string): Error {
  if (err instanceof SamplingError) return err;
  const message = err instanceof Error ? err.message : String(err);
  return new SamplingError(`${what}: ${message}`, { cause: err });
}

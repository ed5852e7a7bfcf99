/**
 * `parameterDiagnostics` of several parameters on worker threads (piscina), one task per parameter: the
 * parameters are independent, so a 2-core machine diagnoses two at once. Every parameter is computed by
 * the same function on the same draws wherever it runs, so the results do not depend on the number of
 * threads (tests check this). The draws must be on SharedArrayBuffers (readRunChains' `shared` option).
 */
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { parameterDiagnostics, type ParameterDiagnostics } from '../diagnostics/index.js';
import { compiledSibling } from '../sampler/compiledPath.js';
import { columnChains, type ParameterColumn, type ParameterResult, type ParameterTask } from './parameterDiagnosticsWorker.js';

/**
 * Draws per parameter below which the default is to stay in this thread: a new worker runs its first
 * parameter unoptimised (measured: ~0.4 s for 10^5 draws that take 0.08 s once warm), so threads pay
 * only for large runs.
 */
const MIN_DRAWS_FOR_THREADS = 500_000;

/**
 * Each column's `parameterDiagnostics(columnChains(column), nGroups)`, in order. `threads`: worker threads
 * to use, at most one per column; 1 or fewer computes in this thread. Default: the available parallelism
 * for columns of MIN_DRAWS_FOR_THREADS draws or more, else this thread.
 */
export async function parameterDiagnosticsOnThreads(columns: readonly ParameterColumn[], nGroups: number, threads?: number): Promise<ParameterDiagnostics[]> {
  const draws = columns.length ? (columns[0].nDraws - columns[0].discardDraws) * columns[0].nChains : 0;
  const n = Math.min(threads ?? (draws >= MIN_DRAWS_FOR_THREADS ? availableParallelism() : 1), columns.length);
  if (!(n > 1)) return columns.map((c) => parameterDiagnostics(columnChains(c), nGroups));
  for (const c of columns) {
    if (!(c.values.buffer instanceof SharedArrayBuffer)) throw new TypeError('worker threads need the draws on a SharedArrayBuffer');
  }
  const pool = new Piscina<ParameterTask, ParameterResult>({
    filename: compiledSibling(import.meta.url, 'parameterDiagnosticsWorker.js'),
    minThreads: n,
    maxThreads: n,
  });
  try {
    return await Promise.all(
      columns.map(async (c) => {
        const sortedOut = new Float64Array(new SharedArrayBuffer((c.nDraws - Math.min(c.discardDraws, c.nDraws)) * c.nChains * Float64Array.BYTES_PER_ELEMENT));
        const { sortedLength, ...rest } = await pool.run({ ...c, nGroups, sortedOut });
        return { ...rest, sorted: sortedOut.subarray(0, sortedLength) };
      }),
    );
  } finally {
    await pool.destroy();
  }
}

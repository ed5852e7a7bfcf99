/**
 * The worker side of the pool: builds the log-density once, from the spec in the pool's workerData, then
 * evaluates chunks of points. It draws no random numbers.
 */
import { move, workerData } from 'piscina';
import { evaluateBatch } from './evaluator.js';
import { loadLogDensity, type LogDensitySpec } from './logDensitySpec.js';

export type WorkerTask = { kind: 'describe' } | { kind: 'evaluate'; positions: Float64Array; n: number };
export interface WorkerDescription {
  ndim: number;
  blobNames: string[];
}

const density = await loadLogDensity((workerData as { spec: LogDensitySpec }).spec);
const nBlobs = density.blobNames.length;
const theta = new Float64Array(density.ndim);
const blobs = new Float64Array(nBlobs);

/** Returns, for 'evaluate', one array: n log-densities followed by n x nBlobs blobs. */
export default function handle(task: WorkerTask): WorkerDescription | ReturnType<typeof move> {
  if (task.kind === 'describe') return { ndim: density.ndim, blobNames: [...density.blobNames] };
  const { positions, n } = task;
  const out = new Float64Array(n * (1 + nBlobs));
  evaluateBatch(density, positions, 0, n, out, 0, out, n, theta, blobs);
  return move(out);
}

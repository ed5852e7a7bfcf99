import { availableParallelism } from 'node:os';
import { inThreadEvaluator, type Evaluator } from './evaluator.js';
import { loadLogDensity, type LogDensitySpec } from './logDensitySpec.js';
import { workerEvaluator } from './workerEvaluator.js';

/**
 * The evaluator for a log-density spec and a worker setting as the config gives it (`sampler.workers`):
 * "auto" for one worker per core, a count, or 0 to evaluate in the main thread.
 */
export async function createEvaluator(spec: LogDensitySpec, workers: number | 'auto'): Promise<Evaluator> {
  const n = workers === 'auto' ? availableParallelism() : workers;
  if (n === 0) return inThreadEvaluator(await loadLogDensity(spec));
  return workerEvaluator(spec, { workers: n });
}

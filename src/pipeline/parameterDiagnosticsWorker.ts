/**
 * The worker side of `parameterDiagnosticsOnThreads`: one parameter's diagnostics from its column of
 * draws (shared memory, not copied), laid out as the run reader leaves it. The sorted draws are written
 * straight into a shared output buffer instead of being sent back, which would copy them.
 */
import { chainsFromBuffer, dropFirst, parameterDiagnostics, type ParameterDiagnostics } from '../diagnostics/index.js';

export interface ParameterColumn {
  /** nChains chains of nDraws draws, chain-major, on a SharedArrayBuffer. */
  values: Float64Array;
  nDraws: number;
  nChains: number;
  /** Draws dropped from the start of every chain (burn-in). */
  discardDraws: number;
}

export interface ParameterTask extends ParameterColumn {
  nGroups: number;
  /** Shared buffer of at least (nDraws - discardDraws) x nChains values for the sorted draws. */
  sortedOut: Float64Array;
}

/** The draws of a column as the diagnostics take them (views, after the burn-in). */
export function columnChains(c: ParameterColumn): Float64Array[] {
  return dropFirst(chainsFromBuffer(c.values, c.nDraws, c.nChains), c.discardDraws);
}

export type ParameterResult = Omit<ParameterDiagnostics, 'sorted'> & { sortedLength: number };

export default function diagnoseParameter(task: ParameterTask): ParameterResult {
  const { sorted, ...rest } = parameterDiagnostics(columnChains(task), task.nGroups, { sortedOut: task.sortedOut });
  return { ...rest, sortedLength: sorted.length };
}

/**
 * Where the run loop sends the chain. The Arrow chain files (src/io) implement this; `MemorySink` keeps
 * the chain in memory, for tests and short library runs.
 *
 * Contract with the run loop: `append` gets every stored state (every `thin`-th step) of every ensemble,
 * in step order; `flush` is called just before each checkpoint is written, and must make everything
 * appended so far durable, so that a checkpoint never refers to rows that could be lost. When a run resumes,
 * `rewind` is called first with each ensemble's checkpointed step: rows beyond it were written after the
 * checkpoint (by the run that was killed) and must be dropped, since the resumed run writes them again.
 */
import type { EnsembleState } from './types.js';

export interface ChainSink {
  append(state: EnsembleState): void | Promise<void>;
  flush(): void | Promise<void>;
  close(): void | Promise<void>;
  /** Drop stored rows of ensemble e with step > steps[e]. Required for resuming. */
  rewind?(steps: readonly number[]): void | Promise<void>;
}

/** Keeps every appended state (copies), by ensemble. */
export class MemorySink implements ChainSink {
  readonly states: EnsembleState[][] = [];

  append(state: EnsembleState): void {
    (this.states[state.ensemble] ??= []).push(state);
  }

  flush(): void {}

  close(): void {}

  rewind(steps: readonly number[]): void {
    steps.forEach((s, e) => {
      if (this.states[e]) this.states[e] = this.states[e].filter((st) => st.step <= s);
    });
  }

  /** Positions of one ensemble as one array: row-major steps, then walkers, then parameters. */
  chain(ensemble = 0): Float64Array {
    const list = this.states[ensemble] ?? [];
    if (list.length === 0) return new Float64Array(0);
    const size = list[0].positions.length;
    const out = new Float64Array(list.length * size);
    list.forEach((s, i) => out.set(s.positions, i * size));
    return out;
  }

  /** Log-probabilities of one ensemble: steps x walkers. */
  logProb(ensemble = 0): Float64Array {
    const list = this.states[ensemble] ?? [];
    if (list.length === 0) return new Float64Array(0);
    const n = list[0].nWalkers;
    const out = new Float64Array(list.length * n);
    list.forEach((s, i) => out.set(s.logProb, i * n));
    return out;
  }
}

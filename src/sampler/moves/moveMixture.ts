/**
 * A weighted mixture of moves: at each step one move, drawn with probability proportional to its weight,
 * moves both halves of the ensemble. A mixture of valid kernels chosen independently of the state leaves
 * the target invariant (Tierney 1994, Ann. Stat. 22, 1701, section 2.3). The mixture also counts, per move,
 * the proposals made and accepted; those counts and the weights are its state, saved in checkpoints.
 */
import type { SamplerRng } from '../rng.js';
import type { Move, WeightedMove } from './move.js';

/** What a checkpoint keeps of a mixture. */
export interface MoveMixtureState {
  names: string[];
  weights: number[];
  proposed: number[];
  accepted: number[];
}

export class MoveMixture {
  readonly moves: readonly Move[];
  readonly weights: readonly number[];
  private readonly cumulative: Float64Array;
  readonly proposed: Float64Array;
  readonly accepted: Float64Array;

  constructor(entries: readonly WeightedMove[]) {
    if (entries.length === 0) throw new RangeError('a move mixture needs at least one move');
    let total = 0;
    for (const { move, weight } of entries) {
      if (!(weight >= 0) || !Number.isFinite(weight)) throw new RangeError(`the weight of move "${move.name}" must be a finite number >= 0, got ${weight}`);
      total += weight;
    }
    if (!(total > 0)) throw new RangeError(`the move weights sum to ${total}: give at least one move a positive weight`);
    this.moves = entries.map((e) => e.move);
    this.weights = entries.map((e) => e.weight / total);
    this.cumulative = new Float64Array(entries.length);
    let c = 0;
    for (let i = 0; i < entries.length; i++) {
      c += this.weights[i];
      this.cumulative[i] = c;
    }
    this.proposed = new Float64Array(entries.length);
    this.accepted = new Float64Array(entries.length);
  }

  /** Index of the move for the next step. A single move draws no random number. */
  pick(rng: SamplerRng): number {
    if (this.moves.length === 1) return 0;
    const u = rng.uniform();
    for (let i = 0; i < this.cumulative.length - 1; i++) if (u < this.cumulative[i]) return i;
    return this.cumulative.length - 1;
  }

  record(index: number, nProposed: number, nAccepted: number): void {
    this.proposed[index] += nProposed;
    this.accepted[index] += nAccepted;
  }

  /** Acceptance fraction of each move so far (NaN for a move never used). */
  acceptance(): number[] {
    return Array.from(this.proposed, (p, i) => this.accepted[i] / p);
  }

  get state(): MoveMixtureState {
    return {
      names: this.moves.map((m) => m.name),
      weights: [...this.weights],
      proposed: Array.from(this.proposed),
      accepted: Array.from(this.accepted),
    };
  }

  /** Restore the counts of a saved mixture; the moves and weights must be the same as when it was saved. */
  restore(state: MoveMixtureState): void {
    const names = this.moves.map((m) => m.name);
    const same =
      state.names.length === names.length &&
      state.names.every((n, i) => n === names[i] && Math.abs(state.weights[i] - this.weights[i]) <= 1e-12);
    if (!same) {
      throw new RangeError(
        `the saved move mixture (${describe(state.names, state.weights)}) differs from the one configured now (${describe(names, this.weights)})`,
      );
    }
    this.proposed.set(state.proposed);
    this.accepted.set(state.accepted);
  }
}

function describe(names: readonly string[], weights: readonly number[]): string {
  return names.map((n, i) => `${n} ${weights[i].toFixed(3)}`).join(', ');
}

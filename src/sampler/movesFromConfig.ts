/**
 * Build the move mixture from its plain description (the `[[sampler.moves]]` tables of the config, or any
 * caller's list). The shape is declared here, not imported from src/config: the sampler sees only plain data.
 */
import { SamplingError } from '../core/errors.js';
import { didYouMean } from '../core/suggest.js';
import { deMove } from './moves/deMove.js';
import type { WeightedMove } from './moves/move.js';
import { stretchMove } from './moves/stretchMove.js';
import { walkMove } from './moves/walkMove.js';

export interface MoveConfig {
  move: string;
  weight: number;
  /** stretch: the scale a. */
  a?: number;
  /** de: γ0, its relative jitter, and the probability of a γ = 1 step. */
  gamma0?: number;
  jitter?: number;
  mode_hop?: number;
  /** walk: subset size. */
  subset?: number;
}

export const MOVE_NAMES = ['stretch', 'de', 'walk'] as const;

export function movesFromConfig(list: readonly MoveConfig[]): WeightedMove[] {
  if (list.length === 0) throw new SamplingError('no moves are configured', { hint: 'list at least one move, e.g. { move = "stretch", weight = 1 }' });
  const total = list.reduce((s, m) => s + m.weight, 0);
  if (!(total > 0) || list.some((m) => !(m.weight >= 0))) {
    throw new SamplingError(`the move weights must be >= 0 and sum to a positive number; they sum to ${total}`, {
      where: { key: 'sampler.moves' },
      found: list.map((m) => m.weight),
      hint: 'give at least one move a positive weight',
    });
  }
  return list.map((m, i) => {
    try {
      switch (m.move) {
        case 'stretch':
          return { move: stretchMove({ a: m.a }), weight: m.weight };
        case 'de':
          return { move: deMove({ gamma0: m.gamma0, jitter: m.jitter, modeHop: m.mode_hop }), weight: m.weight };
        case 'walk':
          return { move: walkMove({ subset: m.subset }), weight: m.weight };
        default:
          throw new SamplingError(`unknown move "${m.move}"`, {
            where: { key: `sampler.moves.${i}.move` },
            expected: `one of ${MOVE_NAMES.join(', ')}`,
            hint: didYouMean(m.move, MOVE_NAMES) ?? 'use one of the moves listed',
          });
      }
    } catch (err) {
      if (err instanceof SamplingError) throw err;
      throw new SamplingError((err as Error).message, { where: { key: `sampler.moves.${i}` } });
    }
  });
}

import { z } from 'zod';

/** Keys that only some moves take. */
const MOVE_KEYS: Record<string, readonly string[]> = {
  stretch: ['a'],
  de: ['gamma0', 'jitter', 'mode_hop'],
  walk: ['subset'],
};

/** One `[[sampler.moves]]` table: a move and its share of the steps. */
export const moveSchema = z
  .strictObject({
    move: z.enum(['stretch', 'de', 'walk']),
    weight: z.number().min(0).default(1),
    /** stretch: scale of the stretch distribution (Goodman & Weare 2010), > 1. */
    a: z.number().gt(1).optional(),
    /** de: γ0 (default 2.38 / sqrt(2 ndim), ter Braak 2006). */
    gamma0: z.number().positive().optional(),
    /** de: relative jitter of γ. */
    jitter: z.number().min(0).lt(1).optional(),
    /** de: probability of a γ = 1 (mode-hopping) step. */
    mode_hop: z.number().min(0).max(1).optional(),
    /** walk: number of complementary walkers in each subset. */
    subset: z.number().int().min(2).optional(),
  })
  .superRefine((m, ctx) => {
    for (const [move, keys] of Object.entries(MOVE_KEYS)) {
      if (move === m.move) continue;
      for (const k of keys) {
        if ((m as Record<string, unknown>)[k] !== undefined) {
          ctx.addIssue({ code: 'custom', path: [k], input: (m as Record<string, unknown>)[k], message: `key ${k} belongs to the ${move} move, not to ${m.move}` });
        }
      }
    }
  });

/**
 * `[sampler]`: the ensemble sampler. Walkers per ensemble default to the pipeline's choice
 * (max(32, 4 x parameters)); the sampler refuses fewer than 2 x parameters.
 */
export const samplerSection = z
  .strictObject({
    /** Walkers per ensemble. */
    walkers: z
      .number()
      .int()
      .superRefine((n, ctx) => {
        if (n < 4) ctx.addIssue({ code: 'custom', input: n, message: `too few walkers (${n}): the ensemble needs at least 2 per parameter, and never fewer than 4` });
      })
      .optional(),
    /** Independent ensembles, the chains that R-hat compares. */
    ensembles: z.number().int().min(1).default(4),
    /** Run seed, an integer in [0, 4294967295]; default: drawn at start and recorded in the manifest. */
    seed: z.number().int().min(0).max(0xffffffff).optional(),
    /** Worker threads: "auto" (one per core) or a count; 0 evaluates in the main thread. */
    workers: z.union([z.literal('auto'), z.number().int().min(0)]).default('auto'),
    /** Store every thin-th step. */
    thin: z.number().int().min(1).default(1),
    /** "auto": stop once long enough against τ; "fixed": take exactly `steps` steps. */
    stop: z.enum(['auto', 'fixed']).default('auto'),
    /** Steps to take ("fixed"), or the cap ("auto"). */
    steps: z.number().int().min(1).default(100000),
    /** auto: stop once steps > tau_multiple x τ for every parameter, R-hat and ESS pass the verdict's thresholds... */
    tau_multiple: z.number().positive().default(50),
    /** ...and τ changed by less than this fraction since the last check. */
    tau_change: z.number().positive().lt(1).default(0.01),
    /** auto: steps between τ checks. */
    check_every: z.number().int().min(1).default(500),
    /** Checkpoint every this many steps... */
    checkpoint_steps: z.number().int().min(1).default(1000),
    /** ...or this many seconds, whichever comes first. */
    checkpoint_seconds: z.number().positive().default(600),
    /** Where walkers start: around the optimum Nelder–Mead finds from prior draws, prior draws, or a ball around init_point. */
    init: z.enum(['optimum', 'prior', 'ball']).default('optimum'),
    /** init = "optimum": starts followed down the error floors (of max(8, init_starts) optimised at the first), and prior draws polished. */
    init_starts: z.number().int().min(1).default(4),
    /** Centre of the ball (init = "ball"): a value per sampled parameter. */
    init_point: z.record(z.string(), z.number()).optional(),
    /** init = "ball": the width of the ball (absolute). init = "optimum": the first finite-difference step of the Laplace start, relative to the prior spread. */
    init_scale: z.number().positive().default(1e-3),
    /** Shuffle walkers before each red/blue split. */
    random_split: z.boolean().default(true),
    moves: z.array(moveSchema).min(1).default([
      { move: 'stretch', weight: 0.8 },
      { move: 'de', weight: 0.2 },
    ]),
  })
  .superRefine((s, ctx) => {
    const total = s.moves.reduce((t, m) => t + m.weight, 0);
    if (!(total > 0)) {
      ctx.addIssue({ code: 'custom', path: ['moves'], input: s.moves.map((m) => m.weight), message: `the move weights sum to ${total}: give at least one move a positive weight` });
    }
    if (s.init === 'ball' && s.init_point === undefined) {
      ctx.addIssue({ code: 'custom', path: ['init_point'], input: undefined, message: 'init = "ball" needs init_point, the centre of the ball (one value per sampled parameter)' });
    }
  });
export type SamplerConfig = z.infer<typeof samplerSection>;
export type MoveEntry = z.infer<typeof moveSchema>;

import { z } from 'zod';

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });

const uniform = z
  .strictObject({ kind: z.literal('uniform'), min: finite, max: finite })
  .refine((p) => p.min < p.max, { message: 'min must be below max (the bounds are inverted)' });
const normal = z.strictObject({ kind: z.literal('normal'), mean: finite, sd: finite.pipe(z.number().positive()) });
const truncatedNormal = z
  .strictObject({ kind: z.literal('truncated_normal'), mean: finite, sd: finite.pipe(z.number().positive()), min: finite, max: finite })
  .refine((p) => p.min < p.max, { message: 'min must be below max (the bounds are inverted)' });
const logUniform = z
  .strictObject({ kind: z.literal('log_uniform'), min: finite.pipe(z.number().positive()), max: finite })
  .refine((p) => p.min < p.max, { message: 'min must be below max (the bounds are inverted)' });
const fixed = z.strictObject({ kind: z.literal('fixed'), value: finite });

/**
 * One parameter's prior: `{ kind = "uniform", min = .., max = .. }`, `normal` (mean, sd),
 * `truncated_normal` (mean, sd, min, max), `log_uniform` (min, max), or `fixed` (value).
 * A bare number is shorthand for a fixed value.
 */
export const priorSchema = z.union([
  finite.transform((value) => ({ kind: 'fixed' as const, value })),
  z.discriminatedUnion('kind', [uniform, normal, truncatedNormal, logUniform, fixed]),
]);
export type PriorConfig = z.infer<typeof priorSchema>;

/**
 * `[priors]`: one entry per cluster parameter. The age takes its prior either on log_age (log10 yr) or on
 * age_gyr (Gyr; the sampler still moves in log age, with the Jacobian applied). feh, dm and ebv have no
 * default: the user states what they believe. The nuisance parameters default to broad priors.
 */
export const priorsSection = z
  .strictObject({
    log_age: priorSchema.optional(),
    age_gyr: priorSchema.optional(),
    feh: priorSchema.optional(),
    dm: priorSchema.optional(),
    ebv: priorSchema.optional(),
    f_binary: priorSchema.default({ kind: 'uniform', min: 0, max: 1 }),
    f_field: priorSchema.default({ kind: 'uniform', min: 0, max: 1 }),
    sigma_extra: priorSchema.default({ kind: 'uniform', min: 0, max: 0.1 }),
  })
  .refine((p) => (p.log_age === undefined) !== (p.age_gyr === undefined), {
    message: 'give the age prior once: either log_age (log10 yr) or age_gyr (Gyr)',
  });
export type PriorsConfig = z.infer<typeof priorsSection>;

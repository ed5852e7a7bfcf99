import { z } from 'zod';

/** `[output]`: where a run writes, relative to the config file. */
export const outputSection = z.strictObject({
  /** The run directory. Default: runs/<config file name without extension>. */
  dir: z.string().min(1).optional(),
  /** Replace an existing run directory instead of refusing. */
  overwrite: z.boolean().default(false),
});
export type OutputConfig = z.infer<typeof outputSection>;

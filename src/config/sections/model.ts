import { z } from 'zod';

/** Laws the extinction stage implements (src/stellar/extinction/laws.ts). */
const LAWS = ['odonnell94', 'ccm89', 'fitzpatrick99'] as const;

/**
 * `[model]`: settings of the built-in stellar model and of the extinction law. A `[grid]` section, when
 * present, replaces the built-in evolution and photometry; the extinction settings apply to both.
 */
export const modelSection = z.strictObject({
  /** [alpha/Fe] for turning [Fe/H] into [M/H] (Salaris et al. 1993); built-in model only. */
  alpha_fe: z.number().min(-0.5).max(1).default(0),
  /** Reimers mass-loss efficiency on the giant branch (Hurley et al. 2000 use 0.5); built-in model only. */
  reimers_eta: z.number().min(0).max(3).default(0.5),
  /** odonnell94 (CCM89 with O'Donnell 1994 in the optical), ccm89, or fitzpatrick99. */
  extinction_law: z.enum(LAWS).default('odonnell94'),
  /** R_V = A_V / E(B-V); 3.1 for the diffuse interstellar medium (common practice). */
  rv: z.number().min(2).max(6).default(3.1),
});
export type ModelConfig = z.infer<typeof modelSection>;

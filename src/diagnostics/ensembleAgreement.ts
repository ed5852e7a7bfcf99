/**
 * Do the K independent ensembles agree? Each ensemble's posterior median is compared with the others'
 * within their Monte Carlo standard errors: an ensemble stuck in another mode shows up here even when its
 * walkers look well mixed among themselves.
 */
import erfc from '@stdlib/math-base-special-erfc';

export interface EnsembleAgreement {
  /** Per ensemble: (m_k - m) / sqrt(s_k^2 - 1/sum(1/s^2)), m the inverse-variance weighted mean of the medians. */
  z: number[];
  /** The ensemble with the largest |z|. */
  worst: number;
  maxAbsZ: number;
  /** Two-sided p-value of maxAbsZ, Bonferroni-corrected for the K ensembles (capped at 1). */
  pValue: number;
  /** pValue < the significance level. */
  disagree: boolean;
}

/** The significance level of the test: our choice, strict enough that a converged run rarely trips it. */
export const AGREEMENT_ALPHA = 0.01;

/**
 * z-test of the ensembles' medians m_k with MCSEs s_k. Under agreement, m_k - m has variance
 * s_k^2 - 1 / sum_j s_j^-2 (m being the inverse-variance weighted mean), so each z_k is standard normal.
 * The MCSEs come from each ensemble's walkers treated as chains, which ignores correlation between walkers
 * of one ensemble; if that correlation is strong, the MCSEs are too small and the test too eager.
 * undefined for fewer than two ensembles or any non-finite input.
 */
export function ensembleAgreement(medians: readonly number[], mcse: readonly number[], alpha = AGREEMENT_ALPHA): EnsembleAgreement | undefined {
  const k = medians.length;
  if (k < 2) return undefined;
  if (![...medians, ...mcse].every(Number.isFinite) || mcse.some((s) => s <= 0)) return undefined;
  const w = mcse.map((s) => 1 / (s * s));
  const sumW = w.reduce((a, b) => a + b, 0);
  const m = medians.reduce((a, mk, i) => a + w[i] * mk, 0) / sumW;
  const z = medians.map((mk, i) => (mk - m) / Math.sqrt(mcse[i] * mcse[i] - 1 / sumW));
  let worst = 0;
  for (let i = 1; i < k; i++) if (Math.abs(z[i]) > Math.abs(z[worst])) worst = i;
  const maxAbsZ = Math.abs(z[worst]);
  // Two-sided normal tail: 2 (1 - Phi(|z|)) = erfc(|z| / sqrt 2).
  const pValue = Math.min(1, k * erfc(maxAbsZ / Math.SQRT2));
  return { z, worst, maxAbsZ, pValue, disagree: pValue < alpha };
}

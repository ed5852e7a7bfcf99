import type { Chains } from './chains.js';
import { drawsPerChain } from './chains.js';

/**
 * Each chain cut into its first and second halves (views, no copy), so that a trend within a chain shows
 * up as disagreement between chains (split-R-hat; VEHTARI_2021, after GELMAN_RUBIN_1992). With an odd
 * number of draws the middle draw is dropped. The order is posterior's: all first halves, then all second
 * halves. A chain of one draw is returned as it is.
 */
export function splitChains(chains: Chains): Float64Array[] {
  const n = drawsPerChain(chains);
  if (n === 1) return [...chains];
  const half = Math.floor(n / 2);
  const secondStart = n - half;
  return [...chains.map((c) => c.subarray(0, half)), ...chains.map((c) => c.subarray(secondStart, n))];
}

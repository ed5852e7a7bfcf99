import type { Chains } from './chains.js';
import { medianOf } from './quantile.js';

/**
 * Folded draws |x - median(x)|, the median taken over all chains (VEHTARI_2021). R-hat of the folded
 * draws detects chains that agree in location but differ in scale.
 */
export function fold(chains: Chains): Float64Array[] {
  const med = medianOf(chains);
  return chains.map((c) => {
    const out = new Float64Array(c.length);
    for (let i = 0; i < c.length; i++) out[i] = Math.abs(c[i] - med);
    return out;
  });
}

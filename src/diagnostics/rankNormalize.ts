/**
 * Rank normalisation (VEHTARI_2021): replace every draw by the normal quantile of its fractional rank over
 * all chains, z = Phi^-1((r - 3/8) / (S - 3/4 + 1)), with tied draws given their average rank (as R's
 * `rank(ties.method = "average")`). R-hat and ESS of the normalised draws exist even when the posterior
 * has no finite mean or variance.
 */
import type { Chains } from './chains.js';
import { pool } from './chains.js';
import { argsortWithValues } from './radixSort.js';
import { normalQuantile } from './normalQuantile.js';

/** The offset of the fractional rank (Blom 1958), posterior's default. */
const BLOM_OFFSET = 3 / 8;

/**
 * Normal scores of draws given in sorted order: out[order[k]] = Phi^-1((r_k - 3/8) / (S + 1/4)), r_k the
 * average rank of sorted[k] (tied values share the mean of their positions, 1-based).
 */
export function normalScoresFromSorted(order: Uint32Array, sorted: Float64Array, out: Float64Array): void {
  const s = sorted.length;
  const denom = s - 2 * BLOM_OFFSET + 1;
  const untied = untiedScores(s);
  let i = 0;
  while (i < s) {
    const v = sorted[i];
    if (i + 1 === s || sorted[i + 1] !== v) {
      out[order[i]] = untied[i];
      i++;
      continue;
    }
    let j = i + 1;
    while (j + 1 < s && sorted[j + 1] === v) j++;
    const z = normalQuantile(((i + j) / 2 + 1 - BLOM_OFFSET) / denom);
    for (let k = i; k <= j; k++) out[order[k]] = z;
    i = j + 1;
  }
}

/**
 * The normal scores of untied ranks 1..S (the score of rank k + 1 at k), computed exactly as
 * normalScoresFromSorted computes them for i = j = k. Every parameter's bulk and folded scores of one run
 * share S, so the ~S quantile evaluations (most of the cost of rank normalisation) are done once, not
 * twice per parameter. Held weakly: the table goes when the diagnosis no longer needs it.
 */
let untiedCache: WeakRef<Float64Array> | undefined;

function untiedScores(s: number): Float64Array {
  const hit = untiedCache?.deref();
  if (hit && hit.length === s) return hit;
  const denom = s - 2 * BLOM_OFFSET + 1;
  const table = new Float64Array(s);
  for (let k = 0; k < s; k++) table[k] = normalQuantile((k + 1 - BLOM_OFFSET) / denom);
  untiedCache = new WeakRef(table);
  return table;
}

/** Average ranks (1-based) of `values` among themselves, ties sharing their mean rank. No NaN allowed. */
export function averageRanks(values: Float64Array): Float64Array {
  const { order, sorted } = argsortWithValues(values);
  const ranks = new Float64Array(values.length);
  let i = 0;
  while (i < sorted.length) {
    let j = i;
    while (j + 1 < sorted.length && sorted[j + 1] === sorted[i]) j++;
    for (let k = i; k <= j; k++) ranks[order[k]] = (i + j) / 2 + 1;
    i = j + 1;
  }
  return ranks;
}

/** Views of `flat` cut like `chains` (chain after chain). */
export function likeChains(flat: Float64Array, chains: Chains): Float64Array[] {
  const out: Float64Array[] = [];
  let off = 0;
  for (const c of chains) {
    out.push(flat.subarray(off, off + c.length));
    off += c.length;
  }
  return out;
}

/** Rank-normalised draws, in the same chain layout (new arrays). All draws must be non-NaN. */
export function rankNormalize(chains: Chains): Float64Array[] {
  const all = pool(chains);
  const { order, sorted } = argsortWithValues(all);
  normalScoresFromSorted(order, sorted, all); // each draw is overwritten by its own score
  return likeChains(all, chains);
}

/**
 * Acceptance fractions per walker and per ensemble, and walkers that have stopped moving. A walker stranded
 * in a low-probability region of an affine-invariant ensemble proposes moves that are almost always
 * rejected, so its acceptance falls far below its ensemble's.
 */
export interface StuckWalker {
  ensemble: number;
  walker: number;
  acceptance: number;
  /** The median acceptance of the walker's ensemble, for comparison. */
  ensembleMedian: number;
}

export interface Acceptance {
  /** Per chain (ensemble-major: k * nWalkers + w). */
  perWalker: Float64Array;
  /** Mean over each ensemble's walkers. */
  perEnsemble: number[];
  overall: number;
  stuck: StuckWalker[];
}

/**
 * Our rule (no publication sets one): a walker is stuck when its acceptance is below half its ensemble's
 * median walker acceptance p AND more than 5 binomial standard deviations below it (sqrt(p (1 - p) / n)
 * for n steps), so that short runs do not flag walkers by chance and long runs do not flag small
 * differences.
 */
export function acceptance(accepted: ArrayLike<number>, steps: number, nEnsembles: number, nWalkers: number): Acceptance {
  const perWalker = new Float64Array(nEnsembles * nWalkers);
  for (let i = 0; i < perWalker.length; i++) perWalker[i] = steps > 0 ? accepted[i] / steps : NaN;
  const perEnsemble: number[] = [];
  const stuck: StuckWalker[] = [];
  for (let k = 0; k < nEnsembles; k++) {
    const own = perWalker.subarray(k * nWalkers, (k + 1) * nWalkers);
    perEnsemble.push(own.reduce((s, v) => s + v, 0) / nWalkers);
    const sorted = own.slice().sort();
    const median = nWalkers % 2 ? sorted[(nWalkers - 1) / 2] : (sorted[nWalkers / 2 - 1] + sorted[nWalkers / 2]) / 2;
    const sd = Math.sqrt((median * (1 - median)) / steps);
    for (let w = 0; w < nWalkers; w++) {
      const a = own[w];
      if (a < median / 2 && median - a > 5 * sd) stuck.push({ ensemble: k, walker: w, acceptance: a, ensembleMedian: median });
    }
  }
  const overall = perWalker.reduce((s, v) => s + v, 0) / perWalker.length;
  return { perWalker, perEnsemble, overall, stuck };
}

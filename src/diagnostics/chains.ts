/**
 * The shape every diagnostic takes: the draws of one scalar quantity as a list of chains, each chain a
 * Float64Array of the same length (draws x chains). Chains are usually subarray views of one buffer, so
 * that splitting chains, dropping burn-in or selecting an ensemble costs no copy.
 */
export type Chains = readonly Float64Array[];

/**
 * Views onto a chain-major buffer: chain c is values[c * nDraws, (c + 1) * nDraws). This is the layout of
 * the chain reader's non-flat output (walker-major), and of R's draws x chains matrices (column-major).
 */
export function chainsFromBuffer(values: Float64Array, nDraws: number, nChains: number): Float64Array[] {
  if (values.length < nDraws * nChains) {
    throw new RangeError(`buffer holds ${values.length} values, fewer than ${nDraws} draws x ${nChains} chains`);
  }
  const out: Float64Array[] = [];
  for (let c = 0; c < nChains; c++) out.push(values.subarray(c * nDraws, (c + 1) * nDraws));
  return out;
}

/** Draws per chain; throws if the chains differ in length or there are none. */
export function drawsPerChain(chains: Chains): number {
  if (chains.length === 0) throw new RangeError('no chains');
  const n = chains[0].length;
  for (const c of chains) if (c.length !== n) throw new RangeError(`chains differ in length (${n} and ${c.length})`);
  return n;
}

/** Each chain without its first `discard` draws (views). */
export function dropFirst(chains: Chains, discard: number): Float64Array[] {
  return chains.map((c) => c.subarray(Math.min(discard, c.length)));
}

/** All draws of all chains in one new array, chain after chain. */
export function pool(chains: Chains): Float64Array {
  let total = 0;
  for (const c of chains) total += c.length;
  const out = new Float64Array(total);
  let off = 0;
  for (const c of chains) {
    out.set(c, off);
    off += c.length;
  }
  return out;
}

/**
 * True when a diagnostic is undefined for these draws, as posterior's `should_return_NA` decides: any
 * non-finite draw, or all draws equal to within double-precision epsilon (absolute).
 */
export function isDegenerate(chains: Chains): boolean {
  let min = Infinity;
  let max = -Infinity;
  for (const c of chains) {
    for (let i = 0; i < c.length; i++) {
      const v = c[i];
      if (!Number.isFinite(v)) return true;
      if (v < min) min = v;
      if (v > max) max = v;
    }
  }
  return !(Math.abs(max - min) >= Number.EPSILON);
}

/** True if any draw is NaN. */
export function hasNaN(chains: Chains): boolean {
  for (const c of chains) for (let i = 0; i < c.length; i++) if (Number.isNaN(c[i])) return true;
  return false;
}

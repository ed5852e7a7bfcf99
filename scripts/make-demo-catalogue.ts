/**
 * Writes demo-data/tessaly7.csv: a small synthetic B, V, I catalogue for the invented globular cluster
 * "Tessaly 7". It is a stop-gap for the demo until the end-to-end fit replaces it with a catalogue
 * simulated from the stellar model: the sequence below is a hand-drawn parametric curve shaped like a
 * colour-magnitude diagram (main sequence, turnoff, subgiant and giant branches, a clump, some
 * binaries and field stars). It is NOT physical: no isochrone, distance or reddening produced it.
 *
 * Run: npm run build && node dist/scripts/make-demo-catalogue.js
 * Deterministic: a fixed seed gives the same file every time.
 */
import mt19937 from '@stdlib/random-base-mt19937';
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeFileAtomic } from '../src/core/atomicWrite.js';

const SEED = 7;
const N_CLUSTER = 1600;
const N_FIELD = 250;

// Uniform deviates in [0, 1) from the Mersenne Twister; normal deviates by Box-Muller.
const rng = mt19937.factory({ seed: SEED }) as unknown as { normalized(): number };
const uniform = (): number => rng.normalized();
function normal(): number {
  const u = 1 - uniform();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
}

/** A point on the drawn sequence: V and B-V. */
function clusterStar(): { v: number; bv: number } {
  const r = uniform();
  if (r < 0.8) {
    // Main sequence below the turnoff at V = 19; more stars towards the faint end.
    const v = 19 + 4.6 * Math.sqrt(uniform());
    const x = v - 19;
    return { v, bv: 0.42 + 0.13 * x + 0.012 * x * x };
  }
  if (r < 0.86) {
    // Subgiant branch: nearly flat in V, reddening from the turnoff to the base of the giant branch.
    const t = uniform();
    return { v: 19 - 0.7 * t, bv: 0.42 + 0.33 * t };
  }
  if (r < 0.97) {
    // Giant branch, thinning towards its tip.
    const y = 4.5 * (1 - Math.sqrt(1 - uniform()));
    return { v: 18.3 - y, bv: 0.75 + 0.09 * y + 0.015 * y * y };
  }
  // A clump of core-helium-burning-like stars.
  return { v: 16.2 + 0.08 * normal(), bv: 0.72 + 0.03 * normal() };
}

/** 1-sigma error in magnitudes, growing towards the faint limit. */
function sigmaMag(m: number, limit: number): number {
  return 0.004 + 0.03 * 10 ** (0.4 * (m - limit));
}

const rows: string[] = ['star,Bmag,e_Bmag,Vmag,e_Vmag,Imag,e_Imag'];
const fmt = (x: number, d: number): string => x.toFixed(d);
for (let i = 0; i < N_CLUSTER + N_FIELD; i++) {
  const star = i < N_CLUSTER ? clusterStar() : { v: 14 + 9.6 * uniform(), bv: 0.3 + 1.3 * uniform() };
  const bv = star.bv;
  let v = star.v;
  // A fifth of main-sequence stars are brightened by an unseen companion (up to 0.75 mag).
  if (i < N_CLUSTER && v > 19.2 && uniform() < 0.2) v -= 0.75 * uniform();
  const vi = 0.05 + 1.05 * bv;
  const truth = { B: v + bv, V: v, I: v - vi };
  const limits = { B: 23.2, V: 22.8, I: 22.0 };
  const cells: string[] = [`T7-${String(i + 1).padStart(5, '0')}`];
  for (const band of ['B', 'V', 'I'] as const) {
    const s = sigmaMag(truth[band], limits[band]);
    const m = truth[band] + s * normal();
    // Faint B measurements are missing (below the detection limit); a few others are missing at random.
    const missing = (band === 'B' && m > 24.4) || uniform() < 0.004;
    cells.push(missing ? '' : fmt(m, 3), missing ? '' : fmt(s * (1 + 0.1 * normal()), 4));
  }
  rows.push(cells.join(','));
}

const root = resolve(fileURLToPath(import.meta.url), '../../..');
mkdirSync(resolve(root, 'demo-data'), { recursive: true });
const out = resolve(root, 'demo-data/tessaly7.csv');
writeFileAtomic(out, `${rows.join('\n')}\n`);
process.stdout.write(`wrote ${out}: ${rows.length - 1} stars (seed ${SEED})\n`);

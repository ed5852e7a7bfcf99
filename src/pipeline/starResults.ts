/**
 * Per-star results of a fit (stars.arrow, RUN_LAYOUT.stars): over a few hundred posterior draws, each
 * star's mean responsibilities for the single-star sequence, the binary sequence and the field (the
 * likelihood's own split of L_i, so they sum to 1), and its posterior median mass along the single-star
 * sequence (starMasses.ts). Draws are taken evenly over the kept (post burn-in) draws of every chain.
 */
import type { Catalog } from '../catalog/types.js';
import type { OutputTable } from '../catalog/outputTable.js';
import { CLUSTER_PARAMETER_NAMES } from '../core/parameters.js';
import type { CmdLikelihood } from '../likelihood/cmdLikelihood.js';
import { thetaObject } from '../likelihood/theta.js';
import type { ParameterSpace } from '../priors/index.js';
import type { ExtinctionModel, IsochroneSource } from '../stellar/types.js';
import { MASS_METHOD, SingleSequenceMasses } from './starMasses.js';

export interface StarResults {
  pSingle: Float64Array;
  pBinary: Float64Array;
  pField: Float64Array;
  massMedian: Float64Array;
  /** Posterior draws averaged over. */
  nDraws: number;
  /** Pooled indices of those draws among the kept draws. */
  drawIndices: number[];
}

export interface StarResultsInput {
  likelihood: CmdLikelihood;
  space: ParameterSpace;
  source: IsochroneSource;
  extinction: ExtinctionModel;
  /** Kept draws per sampled parameter (pooled, any order), by parameter name. */
  draws: Record<string, Float64Array>;
  nPooled: number;
  /** Draws to use (default 200, fewer when the run has fewer). */
  maxDraws?: number;
  seed: number;
  /** Called after each draw, with the count done. */
  onDraw?: (done: number, total: number) => void;
}

/** `count` indices spread evenly over [0, n). */
export function evenlySpaced(n: number, count: number): number[] {
  const k = Math.min(n, count);
  return Array.from({ length: k }, (_, j) => Math.floor(((j + 0.5) * n) / k));
}

export function computeStarResults(input: StarResultsInput): StarResults {
  const { likelihood, space } = input;
  const n = likelihood.nStars;
  const picks = evenlySpaced(input.nPooled, input.maxDraws ?? 200);
  const sums = { single: new Float64Array(n), binary: new Float64Array(n), field: new Float64Array(n), count: new Float64Array(n) };
  const masses = new SingleSequenceMasses(likelihood.data, input.source, input.extinction, likelihood.imf, { seed: input.seed, maxDraws: picks.length });
  const free = new Float64Array(space.free.length);
  const full = new Float64Array(CLUSTER_PARAMETER_NAMES.length);
  const fField = CLUSTER_PARAMETER_NAMES.indexOf('f_field');
  picks.forEach((idx, j) => {
    space.free.forEach((p, q) => (free[q] = input.draws[p.name][idx]));
    space.expand(free, full);
    if (Number.isNaN(full[fField])) full[fField] = 0;
    const r = likelihood.responsibilities(full);
    for (let i = 0; i < n; i++) {
      if (Number.isNaN(r.single[i])) continue;
      sums.single[i] += r.single[i];
      sums.binary[i] += r.binary[i];
      sums.field[i] += r.field[i];
      sums.count[i]++;
    }
    masses.addDraw(thetaObject(full));
    input.onDraw?.(j + 1, picks.length);
  });
  const mean = (a: Float64Array): Float64Array => a.map((v, i) => (sums.count[i] > 0 ? v / sums.count[i] : Number.NaN));
  return { pSingle: mean(sums.single), pBinary: mean(sums.binary), pField: mean(sums.field), massMedian: masses.medians(), nDraws: picks.length, drawIndices: picks };
}

/** The stars.arrow table: the catalogue as fitted, and the per-star results. */
export function starsTable(catalog: Catalog, r: StarResults, meta: Record<string, unknown>): OutputTable {
  const n = catalog.nStars;
  const columns: OutputTable['columns'] = [
    { name: 'id', description: 'star identifier (the catalogue\'s, or the row number)', values: catalog.id ?? Array.from({ length: n }, (_, i) => String(i + 1)) },
    { name: 'row', description: '0-based index in the filtered catalogue', values: Int32Array.from({ length: n }, (_, i) => i) },
  ];
  catalog.bands.forEach((b, k) => {
    columns.push({ name: b, unit: 'mag', values: Float64Array.from(catalog.mag[k]) });
    columns.push({ name: `${b}_err`, unit: 'mag', values: Float64Array.from(catalog.err[k]) });
  });
  columns.push(
    { name: 'p_single', description: 'posterior mean responsibility of the single-star sequence', values: r.pSingle },
    { name: 'p_binary', description: 'posterior mean responsibility of the binary sequence', values: r.pBinary },
    { name: 'p_field', description: 'posterior mean responsibility of the field', values: r.pField },
    { name: 'membership_prior', description: 'the catalogue\'s membership probability (NaN: none)', values: catalog.membership ? Float64Array.from(catalog.membership) : new Float64Array(n).fill(Number.NaN) },
    { name: 'mass_median', unit: 'Msun', description: 'posterior median single-star initial mass (see coeval.stars)', values: r.massMedian },
  );
  return {
    nRows: n,
    columns,
    notes: [['stars', JSON.stringify({ nDraws: r.nDraws, responsibilities: 'posterior means over nDraws draws spread evenly over the kept draws of every chain; p_single + p_binary + p_field = 1', mass_median: MASS_METHOD, ...meta })]],
  };
}

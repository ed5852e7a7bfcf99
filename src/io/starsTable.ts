/**
 * Reading a run's per-star results (stars.arrow, laid out in RUN_LAYOUT.stars): the fitted bands'
 * magnitudes and errors as the fit used them, and each star's posterior responsibilities. Plots and the
 * report read it; the fit writes it.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { BAND_IDS, type BandId } from '../core/bands.js';
import { InputError } from '../core/errors.js';
import { RUN_LAYOUT } from './runDirectory.js';

export interface StarsTable {
  path: string;
  nStars: number;
  /** Bands that have a magnitude column, in the file's order. */
  bands: BandId[];
  mag: Partial<Record<BandId, Float64Array>>;
  err: Partial<Record<BandId, Float64Array>>;
  pSingle: Float64Array;
  pBinary: Float64Array;
  pField: Float64Array;
  /** NaN where the catalogue gave no membership prior. */
  membershipPrior: Float64Array;
  /** The parsed `coeval.stars` schema metadata (e.g. how many posterior draws the averages use). */
  meta: Record<string, unknown>;
}

const REQUIRED = ['p_single', 'p_binary', 'p_field'] as const;

/** Read `stars.arrow` of a run directory; undefined when the run has none (e.g. a sampler test-bed). */
export async function readStarsTable(runDir: string): Promise<StarsTable | undefined> {
  const path = join(runDir, RUN_LAYOUT.stars);
  if (!existsSync(path)) return undefined;
  const { tableFromIPC } = await import('apache-arrow');
  let table;
  try {
    table = tableFromIPC(readFileSync(path));
  } catch (cause) {
    throw new InputError(`${RUN_LAYOUT.stars} is not an Arrow IPC file: ${(cause as Error).message}`, { where: { file: path }, cause, hint: 'run the fit again to rewrite it' });
  }
  const names = table.schema.fields.map((f) => f.name);
  const missing = REQUIRED.filter((c) => !names.includes(c));
  if (missing.length > 0) {
    throw new InputError(`${RUN_LAYOUT.stars} lacks the column(s) ${missing.join(', ')}`, { where: { file: path }, expected: `columns ${REQUIRED.join(', ')} and one magnitude column per fitted band` });
  }
  const column = (name: string): Float64Array => {
    const v = table.getChild(name);
    const out = new Float64Array(table.numRows).fill(Number.NaN);
    if (!v) return out;
    for (let i = 0; i < table.numRows; i++) {
      const x = v.get(i) as number | null;
      if (x !== null && x !== undefined) out[i] = Number(x);
    }
    return out;
  };
  const bands = names.filter((n): n is BandId => (BAND_IDS as readonly string[]).includes(n));
  const mag: StarsTable['mag'] = {};
  const err: StarsTable['err'] = {};
  for (const b of bands) {
    mag[b] = column(b);
    err[b] = column(`${b}_err`);
  }
  let meta: Record<string, unknown> = {};
  const raw = table.schema.metadata.get('coeval.stars');
  if (raw) {
    try {
      meta = JSON.parse(raw) as Record<string, unknown>;
    } catch {
      meta = { unparsed: raw };
    }
  }
  return {
    path,
    nStars: table.numRows,
    bands,
    mag,
    err,
    pSingle: column('p_single'),
    pBinary: column('p_binary'),
    pField: column('p_field'),
    membershipPrior: column('membership_prior'),
    meta,
  };
}

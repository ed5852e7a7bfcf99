/**
 * The same Gaia-shaped table (invented numbers) in every format: CSV, ECSV, FITS, VOTable TABLEDATA and
 * BINARY2 written by Debian's python3-astropy (tests/fixtures/catalog/make_fixtures.py, version in
 * versions.json), Arrow IPC file and stream and Parquet written by apache-arrow and hyparquet-writer
 * (make_arrow_parquet.js). Read with one column map, they must give identical Catalogs, bit for bit.
 * Magnitudes from fluxes are checked against numpy's (gaia_like_expected.json), and the live check
 * re-runs the astropy script into a temporary folder and reads what the installed astropy writes now.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readCatalog, type Catalog } from '../../src/catalog/index.js';
import { parseConfigText } from '../../src/config/index.js';
import { REPO_ROOT } from '../helpers/cli.js';
import { describeWithReference, REFERENCES, SYSTEM_PYTHON } from '../helpers/reference.js';

const FIXTURES = resolve(REPO_ROOT, 'tests/fixtures/catalog');
const CONFIG = parseConfigText(readFileSync(join(FIXTURES, 'gaia_like.toml'), 'utf8'), { file: join(FIXTURES, 'gaia_like.toml') }).config;
const ASTROPY_FILES = ['gaia_like.csv', 'gaia_like.ecsv', 'gaia_like.fits', 'gaia_like_tabledata.vot', 'gaia_like_binary2.vot'];
const OTHER_FILES = ['gaia_like.arrow', 'gaia_like.arrows', 'gaia_like.parquet'];

interface Expected {
  zero_points: Record<string, number>;
  dropped: Record<string, number>;
  keep: boolean[];
  G: { mag: (number | null)[]; err: (number | null)[] };
  BP: { mag: (number | null)[]; err: (number | null)[] };
  RP: { mag: (number | null)[]; err: (number | null)[] };
}
interface SourceTable {
  columns: { name: string; values: (string | number | boolean | null)[] }[];
}
const expected = JSON.parse(readFileSync(join(FIXTURES, 'gaia_like_expected.json'), 'utf8')) as Expected;
const source = JSON.parse(readFileSync(join(FIXTURES, 'gaia_like.json'), 'utf8')) as SourceTable;
const sourceColumn = (name: string) => source.columns.find((c) => c.name === name)?.values ?? [];

function read(dir: string, file: string): Promise<Catalog> {
  return readCatalog({ path: join(dir, file), catalogue: { ...CONFIG.catalogue, path: file, format: 'auto' }, photometry: CONFIG.photometry });
}

/** Everything but where it came from; typed arrays as plain arrays, so NaN compares equal to NaN. */
function comparable(c: Catalog): unknown {
  return {
    nStars: c.nStars,
    bands: c.bands,
    mag: c.mag.map((a) => Array.from(a)),
    err: c.err.map((a) => Array.from(a)),
    id: c.id,
    membership: c.membership && Array.from(c.membership),
    parallaxMas: c.parallaxMas && Array.from(c.parallaxMas),
    parallaxErrorMas: c.parallaxErrorMas && Array.from(c.parallaxErrorMas),
    filters: c.filters,
    rowsRead: c.source.rowsRead,
  };
}

describe('one table in eight files (six formats) gives identical catalogues', () => {
  const catalogs = new Map<string, Catalog>();
  beforeAll(async () => {
    for (const f of [...ASTROPY_FILES, ...OTHER_FILES]) catalogs.set(f, await read(FIXTURES, f));
  });

  it('detects each format from the content', () => {
    expect([...catalogs.values()].map((c) => c.source.format)).toEqual(['csv', 'ecsv', 'fits', 'votable', 'votable', 'arrow', 'arrow', 'parquet']);
  });

  for (const f of [...ASTROPY_FILES.slice(1), ...OTHER_FILES]) {
    it(`${f} equals gaia_like.csv exactly`, () => {
      // toEqual treats NaN as equal to NaN and compares every double exactly.
      expect(comparable(catalogs.get(f) as Catalog)).toEqual(comparable(catalogs.get('gaia_like.csv') as Catalog));
    });
  }

  it('keeps 64-bit source ids exact, including 2^63 - 1 and ids that differ in the last digit', () => {
    const keep = expected.keep;
    const ids = sourceColumn('source_id').filter((_, i) => keep[i]);
    for (const c of catalogs.values()) expect(c.id).toEqual(ids);
    expect(sourceColumn('source_id').slice(0, 3)).toEqual(['9223372036854775807', '6917528997577384320', '6917528997577384321']);
  });

  it('reports the drops of each cut as computed by the fixture script', () => {
    const c = catalogs.get('gaia_like.fits') as Catalog;
    expect(Object.fromEntries(c.filters.map((f) => [f.rule, f.dropped]))).toEqual(expected.dropped);
    expect(c.nStars).toBe(expected.keep.filter(Boolean).length);
  });

  it('converts fluxes to magnitudes as numpy does (zp - 2.5 log10 f; 2.5/ln10 sigma_f/f)', () => {
    // Tolerance: both sides evaluate the same formula in IEEE doubles; log10 may differ by an ulp or two
    // between libm and V8, i.e. ~1e-15 mag at 20 mag. 1e-13 mag leaves a margin of ~30 ulp, far below any
    // meaningful photometric difference, while catching any formula or zero-point error.
    const c = catalogs.get('gaia_like_binary2.vot') as Catalog;
    const rows = expected.keep.flatMap((k, i) => (k ? [i] : []));
    c.bands.forEach((band, b) => {
      const want = expected[band as 'G' | 'BP' | 'RP'];
      rows.forEach((row, k) => {
        const m = want.mag[row];
        const e = want.err[row];
        if (m === null || e === null) {
          expect(Number.isNaN(c.mag[b][k]), `${band} row ${row}`).toBe(true);
          expect(Number.isNaN(c.err[b][k])).toBe(true);
        } else {
          expect(Math.abs(c.mag[b][k] - m), `${band} row ${row}`).toBeLessThan(1e-13);
          expect(Math.abs(c.err[b][k] - e) / e, `${band} row ${row}`).toBeLessThan(1e-13);
        }
      });
    });
  });

  it('reads scaled integers (TSCAL/TZERO) and their TNULL as the other formats read the plain values', () => {
    const c = catalogs.get('gaia_like.fits') as Catalog;
    const memb = sourceColumn('memb_prob').filter((_, i) => expected.keep[i]);
    expect(Array.from(c.membership as Float64Array)).toEqual(memb.map((v) => (v === null ? Number.NaN : v)));
    expect(memb).toContain(null);
  });

  it('the catalogue arrays live on shared memory', () => {
    const c = catalogs.get('gaia_like.parquet') as Catalog;
    for (const a of [...c.mag, ...c.err, c.membership, c.parallaxMas, c.parallaxErrorMas]) expect(a?.buffer).toBeInstanceOf(SharedArrayBuffer);
  });
});

describeWithReference('the installed astropy writes files the readers agree on', REFERENCES.astropy, () => {
  it('re-written by astropy now, the five astropy formats still give the committed catalogue', async () => {
    const out = mkdtempSync(join(tmpdir(), 'coeval-astropy-'));
    const r = spawnSync(SYSTEM_PYTHON, [join(FIXTURES, 'make_fixtures.py'), out], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const reference = comparable(await read(FIXTURES, 'gaia_like.csv'));
    for (const f of ASTROPY_FILES) expect(comparable(await read(out, f)), f).toEqual(reference);
  });
});

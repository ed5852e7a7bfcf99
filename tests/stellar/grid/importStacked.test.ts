/**
 * Import of isochrone tables in the stacked-text layout: the hand-made fixture with the usual quirks of
 * published tables (fixtures/quirky-stacked.dat: several comment blocks, runs of blanks, a stage-label
 * column, ages in linear years, the metallicity only in a header comment as Z, a last isochrone cut
 * short), files written by our own exporter, CSV and Arrow sources, and the located errors.
 * Expected values are read off the fixture text itself (line numbers, printed numbers).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { makeTable, tableToIPC } from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { loadGridMap } from '../../../src/config/index.js';
import { InputError } from '../../../src/core/errors.js';
import { gridImportSpec } from '../../../src/pipeline/gridModel.js';
import {
  buildGrid,
  gridToArrowBytes,
  importGrid,
  readGridArrow,
  stackedText,
  stackedTextSpec,
  validateGrid,
  writeGridArrow,
  writeStackedText,
  type GridTable,
} from '../../../src/stellar/grid/index.js';
import { Phase } from '../../../src/stellar/types.js';
import { toySource } from './toyIsochrones.js';

const FIX = resolve(import.meta.dirname, 'fixtures');
const QUIRKY = join(FIX, 'quirky-stacked.dat');
const tmp = (): string => mkdtempSync(join(tmpdir(), 'coeval-grid-'));

async function importQuirky(file = QUIRKY) {
  const { grid: section, baseDir } = loadGridMap(join(FIX, 'quirky-map.toml'));
  return importGrid(gridImportSpec(section, baseDir, 'grid', [file]));
}

describe('the hand-made stacked table with quirks', () => {
  const lines = readFileSync(QUIRKY, 'utf8').split('\n');
  const lineOf = (needle: string, from = 0): number => lines.findIndex((l, i) => i >= from && l.includes(needle)) + 1;

  it('splits the stacked isochrones at their comment blocks, whatever the runs of blanks', async () => {
    const { grid } = await importQuirky();
    expect(grid.isochrones.map((i) => i.count)).toEqual([15, 15, 15, 4]);
    // First data rows of each block, found in the text.
    const firsts = ['1.0000000e+09', '1.2589254e+09', '1.5848932e+09', '1.9952623e+09'].map((a) => lineOf(`  ${a} `));
    expect(grid.isochrones.map((i) => grid.rowLine[i.start])).toEqual(firsts);
    // Ages in years become log10(age / yr): 1e9 yr is exactly 9 (a power of ten).
    expect(grid.isochrones[0].logAgeYr).toBe(9);
    expect(grid.isochrones[1].logAgeYr).toBeCloseTo(Math.log10(1.2589254e9), 14);
    // Cells as printed in the first data row (line 11).
    expect(lines[10]).toContain('0.60000    0.60000   -0.9096   3.7112   4.925    MS       8.062    7.133    6.230');
    expect([grid.massInitial[0], grid.logL[0], grid.logTeff[0], grid.logg[0], grid.mag[0][0], grid.mag[1][0], grid.mag[2][0]]).toEqual([0.6, -0.9096, 3.7112, 4.925, 8.062, 7.133, 6.23]);
  });

  it('reads the stage labels in their order, and maps them to phases', async () => {
    const { grid } = await importQuirky();
    expect(grid.meta.stageLabels).toEqual(['MS', 'SGB', 'RGB']);
    const firstRgb = lineOf(' RGB ');
    const row = grid.rowLine.indexOf(firstRgb);
    expect(grid.phaseValue![row]).toBe(2);
    expect(grid.meta.stagePhases).toEqual({ MS: Phase.MainSequence, SGB: Phase.HertzsprungGap, RGB: Phase.GiantBranch });
  });

  it('takes Z from the header comment and converts it with the stated solar Z', async () => {
    const { grid } = await importQuirky();
    expect(lines[1]).toContain('Z = 0.00400');
    // [M/H] = log10(Z / Zsun) with Zsun = 0.0152 as the map states; scaled-solar, so [Fe/H] = [M/H].
    for (const iso of grid.isochrones) {
      expect(iso.metallicityRaw).toBe(0.004);
      expect(iso.feh).toBeCloseTo(Math.log10(0.004 / 0.0152), 14);
    }
    expect(grid.meta.notes.join(' ')).toMatch(/Zsun = 0\.0152/);
  });

  it('finds the last isochrone cut short, naming its last line', async () => {
    const { grid } = await importQuirky();
    const problems = validateGrid(grid).filter((p) => p.severity === 'error');
    expect(problems).toHaveLength(1);
    const last = lines.length - 1; // the file ends with a newline
    expect(problems[0].where).toMatchObject({ file: QUIRKY, line: last });
    expect(problems[0].message).toMatch(/cut short/);
  });

  it('refuses a last line cut in the middle, naming the line', async () => {
    const dir = tmp();
    const text = readFileSync(QUIRKY, 'utf8');
    const cut = join(dir, 'cut.dat');
    writeFileSync(cut, text.slice(0, text.length - 30));
    const err = await importQuirky(cut).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).where).toMatchObject({ file: cut, line: lines.length - 1 });
    expect((err as InputError).message).toMatch(/ends in the middle of a line/);
  });

  it('names a mistyped column with a suggestion and the header line', async () => {
    const { grid: section, baseDir } = loadGridMap(join(FIX, 'quirky-map.toml'));
    section.columns!.log_teff = 'lg_Teff';
    const err = await importGrid(gridImportSpec(section, baseDir)).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).message).toMatch(/"lg_Teff" named by grid\.columns\.log_teff/);
    expect((err as InputError).hint).toMatch(/lg_Te/);
    expect((err as InputError).where?.line).toBe(11);
  });
});

describe('files from our own exporter', () => {
  const grid = buildGrid(toySource, [9.0, 9.05, 9.1], [-1.0, -0.75], ['B', 'V', 'I']);

  function expectSameRows(a: GridTable, b: GridTable): void {
    expect(b.nRows).toBe(a.nRows);
    expect(b.isochrones.map((i) => [i.logAgeYr, i.feh, i.start, i.count])).toEqual(a.isochrones.map((i) => [i.logAgeYr, i.feh, i.start, i.count]));
    for (const k of ['massInitial', 'massCurrent', 'logTeff', 'logg', 'logL', 'phaseValue'] as const) expect(Array.from(b[k]!)).toEqual(Array.from(a[k]!));
    a.mag.forEach((m, j) => expect(Array.from(b.mag[j])).toEqual(Array.from(m)));
  }

  it('round-trips the stacked-text layout bit for bit', async () => {
    const path = join(tmp(), 'grid.dat');
    writeStackedText(grid, path);
    const text = readFileSync(path, 'utf8');
    expect(text.split('\n').filter((l) => l.startsWith('# isochrone '))).toHaveLength(6);
    const back = (await importGrid(stackedTextSpec(grid, path))).grid;
    expectSameRows(grid, back);
    expect(validateGrid(back)).toEqual([]);
  });

  it('reads the same grid as CSV and as an Arrow table told apart by the age and metallicity columns', async () => {
    const dir = tmp();
    const spec = stackedTextSpec(grid, '');
    const rows = stackedText(grid).split('\n').filter((l) => l !== '' && !l.startsWith('#'));
    const header = ['log_age', 'feh', 'mass_initial', 'mass_current', 'eep', 'log_teff', 'log_g', 'log_l', 'mag_B', 'mag_V', 'mag_I'];
    const csv = join(dir, 'grid.csv');
    writeFileSync(csv, `${header.join(',')}\n${rows.map((r) => r.split(' ').join(',')).join('\n')}\n`);
    expectSameRows(grid, (await importGrid({ ...spec, files: [{ path: csv }], format: 'auto' })).grid);
    const cols = Object.fromEntries(header.map((h, j) => [h, Float64Array.from(rows.map((r) => Number(r.split(' ')[j])))]));
    const arrow = join(dir, 'grid.arrow');
    writeFileSync(arrow, tableToIPC(makeTable(cols), 'file'));
    expectSameRows(grid, (await importGrid({ ...spec, files: [{ path: arrow }], format: 'auto' })).grid);
  });

  it('reads one file per metallicity with the value given per file', async () => {
    const dir = tmp();
    const spec = stackedTextSpec(grid, '');
    const files = [-1.0, -0.75].map((feh) => {
      const path = join(dir, `feh${feh}.dat`);
      // Drop the feh column: the metallicity comes from the file entry.
      const text = stackedText(grid)
        .split('\n')
        .filter((l) => l.startsWith('#') || l === '' || l.split(' ')[1] === String(feh))
        .map((l) => (l.startsWith('#') || l === '' ? l.replace(' feh mass_initial', ' mass_initial') : l.split(' ').filter((_, j) => j !== 1).join(' ')))
        .join('\n');
      writeFileSync(path, text);
      return { path, metallicity: feh };
    });
    const back = (await importGrid({ ...spec, files, columns: { ...spec.columns, metallicity: undefined } })).grid;
    expectSameRows(grid, back);
  });

  it('caches to Arrow with provenance: checksums, column map, solar Z, citation', async () => {
    const dir = tmp();
    const path = join(dir, 'grid.dat');
    writeStackedText(grid, path);
    const imported = (await importGrid({ ...stackedTextSpec(grid, path), citation: 'Invented et al. (test)' })).grid;
    const cache = join(dir, 'grid.arrow');
    writeGridArrow(imported, cache);
    const back = readGridArrow(cache);
    expectSameRows(imported, back);
    expect(back.meta.citation).toBe('Invented et al. (test)');
    expect(back.meta.solarZ).toBe(0.02);
    expect(back.meta.columnMap).toMatchObject({ age: 'log_age', mass_initial: 'mass_initial', 'band V': 'mag_V' });
    // The checksum agrees with coreutils' sha256sum of the same file.
    const ref = execFileSync('sha256sum', [path], { encoding: 'utf8' }).split(' ')[0];
    expect(back.meta.sources).toEqual([{ path, sha256: ref, bytes: readFileSync(path).length, kind: 'text' }]);
    expect(Buffer.from(gridToArrowBytes(back)).subarray(0, 6).toString('latin1')).toBe('ARROW1');
  });
});

describe('errors in the grid, located', () => {
  const grid = buildGrid(toySource, [9.0, 9.05, 9.1, 9.15], [-1.0], ['V', 'I']);

  async function importText(edit: (lines: string[]) => string[]) {
    const path = join(tmp(), 'grid.dat');
    writeFileSync(path, edit(stackedText(grid).split('\n')).join('\n'));
    const { grid: g } = await importGrid(stackedTextSpec(grid, path));
    return { path, g, problems: validateGrid(g) };
  }

  it('a duplicate isochrone names both places', async () => {
    const { path, problems } = await importText((l) => {
      const start = l.findIndex((x) => x.startsWith('# isochrone 2 '));
      const end = l.findIndex((x) => x.startsWith('# isochrone 3 '));
      return [...l.slice(0, end - 1), ...l.slice(start - 1, end - 1), ...l.slice(end - 1)];
    });
    const dup = problems.find((p) => /duplicate/.test(p.message));
    expect(dup?.message).toMatch(new RegExp(`already start at ${path}:\\d+`));
    expect(dup?.where.file).toBe(path);
  });

  it('ages out of order', async () => {
    const { problems } = await importText((l) => l.map((x) => (x.startsWith('9.1 ') ? x.replace(/^9\.1 /, '9.2 ') : x)));
    expect(problems.some((p) => /out of order: log age 9\.1500 follows 9\.2000/.test(p.message))).toBe(true);
  });

  it('a NaN cell names the line and column', async () => {
    let target = 0;
    const { path, problems } = await importText((l) => {
      target = l.findIndex((x) => !x.startsWith('#') && x !== '') + 5;
      const f = l[target].split(' ');
      f[5] = 'nan';
      l[target] = f.join(' ');
      return l;
    });
    const p = problems.find((x) => /missing or non-finite/.test(x.message));
    expect(p?.where).toEqual({ file: path, line: target + 1, field: 'log_teff' });
  });
});

/**
 * `coeval grid import | info` and `coeval check` with a user grid, through the real CLI: located errors
 * (file and line) before any sampling, and no stack traces.
 */
import { copyFileSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { expectUserError, REPO_ROOT, runCli } from '../helpers/cli.js';

const FIX = resolve(REPO_ROOT, 'tests/stellar/grid/fixtures');
const QUIRKY = join(FIX, 'quirky-stacked.dat');

/** A folder with the fixture minus its cut-short last isochrone, its map, and a fit config naming the cache. */
function setup(): string {
  const dir = mkdtempSync(join(tmpdir(), 'coeval-cli-grid-'));
  const lines = readFileSync(QUIRKY, 'utf8').split('\n');
  const lastBlock = lines.findIndex((l) => l.includes('age = 1.9952623e+09'));
  writeFileSync(join(dir, 'tables.dat'), `${lines.slice(0, lastBlock - 1).join('\n')}\n`);
  writeFileSync(join(dir, 'map.toml'), readFileSync(join(FIX, 'quirky-map.toml'), 'utf8').replaceAll('quirky-stacked.dat', 'tables.dat'));
  copyFileSync(resolve(REPO_ROOT, 'demo-data/tessaly7.csv'), join(dir, 'stars.csv'));
  return dir;
}

function fitConfig(dir: string, extra: string, bands = ['B', 'V']): string {
  // The demo catalogue has B, V and I columns; a G band borrows the I columns (only the grid check matters here).
  const col = (b: string): string => (b === 'G' ? 'I' : b);
  const phot = bands.map((b) => `[photometry.${b}]\nmag = "${col(b)}"\nerr = "${col(b)}_err"\n`).join('');
  const text = `[catalogue]\npath = "stars.csv"\nid = "id"\n${phot}${extra}`;
  const file = join(dir, 'fit.toml');
  writeFileSync(file, text);
  return file;
}

describe('coeval grid import and info', () => {
  it('refuses the fixture whose last isochrone is cut short, naming the last line', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-cli-grid-'));
    const r = runCli(['grid', 'import', '--map', join(FIX, 'quirky-map.toml'), '--out', join(dir, 'g.arrow')]);
    const last = readFileSync(QUIRKY, 'utf8').split('\n').length - 1;
    expectUserError(r, 4, new RegExp(`quirky-stacked\\.dat:${last}: .*cut short`), /fetch the table again/);
    expect(existsSync(join(dir, 'g.arrow'))).toBe(false);
  });

  it('imports a complete table, lists it, and will not overwrite the cache', () => {
    const dir = setup();
    const out = join(dir, 'grid.arrow');
    const r = runCli(['grid', 'import', '--map', join(dir, 'map.toml'), '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/isochrones {2}3 \(45 rows/);
    const info = runCli(['grid', 'info', out]);
    expect(info.status, info.stderr).toBe(0);
    expect(info.stdout).toMatch(/\[Fe\/H\] +1 value .*from Z with solar Z = 0\.0152/);
    expect(info.stdout).toMatch(/phases +stage labels, in order: MS, SGB, RGB/);
    expect(info.stdout).toMatch(/log age +3 values from 9\.0000 to 9\.2000/);
    const json = JSON.parse(runCli(['grid', 'info', out, '--json']).stdout) as { sources: { sha256: string }[]; bands: string[] };
    expect(json.bands).toEqual(['B', 'V', 'I']);
    expect(json.sources[0].sha256).toMatch(/^[0-9a-f]{64}$/);
    expectUserError(runCli(['grid', 'import', '--map', join(dir, 'map.toml'), '--out', out]), 7, /the output file exists/, /--overwrite/);
  });
});

describe('coeval check with a user grid', () => {
  let dir: string;
  beforeAll(() => {
    dir = setup();
    const r = runCli(['grid', 'import', '--map', join(dir, 'map.toml'), '--out', join(dir, 'grid.arrow')]);
    expect(r.status, r.stderr).toBe(0);
  });
  const priors = (logAge: string, feh = '-0.5797835966') => `[priors]\nlog_age = ${logAge}\nfeh = ${feh}\ndm = { kind = "uniform", min = 10, max = 20 }\nebv = { kind = "uniform", min = 0, max = 1 }\n`;

  it('accepts a config whose priors lie inside the grid, and names the grid as the model', () => {
    const cfg = fitConfig(dir, `${priors('{ kind = "uniform", min = 9.0, max = 9.2 }')}[grid]\ncache = "grid.arrow"\n`);
    const r = runCli(['check', cfg]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/grid {8}invented family, Z = 0\.004: 3 isochrones, bands B, V, I/);
    expect(r.stdout).toMatch(/stellar model: invented family, Z = 0\.004: test fixture \(invented numbers\)/);
  });

  it('a prior reaching outside the grid: the config line, and the grid\'s range', () => {
    const cfg = fitConfig(dir, `${priors('{ kind = "uniform", min = 9.0, max = 9.4 }')}[grid]\ncache = "grid.arrow"\n`);
    const line = readFileSync(cfg, 'utf8').split('\n').findIndex((l) => l.startsWith('log_age')) + 1;
    expectUserError(runCli(['check', cfg]), 3, new RegExp(`fit\\.toml:${line}:1, key priors\\.log_age: the prior on log_age reaches 9\\.4`), /expected: a prior inside log age 9\.0000 \.\. 9\.2000/);
    const cfg2 = fitConfig(dir, `${priors('{ kind = "uniform", min = 9.0, max = 9.2 }', '{ kind = "normal", mean = -0.6, sd = 0.1 }')}[grid]\ncache = "grid.arrow"\n`);
    expectUserError(runCli(['check', cfg2]), 3, /key priors\.feh: the prior on feh is unbounded/);
  });

  it('a fitted band the grid lacks: the config line of that band', () => {
    const cfg = fitConfig(dir, `[grid]\ncache = "grid.arrow"\n`, ['B', 'V', 'G']);
    const line = readFileSync(cfg, 'utf8').split('\n').indexOf('[photometry.G]') + 1;
    expectUserError(runCli(['check', cfg]), 3, new RegExp(`fit\\.toml:${line}:1, key photometry\\.G: the band G is fitted, but the grid`), /one of the grid's bands: B, V, I/);
  });

  it('tables named in the config are imported and checked: a NaN row names its file and line', () => {
    const text = readFileSync(join(dir, 'tables.dat'), 'utf8').split('\n');
    const k = text.findIndex((l) => l.includes('1.2589254e+09')) + 3;
    text[k] = text[k].replace(/ 3\.\d{4} /, ' nan ');
    writeFileSync(join(dir, 'bad.dat'), text.join('\n'));
    const map = readFileSync(join(dir, 'map.toml'), 'utf8').replaceAll('tables.dat', 'bad.dat').replace('[grid]\n', '');
    const cfg = fitConfig(dir, `[grid]\n${map}`);
    expectUserError(runCli(['check', cfg]), 4, new RegExp(`bad\\.dat:${k + 1}, column "lg_Te": .*missing or non-finite`), /drop_nan_rows/);
  });
});

describe('coeval grid build', () => {
  it('writes the built-in model\'s grid as Arrow and as stacked text, and the text imports back to the same numbers', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-cli-build-'));
    const r = runCli(['grid', 'build', '--ages', '9.9:10.0:0.05', '--feh=-1.5,-1.25', '--bands', 'B,V,I', '--out', join(dir, 'b.arrow'), '--text', join(dir, 'b.dat')]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/isochrones {2}6 /);
    expect(readFileSync(join(dir, 'b.dat'), 'utf8').split('\n').filter((l) => l.startsWith('# isochrone '))).toHaveLength(6);
    writeFileSync(
      join(dir, 'map.toml'),
      `[grid]\nfiles = ["b.dat"]\nphase_kind = "eep"\ncitation = "built-in"\n[grid.columns]\nage = "log_age"\nmetallicity = "feh"\nmass_initial = "mass_initial"\nmass_current = "mass_current"\nphase = "eep"\nlog_teff = "log_teff"\nlog_g = "log_g"\nlog_l = "log_l"\n[grid.bands]\nB = "mag_B"\nV = "mag_V"\nI = "mag_I"\n`,
    );
    const imp = runCli(['grid', 'import', '--map', join(dir, 'map.toml'), '--out', join(dir, 'back.arrow'), '--json']);
    expect(imp.status, imp.stderr).toBe(0);
    const a = JSON.parse(runCli(['grid', 'info', join(dir, 'b.arrow'), '--json']).stdout) as { nRows: number; logAges: number[]; fehs: number[] };
    const b = JSON.parse(imp.stdout) as { nRows: number; logAges: number[]; fehs: number[] };
    expect([b.nRows, b.logAges, b.fehs]).toEqual([a.nRows, a.logAges, a.fehs]);
  });

  it('refuses malformed --ages', () => {
    expectUserError(runCli(['grid', 'build', '--ages', '10:9:0.05', '--feh=-1', '--out', join(mkdtempSync(join(tmpdir(), 'coeval-cli-build-')), 'b.arrow')]), 2, /--ages is not a list of numbers or start:stop:step/);
  });
});

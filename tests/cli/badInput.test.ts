/**
 * Bad input through the real CLI (`coeval check`), as a child process: each case must give a located
 * message, the exit code of its kind (src/core/errors.ts: 3 config, 4 input) and no stack trace.
 * Files are written to a temporary folder; FITS and VOTable cases damage the astropy-written fixtures.
 */
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { expectUserError, REPO_ROOT, runCli } from '../helpers/cli.js';

const FIXTURES = resolve(REPO_ROOT, 'tests/fixtures/catalog');
const CONFIG_ERROR = 3;
const INPUT_ERROR = 4;

const VI_MAP = `
[photometry.V]
mag = "Vmag"
err = "e_Vmag"

[photometry.I]
mag = "Imag"
err = "e_Imag"
`;

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'coeval-bad-'));
});

/** Write a catalogue and a config that maps it; return the config path. */
function setup(name: string, catalogue: string | Buffer, extra = '', map = VI_MAP, configText?: string): string {
  const sub = join(dir, name);
  mkdirSync(sub, { recursive: true });
  const file = `stars${name.includes('.') ? name.slice(name.indexOf('.')) : '.csv'}`;
  writeFileSync(join(sub, file), catalogue);
  const config = join(sub, 'run.toml');
  writeFileSync(config, configText ?? `[catalogue]\npath = "${file}"\n${extra}\n${map}`);
  return config;
}

const GOOD = 'star,Vmag,e_Vmag,Imag,e_Imag\ns1,15.10,0.010,14.20,0.012\ns2,16.25,0.020,15.31,0.018\n';

describe('coeval check on bad catalogues', () => {
  it('empty file', () => {
    const r = runCli(['check', setup('empty', '')]);
    expectUserError(r, INPUT_ERROR, /stars\.csv/, /the file is empty/);
  });

  it('header with no rows', () => {
    const r = runCli(['check', setup('header-only', 'star,Vmag,e_Vmag,Imag,e_Imag\n')]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:1/, /header but no data rows/);
  });

  it('a mapped column that is missing, with the nearest names suggested', () => {
    const r = runCli(['check', setup('missing-col', GOOD.replace('e_Imag', 'eImag'))]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:1.*key photometry\.I\.err/, /"e_Imag".*is not in the file/, /did you mean "eImag"/);
  });

  it('a non-numeric value in a numeric column, with line and column', () => {
    const r = runCli(['check', setup('non-numeric', GOOD.replace('16.25', '16.2S'))]);
    // Line 3 ("s2,16.2S,..."): the cell starts at character 4.
    expectUserError(r, INPUT_ERROR, /stars\.csv:3:4, column "Vmag"/, /not a number/, /found: "16\.2S"/);
  });

  it('a decimal comma is named as the likely cause', () => {
    const r = runCli(['check', setup('decimal-comma', 'star;Vmag;e_Vmag;Imag;e_Imag\ns1;15,10;0,010;14,20;0,012\n')]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:2:4/, /decimal comma/);
  });

  it('an error that is zero', () => {
    const r = runCli(['check', setup('zero-err', GOOD.replace('0.020', '0.000'))]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:3:10, column "e_Vmag"/, /band V: the magnitude error is zero/, /catalogue\.missing/);
  });

  it('an error that is negative', () => {
    const r = runCli(['check', setup('neg-err', GOOD.replace('0.018', '-99'))]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:3:\d+, column "e_Imag"/, /negative/, /found: -99/);
  });

  it('a band that is all missing', () => {
    const csv = 'star,Vmag,e_Vmag,Imag,e_Imag\ns1,15.1,0.01,99.999,9.999\ns2,16.2,0.02,99.999,9.999\n';
    const r = runCli(['check', setup('all-nan', csv, 'missing = [99.999, 9.999]')]);
    expectUserError(r, INPUT_ERROR, /stars\.csv, column "Imag"/, /band I: the magnitude column "Imag" has no usable value/);
  });

  it('duplicate column names', () => {
    const r = runCli(['check', setup('dup', 'star,Vmag,e_Vmag,Vmag,Imag,e_Imag\ns1,15.1,0.01,15.2,14.2,0.01\n')]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:1, column "Vmag"/, /occurs 2 times/, /column 2 .* and column 4/);
  });

  it('the wrong delimiter: a semicolon file read as comma-separated', () => {
    const r = runCli(['check', setup('semicolon', GOOD.replaceAll(',', ';'), 'delimiter = ","')]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:1:1/, /looks semicolon-separated/, /catalogue\.delimiter = ";"/);
  });

  it('a row with too few fields', () => {
    const r = runCli(['check', setup('ragged', `${GOOD}s3,17.0,0.03,16.1\n`)]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:4:1/, /has 4 fields, but the header has 5/);
  });

  it('a UTF-8 BOM and CRLF line endings simply work', () => {
    const r = runCli(['check', setup('bom-crlf', `\uFEFF${GOOD.replaceAll('\n', '\r\n')}`)]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/2 after filters; bands V, I/);
    expect(r.stdout).toMatch(/V\s+Vmag ± e_Vmag\s+15\.100 \.\. 16\.250/);
  });

  it('a BOM+CRLF file reports the right column for a bad cell', () => {
    const r = runCli(['check', setup('bom-crlf-bad', `\uFEFF${GOOD.replace('14.20', 'x').replaceAll('\n', '\r\n')}`)]);
    expectUserError(r, INPUT_ERROR, /stars\.csv:2:16, column "Imag"/);
  });
});

describe('coeval check on damaged FITS files (astropy-written fixture, then damaged)', () => {
  const map = `
[photometry.G]
flux = "phot_g_mean_flux"
flux_err = "phot_g_mean_flux_error"
zero_point = 25.6874

[photometry.RP]
flux = "phot_rp_mean_flux"
flux_err = "phot_rp_mean_flux_error"
zero_point = 24.7479
`;
  const fits = (): Buffer => readFileSync(join(FIXTURES, 'gaia_like.fits'));

  it('truncated inside the table data', () => {
    const whole = fits();
    const r = runCli(['check', setup('trunc.fits', whole.subarray(0, whole.length - 4000), '', map)]);
    expectUserError(r, INPUT_ERROR, /stars\.fits, HDU 1, row \d+/, /truncated/);
  });

  it('truncated inside a header', () => {
    const r = runCli(['check', setup('trunc-header.fits', fits().subarray(0, 2880 + 1000), '', map)]);
    expectUserError(r, INPUT_ERROR, /stars\.fits, HDU 1/, /truncated: the header of HDU 1 ends before its END card/);
  });

  it('a bad BITPIX', () => {
    const b = Buffer.from(fits());
    const at = b.indexOf('BITPIX  =');
    b.write('BITPIX  =                   12', at, 'latin1');
    const r = runCli(['check', setup('bitpix.fits', b, '', map)]);
    expectUserError(r, INPUT_ERROR, /stars\.fits, HDU 0/, /BITPIX = 12 is not valid/, /8, 16, 32, 64, -32, -64/);
  });

  it('a bad NAXIS in the table HDU', () => {
    const b = Buffer.from(fits());
    const at = b.indexOf('NAXIS   =', 2880);
    b.write('NAXIS   =                    3', at, 'latin1');
    const r = runCli(['check', setup('naxis.fits', b, '', map)]);
    expectUserError(r, INPUT_ERROR, /stars\.fits, HDU 1/, /NAXIS/);
  });
});

describe('coeval check on other formats', () => {
  it('a VOTable with malformed XML: line and column from the parser', () => {
    const text = readFileSync(join(FIXTURES, 'gaia_like_tabledata.vot'), 'utf8');
    const lines = text.split('\n');
    const k = lines.findIndex((l) => l.includes('<TD>')) + 3; // the fourth cell of the first row
    lines[k] = lines[k].replace('</TD>', '</TDX>');
    const map = `
[photometry.G]
flux = "phot_g_mean_flux"
flux_err = "phot_g_mean_flux_error"
zero_point = 25.6874

[photometry.RP]
flux = "phot_rp_mean_flux"
flux_err = "phot_rp_mean_flux_error"
zero_point = 24.7479
`;
    const r = runCli(['check', setup('bad.vot', lines.join('\n'), '', map)]);
    expectUserError(r, INPUT_ERROR, new RegExp(`stars\\.vot:${k + 1}:\\d+`), /not well-formed XML/);
  });

  it('an unsupported Parquet type', () => {
    const sub = join(dir, 'parquet');
    mkdirSync(sub, { recursive: true });
    copyFileSync(join(FIXTURES, 'timestamp_column.parquet'), join(sub, 'stars.parquet'));
    writeFileSync(join(sub, 'run.toml'), `[catalogue]\npath = "stars.parquet"\n[[catalogue.cuts]]\ncolumn = "obs_time"\nmin = 0\n${VI_MAP}`);
    const r = runCli(['check', join(sub, 'run.toml')]);
    expectUserError(r, INPUT_ERROR, /stars\.parquet, column "obs_time", key catalogue\.cuts\.0\.column/, /Parquet type TIMESTAMP/);
  });
});

describe('coeval check on bad configs and paths', () => {
  it('an unknown key, with the nearest valid key', () => {
    const r = runCli(['check', setup('unknown-key', GOOD, 'membersip = "p"')]);
    expectUserError(r, CONFIG_ERROR, /run\.toml:3.*key catalogue\.membersip/, /unknown key/, /did you mean "membership"/);
  });

  it('a wrong type', () => {
    const r = runCli(['check', setup('wrong-type', GOOD, 'hdu = "one"')]);
    expectUserError(r, CONFIG_ERROR, /run\.toml:3.*key catalogue\.hdu/, /wrong type/, /expected: a number/);
  });

  it('inverted bounds in a cut', () => {
    const r = runCli(['check', setup('inverted', GOOD, '[[catalogue.cuts]]\ncolumn = "Vmag"\nmin = 20\nmax = 10')]);
    expectUserError(r, CONFIG_ERROR, /key catalogue\.cuts\.0/, /inverted/);
  });

  it('a --set override with a wrong value', () => {
    const r = runCli(['check', setup('set-bad', GOOD), '--set', 'catalogue.hdu=-1']);
    expectUserError(r, CONFIG_ERROR, /key catalogue\.hdu/, /too small/);
  });

  it('a catalogue path that does not exist', () => {
    const config = setup('no-file', GOOD, '', VI_MAP, `[catalogue]\npath = "nowhere.csv"\n${VI_MAP}`);
    const r = runCli(['check', config]);
    expectUserError(r, INPUT_ERROR, /nowhere\.csv/, /does not exist/);
  });

  it('a config path that does not exist', () => {
    const r = runCli(['check', join(dir, 'absent.toml')]);
    expectUserError(r, INPUT_ERROR, /absent\.toml/, /does not exist/);
  });

  it('a directory where the catalogue file is expected', () => {
    const config = setup('dir-cat', GOOD, '', VI_MAP, `[catalogue]\npath = "."\n${VI_MAP}`);
    const r = runCli(['check', config]);
    expectUserError(r, INPUT_ERROR, /a directory was given where a catalogue file is expected/);
  });

  it('--debug shows the stack for a user error', () => {
    const r = runCli(['check', setup('debug', ''), '--debug']);
    expect(r.status).toBe(INPUT_ERROR);
    expect(r.stderr).toMatch(/^\s+at /m);
  });
});

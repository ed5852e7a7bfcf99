import { mkdtempSync, mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig, parseConfigText, runDirectory } from '../../src/config/index.js';
import { ConfigError, InputError, UsageError } from '../../src/core/errors.js';

const BASE = `
[catalogue]
path = "stars.csv"

[photometry.V]
mag = "Vmag"
err = "e_Vmag"

[photometry.I]
mag = "Imag"
err = "e_Imag"
`;

function configError(text: string, sets: string[] = []): ConfigError {
  try {
    parseConfigText(text, { file: 'test.toml', sets });
  } catch (e) {
    if (e instanceof ConfigError) return e;
    throw e;
  }
  throw new Error('expected a ConfigError');
}

describe('config loading', () => {
  it('fills defaults and keeps band order', () => {
    const { config } = parseConfigText(BASE, { file: 'x.toml' });
    expect(config.catalogue.format).toBe('auto');
    expect(config.catalogue.cuts).toEqual([]);
    expect(Object.keys(config.photometry)).toEqual(['V', 'I']);
    expect(config.output.overwrite).toBe(false);
  });

  it('keeps the bands in the order the file lists them, not the built-in band order', () => {
    const { config } = parseConfigText(`${BASE}\n[photometry.B]\nmag = "Bmag"\nerr = "e_Bmag"\n`);
    expect(Object.keys(config.photometry)).toEqual(['V', 'I', 'B']);
  });

  it('suggests the nearest key for an unknown key, with its line', () => {
    const e = configError(BASE.replace('path = "stars.csv"', 'path = "stars.csv"\nmembersip = "pmem"'));
    expect(e.where?.key).toBe('catalogue.membersip');
    expect(e.where?.line).toBe(4);
    expect(e.hint).toContain('"membership"');
    expect(e.describe()).toContain('test.toml:4');
  });

  it('suggests a band for an unknown band table', () => {
    const e = configError(BASE.replace('[photometry.I]', '[photometry.Ic]'));
    expect(e.where?.key).toBe('photometry.Ic');
    expect(e.hint).toContain('"I"');
  });

  it('names the key, the value found and the type expected for a wrong type', () => {
    const e = configError(BASE.replace('path = "stars.csv"', 'path = "stars.csv"\nhdu = "one"'));
    expect(e.where?.key).toBe('catalogue.hdu');
    expect(e.found).toBe('one');
    expect(e.expected).toMatch(/number/);
  });

  it('rejects inverted bounds in a cut', () => {
    const e = configError(`${BASE}\n[[catalogue.cuts]]\ncolumn = "p"\nmin = 0.9\nmax = 0.1\n`);
    expect(e.where?.key).toBe('catalogue.cuts.0');
    expect(e.message).toMatch(/inverted/);
  });

  it('reports TOML syntax errors with line and column', () => {
    const e = configError('[catalogue\npath = 1');
    expect(e.where?.line).toBe(1);
    expect(e.where?.column).toBeGreaterThan(0);
  });

  it('applies --set overrides after the file, as TOML values or plain strings', () => {
    const { config } = parseConfigText(BASE, { sets: ['catalogue.path=other.csv', 'catalogue.hdu=2', 'output.overwrite=true'] });
    expect(config.catalogue.path).toBe('other.csv');
    expect(config.catalogue.hdu).toBe(2);
    expect(config.output.overwrite).toBe(true);
  });

  it('validates overrides like the file', () => {
    const e = configError(BASE, ['catalogue.hdu=-1']);
    expect(e.where?.key).toBe('catalogue.hdu');
  });

  it('rejects a malformed --set', () => {
    expect(() => parseConfigText(BASE, { sets: ['nonsense'] })).toThrow(UsageError);
  });

  it('asks for two bands at least', () => {
    const e = configError(BASE.replace(/\[photometry\.I\][^[]*/, ''));
    expect(e.message).toMatch(/two bands/);
  });

  it('gives located errors for a missing file and a directory', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-cfg-'));
    expect(() => loadConfig(join(dir, 'nope.toml'))).toThrow(InputError);
    mkdirSync(join(dir, 'sub.toml'));
    expect(() => loadConfig(join(dir, 'sub.toml'))).toThrow(/directory/);
  });

  it('resolves the run directory against the config folder', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-cfg-'));
    writeFileSync(join(dir, 'mycluster.toml'), BASE);
    expect(runDirectory(loadConfig(join(dir, 'mycluster.toml')))).toBe(join(dir, 'runs', 'mycluster'));
  });
});

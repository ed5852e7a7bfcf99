/**
 * A TOML syntax error in any of the three kinds of TOML file (fit config, simulation config, grid column
 * map) is a ConfigError that names the file with the line and column of the fault. The positions are those
 * of the TOML 1.0 grammar (https://toml.io/en/v1.0.0): a key/value pair needs `=`, so the parser stops on
 * line 3 of each text below.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadGridMap, parseConfigText, parseSimulationConfigText } from '../../src/config/index.js';
import { ConfigError } from '../../src/core/errors.js';

const BROKEN = '[catalogue]\npath = "stars.csv"\nid "name"\n';

function thrown(f: () => unknown): ConfigError {
  try {
    f();
  } catch (e) {
    if (e instanceof ConfigError) return e;
    throw e;
  }
  throw new Error('expected a ConfigError');
}

describe('TOML syntax errors are located', () => {
  it('in a fit config', () => {
    const e = thrown(() => parseConfigText(BROKEN, { file: 'fit.toml' }));
    expect(e.message).toMatch(/^the config is not valid TOML/);
    expect(e.where).toMatchObject({ file: 'fit.toml', line: 3 });
    expect(e.where?.column).toBeGreaterThanOrEqual(1);
  });

  it('in a simulation config', () => {
    const e = thrown(() => parseSimulationConfigText(BROKEN.replace('[catalogue]', '[simulate]'), { file: 'sim.toml' }));
    expect(e.message).toMatch(/^the simulation config is not valid TOML/);
    expect(e.where).toMatchObject({ file: 'sim.toml', line: 3 });
  });

  it('in a grid column map read from disk', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-toml-'));
    const file = join(dir, 'map.toml');
    writeFileSync(file, BROKEN.replace('[catalogue]', '[grid]'));
    const e = thrown(() => loadGridMap(file));
    expect(e.message).toMatch(/^the column map is not valid TOML/);
    expect(e.where).toMatchObject({ file, line: 3 });
  });
});

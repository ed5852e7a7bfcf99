/** A config with a [grid] section gives the grid as its isochrone source; without one, the built-in model. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseConfigText } from '../../src/config/index.js';
import { stellarSetupFromConfig } from '../../src/pipeline/index.js';
import { buildGrid, GridSource, writeGridArrow } from '../../src/stellar/grid/index.js';
import { toySource } from '../stellar/grid/toyIsochrones.js';

const BASE = `[catalogue]\npath = "x.csv"\n[photometry.V]\nmag = "V"\nerr = "eV"\n[photometry.I]\nmag = "I"\nerr = "eI"\n`;

describe('stellarSetupFromConfig', () => {
  it('a [grid] cache replaces the built-in model; the extinction law still comes from [model]', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-setup-'));
    writeGridArrow(buildGrid(toySource, [9.0, 9.05], [-1.0], ['V', 'I']), join(dir, 'g.arrow'));
    const loaded = parseConfigText(`${BASE}[model]\nrv = 3.3\n[grid]\ncache = "g.arrow"\n`, { baseDir: dir });
    const setup = await stellarSetupFromConfig(loaded);
    expect(setup.source).toBeInstanceOf(GridSource);
    expect(setup.source.domain).toEqual({ logAgeYr: [9.0, 9.05], feh: [-1.0, -1.0] });
    expect(setup.source.isochrone(9.025, -1.0, { bands: ['V', 'I'] })?.absMag).toHaveLength(2);
    expect(setup.extinction.provenance).toMatch(/3\.3/);
  });

  it('without [grid], the built-in model', async () => {
    const setup = await stellarSetupFromConfig(parseConfigText(BASE, { baseDir: tmpdir() }));
    expect(setup.source).not.toBeInstanceOf(GridSource);
    expect(setup.source.provenance.model).toMatch(/built-in/);
  });
});

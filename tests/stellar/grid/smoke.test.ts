import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, it } from 'vitest';
import { buildGrid, GridSource, importGrid, stackedTextSpec, writeStackedText, validateGrid, writeGridArrow, readGridArrow, gridInfo, formatGridInfo } from '../../../src/stellar/grid/index.js';
import { toySource } from './toyIsochrones.js';

it('smoke', async () => {
  const g = buildGrid(toySource, [9.0, 9.05, 9.1], [-1, -0.75], ['B', 'V', 'I']);
  const dir = mkdtempSync(join(tmpdir(), 'grid-'));
  writeStackedText(g, join(dir, 'g.dat'));
  const { grid, details } = await importGrid(stackedTextSpec(g, join(dir, 'g.dat')));
  console.log(details, validateGrid(grid));
  writeGridArrow(grid, join(dir, 'g.arrow'));
  const back = readGridArrow(join(dir, 'g.arrow'));
  console.log(formatGridInfo(gridInfo(back)));
  const src = new GridSource(back);
  const iso = src.isochrone(9.025, -0.9, { bands: ['V'] })!;
  console.log(iso.massInitial.length, iso.absMag[0].slice(0, 5), iso.phaseCoord.slice(0, 5));
  const node = src.isochrone(9.05, -1, { bands: ['V'] })!;
  expect(Array.from(node.absMag[0])).toEqual(Array.from(g.mag[1].slice(g.isochrones[1].start, g.isochrones[1].start + g.isochrones[1].count)));
});

/**
 * Child process for bench/grids.ts: import a stacked-text grid and write its Arrow cache (or, as the
 * reference, read the file's bytes and count its lines), then print {ms, cpuMs, maxRssMB, rows} as JSON.
 *   node dist/bench/gridImport.js import MAP OUT
 *   node dist/bench/gridImport.js bytes FILE
 */
import { readFileSync } from 'node:fs';
import { loadGridMap } from '../src/config/index.js';
import { gridImportSpec } from '../src/pipeline/gridModel.js';
import { assertGridValid, importGrid, validateGrid, writeGridArrow } from '../src/stellar/grid/index.js';

async function main(): Promise<void> {
  const [mode, a, b] = process.argv.slice(2);
  const c0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  let rows = 0;
  if (mode === 'bytes') {
    const buf = readFileSync(a);
    for (let i = 0; i < buf.length; i++) if (buf[i] === 10) rows++;
  } else {
    const { grid: section, baseDir } = loadGridMap(a);
    const { grid } = await importGrid(gridImportSpec(section, baseDir));
    assertGridValid(validateGrid(grid), 'bench grid');
    writeGridArrow(grid, b);
    rows = grid.nRows;
  }
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const cpu = process.cpuUsage(c0);
  process.stdout.write(`${JSON.stringify({ ms, cpuMs: (cpu.user + cpu.system) / 1000, maxRssMB: process.resourceUsage().maxRSS / 1024, rows })}\n`);
}

void main();

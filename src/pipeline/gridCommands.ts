/** Library side of `coeval grid import | info | build`. */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { isBandId, type BandId } from '../core/bands.js';
import { OutputError, UsageError } from '../core/errors.js';
import { loadGridMap } from '../config/index.js';
import type { GridInfo } from '../stellar/grid/index.js';
import { gridImportSpec } from './gridModel.js';

export interface GridCommandArgs {
  action: 'import' | 'info' | 'build';
  files: string[];
  map?: string;
  out?: string;
  overwrite: boolean;
  ages?: string;
  feh?: string;
  bands: string;
  alphaFe: number;
  text?: string;
}

export async function runGridCommand(a: GridCommandArgs, info: (m: string) => void): Promise<{ text: string; json: unknown }> {
  const g = await import('../stellar/grid/index.js');
  if (a.action === 'info') {
    if (a.files.length !== 1) throw new UsageError('grid info takes one grid cache', { hint: 'coeval grid info grid.arrow' });
    const grid = g.readGridArrow(resolve(a.files[0]));
    const gi: GridInfo = g.gridInfo(grid);
    const problems = g.validateGrid(grid);
    const extra = problems.map((p) => `problem     ${p.severity}: ${p.message}`);
    return { text: [g.formatGridInfo(gi), ...extra].join('\n'), json: { ...gi, problems } };
  }
  const out = resolve(a.out ?? 'grid.arrow');
  refuseExisting(out, a.overwrite);
  if (a.action === 'import') {
    if (!a.map) throw new UsageError('grid import needs the column map', { hint: 'coeval grid import --map map.toml [tables...] --out grid.arrow' });
    const { grid: section, baseDir } = loadGridMap(a.map);
    const spec = gridImportSpec(section, baseDir, 'grid', a.files.length > 0 ? a.files : undefined);
    info(`coeval grid import: reading ${spec.files.length} table${spec.files.length === 1 ? '' : 's'}`);
    const { grid, details } = await g.importGrid(spec);
    for (const d of details) info(`  ${d.path}: ${d.detail}`);
    const warnings = g.assertGridValid(g.validateGrid(grid), 'the grid tables have a problem');
    for (const w of warnings) info(`warning: ${w.message}`);
    g.writeGridArrow(grid, out);
    info(`wrote ${out}`);
    const gi = g.gridInfo(grid);
    return { text: g.formatGridInfo(gi), json: { written: out, ...gi } };
  }
  // build
  if (!a.ages || !a.feh) throw new UsageError('grid build needs --ages and --feh', { hint: 'e.g. coeval grid build --ages 9.0:10.1:0.05 --feh -2:0:0.25 --bands B,V,I' });
  const ages = parseValues(a.ages, '--ages');
  const fehs = parseValues(a.feh, '--feh');
  const bands = a.bands.split(',').map((s) => s.trim());
  const bad = bands.find((b) => !isBandId(b));
  if (bad !== undefined) throw new UsageError(`unknown band "${bad}" in --bands`, { hint: 'bands: U, B, V, R, I, G, BP, RP, J, H, Ks' });
  const { builtinIsochroneSource } = await import('./builtinModel.js');
  const source = builtinIsochroneSource(bands as BandId[], a.alphaFe);
  info(`coeval grid build: ${ages.length} ages x ${fehs.length} metallicities from ${source.provenance.model}`);
  const grid = g.buildGrid(source, ages, fehs, bands as BandId[]);
  g.writeGridArrow(grid, out);
  info(`wrote ${out}`);
  if (a.text) {
    const t = resolve(a.text);
    refuseExisting(t, a.overwrite);
    g.writeStackedText(grid, t);
    info(`wrote ${t} (stacked-text layout)`);
  }
  const gi = g.gridInfo(grid);
  return { text: g.formatGridInfo(gi), json: { written: out, ...gi } };
}

function refuseExisting(path: string, overwrite: boolean): void {
  if (existsSync(path) && !overwrite) {
    throw new OutputError('the output file exists', { where: { file: path }, hint: 'choose another --out, or add --overwrite to replace it' });
  }
}

/** "a,b,c" or "start:stop:step" (stop included when it falls on the step, to 1e-9). */
export function parseValues(s: string, flag: string): number[] {
  const bad = (): UsageError => new UsageError(`${flag} is not a list of numbers or start:stop:step`, { found: s, expected: 'e.g. 9.0,9.05,9.1 or 9.0:10.1:0.05' });
  if (s.includes(':')) {
    const p = s.split(':').map(Number);
    if (p.length !== 3 || p.some((x) => !Number.isFinite(x)) || !(p[2] > 0) || p[1] < p[0]) throw bad();
    const n = Math.floor((p[1] - p[0]) / p[2] + 1e-9);
    if (n > 10000) throw bad();
    // Values are rounded to 10 decimals so that 9.0 + 3 * 0.05 is written 9.15, a node users can type.
    return Array.from({ length: n + 1 }, (_, k) => Number((p[0] + k * p[2]).toFixed(10)));
  }
  const v = s.split(',').map((x) => Number(x.trim()));
  if (v.length === 0 || v.some((x) => !Number.isFinite(x))) throw bad();
  return v;
}

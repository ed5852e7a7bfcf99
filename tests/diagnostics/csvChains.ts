import { readFileSync } from 'node:fs';

/** Read a fixture CSV (header w0,w1,..., one row per draw) into one Float64Array per column. */
export function readCsvChains(path: string): Float64Array[] {
  const lines = readFileSync(path, 'utf8').trim().split('\n');
  const nChains = lines[0].split(',').length;
  const out = Array.from({ length: nChains }, () => new Float64Array(lines.length - 1));
  for (let i = 1; i < lines.length; i++) {
    const cells = lines[i].split(',');
    for (let c = 0; c < nChains; c++) out[c][i - 1] = Number(cells[c]);
  }
  return out;
}

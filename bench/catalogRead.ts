/**
 * Child process for bench/catalog.ts: reads one catalogue (or, as the reference, just the file's bytes)
 * and prints {ms, cpuMs, maxRssMB, nStars} as JSON, so that each measurement has a process and a peak RSS of its own.
 *   node dist/bench/catalogRead.js catalog CONFIG
 *   node dist/bench/catalogRead.js bytes FILE
 */
import { readFileSync } from 'node:fs';
import { loadConfig } from '../src/config/index.js';
import { readConfiguredCatalog } from '../src/catalog/index.js';

async function main(): Promise<void> {
  const [mode, path] = process.argv.slice(2);
  const c0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  let nStars = 0;
  if (mode === 'bytes') nStars = readFileSync(path).length;
  else nStars = (await readConfiguredCatalog(loadConfig(path))).nStars;
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const cpu = process.cpuUsage(c0);
  const cpuMs = (cpu.user + cpu.system) / 1000;
  const maxRssMB = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(`${JSON.stringify({ ms, cpuMs, maxRssMB, nStars })}\n`);
}

void main();

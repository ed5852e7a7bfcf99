/**
 * Chain files and diagnostics at the scale of a long run: 3 ensembles x 32 walkers x 10^5 steps = 10^7
 * rows of 4 parameters. Each measurement runs in a child process (bench/chainsChild.ts) so that its peak
 * RSS is its own. References measured in the same run: an idle node process that loads the same modules
 * (for memory), the same work on a tenth of the chain, and the diagnostics in the main thread only
 * (diagnoseRun) against the worker threads that `coeval diagnose` uses (diagnoseRunAsync).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchGroup } from './harness.js';

const child = resolve(fileURLToPath(import.meta.url), '../chainsChild.js');

interface ChildResult {
  wallS: number;
  cpuS: number;
  peakRssMb: number;
  verdict?: string;
  draws?: number;
}

function run(...args: string[]): ChildResult {
  const r = spawnSync(process.execPath, [child, ...args], { encoding: 'utf8', maxBuffer: 1 << 20 });
  if (r.status !== 0) throw new Error(`chainsChild ${args.join(' ')} failed: ${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop() as string) as ChildResult;
}

export const chainsBench: BenchGroup = {
  name: 'chains',
  describe: 'writing 10^7 chain rows (3 x 32 walkers x 10^5 steps, 4 parameters): peak RSS; diagnostics on them: time',
  async run(ctx) {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-bench-chains-'));
    try {
      const idle = run('idle');
      const tenthWrite = run('write', join(dir, 'tenth'), '10000');
      const fullWrite = run('write', join(dir, 'full'), '100000');
      ctx.record({ name: 'write 10^7 rows: peak RSS', value: fullWrite.peakRssMb, unit: 'MB', target: { op: '<=', value: 300 }, reference: { name: 'idle node process with the same modules', value: idle.peakRssMb } });
      ctx.record({ name: 'write 10^7 rows: peak RSS, a tenth of the rows', value: tenthWrite.peakRssMb, unit: 'MB', note: 'flat memory: about the same as for all rows' });
      ctx.record({ name: 'write 10^7 rows: wall time', value: fullWrite.wallS, unit: 's', reference: { name: 'a tenth of the rows', value: tenthWrite.wallS }, note: `CPU ${fullWrite.cpuS.toFixed(1)} s; includes generating the AR(1) draws` });
      const tenthDiag = run('diagnose', join(dir, 'tenth'));
      // diagnoseRunAsync (worker threads, the CLI's path) against diagnoseRun in the main thread, alternately.
      const fullDiag = run('diagnose', join(dir, 'full'));
      const fullSync = run('diagnose-sync', join(dir, 'full'));
      ctx.record({
        name: 'diagnose + summary of 10^7 rows (read, tau, R-hat, ESS, MCSE, agreement)',
        value: fullDiag.wallS,
        unit: 's',
        target: { op: '<=', value: 10 },
        reference: { name: 'the same in the main thread (diagnoseRun)', value: fullSync.wallS },
        note: `worker threads: CPU ${fullDiag.cpuS.toFixed(1)} s; main thread only: CPU ${fullSync.cpuS.toFixed(1)} s; wall ratio ${(fullSync.wallS / fullDiag.wallS).toFixed(2)}; a tenth of the chain: ${tenthDiag.wallS.toFixed(1)} s wall; verdict ${fullDiag.verdict}; machine shared with other developers, times are noisy`,
      });
      ctx.record({
        name: 'diagnose 10^7 rows: peak RSS',
        value: fullDiag.peakRssMb,
        unit: 'MB',
        reference: { name: 'the same in the main thread', value: fullSync.peakRssMb },
        note: `a tenth of the chain: ${tenthDiag.peakRssMb.toFixed(0)} MB`,
      });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};

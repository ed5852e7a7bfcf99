import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { medianMs, type BenchGroup } from './harness.js';

const root = resolve(fileURLToPath(import.meta.url), '../../..');

function timeCommand(args: string[], n: number): number {
  const samples: number[] = [];
  for (let i = 0; i < n + 2; i++) {
    const t0 = process.hrtime.bigint();
    const r = spawnSync(process.execPath, args, { cwd: root, stdio: 'ignore' });
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    if (r.status !== 0) throw new Error(`${args.join(' ')} exited ${r.status}`);
    if (i >= 2) samples.push(ms);
  }
  return medianMs(samples);
}

function duMegabytes(path: string): number {
  const r = spawnSync('du', ['-sk', path], { encoding: 'utf8' });
  return Number(r.stdout.split('\t')[0]) / 1024;
}

export const startupBench: BenchGroup = {
  name: 'startup',
  describe: '`coeval --help` start-up time and install size',
  async run(ctx) {
    const bare = timeCommand(['-e', ''], 15);
    const help = timeCommand(['bin/coeval.js', '--help'], 15);
    // The same CLI without the yargs bundle (scripts/bundle-cli.mjs), to show what bundling buys.
    const unbundled = timeCommand(['--input-type=module', '-e', "const m = await import('./dist/src/cli/main.js'); await m.main(['--help']);"], 15);
    ctx.record({ name: 'coeval --help, median of 15', value: help, unit: 'ms', target: { op: '<=', value: 300 }, reference: { name: 'bare `node -e ""`', value: bare } });
    ctx.record({ name: 'coeval --help without the yargs bundle', value: unbundled, unit: 'ms', reference: { name: 'bundled', value: help } });
    ctx.record({ name: 'node_modules size (du)', value: duMegabytes(resolve(root, 'node_modules')), unit: 'MB', note: 'includes devDependencies' });
  },
};

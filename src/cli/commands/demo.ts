import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import type { CommandSpec } from './types.js';

const repoRoot = resolve(fileURLToPath(import.meta.url), '../../../../..');

export const demoCommand: CommandSpec = {
  command: 'demo',
  describe: 'fit the invented demo cluster Tessaly 7 (configs/demo.toml) and write its run directory and report',
  builder: (y) =>
    y
      .option('out', { type: 'string', default: 'runs/demo', describe: 'the run directory (replaced if it exists)' })
      .option('workers', { type: 'string', describe: 'worker threads: a number or auto (default auto: one per core)' }),
  async run(args, ctx) {
    const { mkdirSync } = await import('node:fs');
    const { dirname } = await import('node:path');
    const { fit } = await import('../../pipeline/fit.js');
    const { formatFitResult } = await import('../../pipeline/fitText.js');
    const { progressReporter } = await import('../../sampler/index.js');
    const { UsageError } = await import('../../core/errors.js');
    const file = resolve(repoRoot, 'configs/demo.toml');
    const out = resolve(String(args.out));
    mkdirSync(dirname(out), { recursive: true });
    const w = args.workers as string | undefined;
    const workers = w === undefined || w === 'auto' ? undefined : Number(w);
    if (workers !== undefined && !(Number.isInteger(workers) && workers >= 0)) throw new UsageError(`--workers must be a whole number >= 0 or auto, got ${w}`);
    ctx.out.info(`coeval demo: fitting the invented globular cluster "Tessaly 7" (config ${file}).`);
    ctx.out.info('Its catalogue is synthetic (demo-data/tessaly7.csv, made by coeval simulate); the truth is in demo-data/tessaly7.truth.json.\n');
    const r = await fit({
      config: file,
      sets: ctx.args.set,
      runDir: out,
      overwrite: true,
      workers,
      observers: [progressReporter({ quiet: ctx.out.quiet })],
      log: (line) => ctx.out.info(line),
      warn: (line) => ctx.out.warn(line),
    });
    ctx.out.result(formatFitResult(r));
    ctx.out.info(`\nopen ${resolve(r.runDir, 'report.html')} in a browser for the figures and provenance.`);
    return 0;
  },
};

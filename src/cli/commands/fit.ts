import type { CommandSpec } from './types.js';

export const fitCommand: CommandSpec = {
  command: 'fit [config]',
  describe: 'fit a cluster: sample the posterior of age, [Fe/H], distance and reddening, and write a run directory',
  builder: (y) =>
    y
      .positional('config', { type: 'string', describe: 'the TOML config (not needed with --resume)' })
      .option('resume', { type: 'string', describe: 'continue the run in this directory from its checkpoint' })
      .option('overwrite', { type: 'boolean', default: false, describe: 'replace an existing run directory' })
      .option('workers', { type: 'string', describe: 'worker threads: a number (0 = main thread) or auto (default: [sampler] workers)' })
      .option('seed', { type: 'number', describe: 'run seed (default: [sampler] seed, else drawn and recorded)' })
      .option('report', { type: 'boolean', default: true, describe: 'write plots/ and report.html after sampling (--no-report: skip; coeval report can make them later)' })
      .option('out', { type: 'string', describe: 'the run directory (default: [output] dir, else runs/<config name>)' }),
  async run(args, ctx) {
    const { fit } = await import('../../pipeline/fit.js');
    const { formatFitResult, fitResultJson } = await import('../../pipeline/fitText.js');
    const { progressReporter } = await import('../../sampler/index.js');
    const { UsageError } = await import('../../core/errors.js');
    const w = args.workers as string | undefined;
    let workers: number | 'auto' | undefined;
    if (w !== undefined) {
      workers = w === 'auto' ? 'auto' : Number(w);
      if (workers !== 'auto' && !(Number.isInteger(workers) && workers >= 0)) throw new UsageError(`--workers must be a whole number >= 0 or auto, got ${w}`);
    }
    if (args.resume !== undefined && args.config !== undefined) {
      ctx.out.warn(`resuming ${String(args.resume)}: the config in its manifest is used, not ${String(args.config)}`);
    }
    const r = await fit({
      config: args.config as string | undefined,
      sets: ctx.args.set,
      resume: args.resume as string | undefined,
      overwrite: args.overwrite as boolean,
      workers,
      seed: args.seed as number | undefined,
      runDir: args.out as string | undefined,
      report: args.report as boolean,
      observers: [progressReporter({ quiet: ctx.out.quiet })],
      log: (line) => ctx.out.info(line),
      warn: (line) => ctx.out.warn(line),
    });
    ctx.out.result(ctx.args.json ? JSON.stringify(fitResultJson(r), null, 2) : formatFitResult(r));
    if (r.diagnosis.diagnosis.verdict.status !== 'converged') ctx.out.warn(`${r.diagnosis.diagnosis.verdict.headline} (resume with: coeval fit --resume ${r.runDir} --set sampler.steps=N)`);
    return 0;
  },
};

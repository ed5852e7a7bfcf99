import type { CommandSpec } from './types.js';

export const testbedCommand: CommandSpec = {
  command: 'testbed <target> <run_dir>',
  describe: 'run the sampler on an analytic target into a run directory (to try diagnose, summary, resume)',
  builder: (y) =>
    y
      .positional('target', { choices: ['gaussian'] as const, describe: 'gaussian: a normal with means 1..d and sd 0.5, 1, 1.5, ...' })
      .positional('run_dir', { type: 'string', describe: 'the run directory to create (or resume)' })
      .option('ndim', { type: 'number', default: 3, describe: 'dimensions of the target' })
      .option('walkers', { type: 'number', default: 16, describe: 'walkers per ensemble' })
      .option('ensembles', { type: 'number', default: 3, describe: 'independent ensembles' })
      .option('steps', { type: 'number', default: 2000, describe: 'steps (the cap, with --auto)' })
      .option('auto', { type: 'boolean', default: false, describe: 'stop once the run is longer than 50 tau' })
      .option('seed', { type: 'number', default: 1, describe: 'run seed' })
      .option('resume', { type: 'boolean', default: false, describe: 'continue the run in run_dir from its checkpoint' })
      .option('overwrite', { type: 'boolean', default: false, describe: 'replace an existing run directory' }),
  async run(args, ctx) {
    const { runTestbed } = await import('../../pipeline/testbedRun.js');
    const { progressReporter } = await import('../../sampler/index.js');
    const r = await runTestbed({
      runDir: String(args.run_dir),
      ndim: args.ndim as number,
      nWalkers: args.walkers as number,
      nEnsembles: args.ensembles as number,
      steps: args.steps as number,
      auto: args.auto as boolean,
      seed: args.seed as number,
      resume: args.resume as boolean,
      overwrite: args.overwrite as boolean,
      observers: [progressReporter({ quiet: ctx.out.quiet })],
    });
    ctx.out.result(`${r.runDir}: ${r.result.steps} steps (${r.result.stoppedBy}); acceptance ${r.result.acceptance.map((a) => a.toFixed(2)).join(', ')}`);
    ctx.out.info(`next: coeval diagnose ${String(args.run_dir)}`);
    return 0;
  },
};

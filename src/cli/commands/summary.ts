import type { CommandSpec } from './types.js';

export const summaryCommand: CommandSpec = {
  command: 'summary <run_dir>',
  describe: 'posterior summary of a run: medians, 16/84 and 2.5/97.5% percentiles, MAP, ESS, R-hat',
  builder: (y) =>
    y
      .positional('run_dir', { type: 'string', describe: 'the run directory a fit wrote' })
      .option('format', { choices: ['text', 'csv', 'json', 'latex'] as const, default: 'text', describe: 'output format (LaTeX: one table row)' })
      .option('discard', { type: 'number', describe: 'steps to drop as burn-in (default: 2 tau_max, estimated from the second half of the chains)' })
      .option('thin', { type: 'number', default: 1, describe: 'keep every n-th step' }),
  async run(args, ctx) {
    const { diagnoseRunAsync } = await import('../../pipeline/diagnoseRun.js');
    const { formatSummary } = await import('../../report/summaryFormats.js');
    const r = await diagnoseRunAsync(String(args.run_dir), { discard: args.discard as number | undefined, thin: args.thin as number });
    const format = ctx.args.json ? 'json' : (args.format as 'text' | 'csv' | 'json' | 'latex');
    ctx.out.result(formatSummary(r.summary, format, { runId: r.manifest.runId, drawsLine: r.drawsLine }));
    if (r.diagnosis.verdict.status !== 'converged') ctx.out.warn(`${r.diagnosis.verdict.headline} (coeval diagnose ${String(args.run_dir)} says more)`);
    return 0;
  },
};

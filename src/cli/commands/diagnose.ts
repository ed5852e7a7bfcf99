import type { CommandSpec } from './types.js';

export const diagnoseCommand: CommandSpec = {
  command: 'diagnose <run_dir>',
  describe: 'convergence of a run: verdict, R-hat, ESS, tau, MCSE, acceptance (also while it runs)',
  builder: (y) =>
    y
      .positional('run_dir', { type: 'string', describe: 'the run directory a fit wrote' })
      .option('discard', { type: 'number', describe: 'steps to drop as burn-in (default: 2 tau_max, estimated from the second half of the chains)' })
      .option('thin', { type: 'number', default: 1, describe: 'keep every n-th step' }),
  async run(args, ctx) {
    const { diagnoseRunAsync } = await import('../../pipeline/diagnoseRun.js');
    const { formatDiagnosis, diagnosisJson } = await import('../../report/diagnosisText.js');
    const { formatSummary } = await import('../../report/summaryFormats.js');
    const r = await diagnoseRunAsync(String(args.run_dir), { discard: args.discard as number | undefined, thin: args.thin as number });
    const info = { runId: r.manifest.runId, drawsLine: r.drawsLine, provenance: r.provenance };
    if (ctx.args.json) {
      ctx.out.result(JSON.stringify({ diagnosis: diagnosisJson(r.diagnosis, info), summary: JSON.parse(formatSummary(r.summary, 'json', info)) }, null, 2));
    } else {
      ctx.out.result(formatDiagnosis(r.diagnosis, info));
      ctx.out.result('');
      ctx.out.result(formatSummary(r.summary, 'text', info));
    }
    return 0;
  },
};

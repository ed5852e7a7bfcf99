import type { CommandSpec } from './types.js';

export const checkCommand: CommandSpec = {
  command: 'check <config>',
  describe: 'validate a config and its catalogue, and summarise the stars, bands, errors and filters',
  builder: (y) => y.positional('config', { type: 'string', describe: 'the TOML config file' }),
  async run(args, ctx) {
    const { loadConfig } = await import('../../config/index.js');
    const { checkConfig, formatCheckReport } = await import('../../pipeline/index.js');
    const loaded = loadConfig(String(args.config), { sets: ctx.args.set });
    ctx.out.info(`coeval check: reading ${String(args.config)} and its catalogue`);
    const report = await checkConfig(loaded);
    ctx.out.result(ctx.args.json ? JSON.stringify(report, jsonNumbers, 2) : formatCheckReport(report));
    return 0;
  },
};

/** JSON has no NaN or Infinity: write them as null. */
function jsonNumbers(_key: string, value: unknown): unknown {
  return typeof value === 'number' && !Number.isFinite(value) ? null : value;
}

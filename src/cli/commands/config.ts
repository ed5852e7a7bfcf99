import type { CommandSpec } from './types.js';

export const configCommand: CommandSpec = {
  command: 'config <action> <file>',
  describe: 'show a config file as coeval resolves it (defaults, then the file, then --set)',
  builder: (y) =>
    y
      .positional('action', { choices: ['show'] as const, describe: 'show: print the resolved config' })
      .positional('file', { type: 'string', describe: 'the TOML config file' }),
  async run(args, ctx) {
    const { loadConfig } = await import('../../config/index.js');
    const { stringify } = await import('smol-toml');
    const loaded = loadConfig(String(args.file), { sets: ctx.args.set });
    if (ctx.args.json) ctx.out.result(JSON.stringify(loaded.config, null, 2));
    else ctx.out.result(stringify(loaded.config));
    return 0;
  },
};

import type { CommandSpec } from './types.js';

export const isochroneCommand: CommandSpec = {
  command: 'isochrone',
  describe: 'print or write one isochrone of the built-in stellar model, optionally with a CMD plot',
  builder: (y) =>
    y
      .option('age', { type: 'number', describe: 'age in Gyr' })
      .option('log-age', { type: 'number', describe: 'log10(age / yr), instead of --age' })
      .option('feh', { type: 'number', demandOption: true, describe: '[Fe/H]' })
      .option('bands', { type: 'string', default: 'B,V,I', describe: 'comma-separated bands' })
      .option('dm', { type: 'number', default: 0, describe: 'distance modulus (m-M)_0: print apparent magnitudes' })
      .option('ebv', { type: 'number', default: 0, describe: 'E(B-V): add extinction' })
      .option('alpha-fe', { type: 'number', default: 0, describe: '[alpha/Fe] for [Fe/H] -> [M/H]' })
      .option('law', { choices: ['odonnell94', 'ccm89', 'fitzpatrick99'] as const, default: 'odonnell94' as const, describe: 'extinction law' })
      .option('rv', { type: 'number', default: 3.1, describe: 'R_V' })
      .option('format', { choices: ['csv', 'json', 'arrow'] as const, default: 'csv' as const, describe: 'table format' })
      .option('out', { type: 'string', describe: 'write the table to this file instead of stdout (needed for arrow)' })
      .option('plot', { type: 'string', describe: 'write a CMD plot: .svg, or .png' })
      .option('plot-colour', { type: 'string', describe: 'colour on the x axis, e.g. B-V (default: first two bands)' })
      .option('plot-mag', { type: 'string', describe: 'magnitude on the y axis (default: second band)' }),
  async run(args, ctx) {
    const { runIsochroneCommand } = await import('../../pipeline/isochroneCommand.js');
    return runIsochroneCommand(args as unknown as Parameters<typeof runIsochroneCommand>[0], ctx.out);
  },
};

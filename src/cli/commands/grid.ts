import type { CommandSpec } from './types.js';

export const gridCommand: CommandSpec = {
  command: 'grid <action> [files..]',
  describe: 'isochrone grids: import published tables by a column map, show what a grid holds, or build one from the built-in model',
  builder: (y) =>
    y
      .positional('action', {
        choices: ['import', 'info', 'build'] as const,
        describe:
          'import: read tables with the column map of --map into an Arrow cache (--out)\n' +
          'info: list a grid\'s ages, metallicities, bands, masses, phases and gaps (files: grid.arrow)\n' +
          'build: make a grid from the built-in model at --ages and --feh',
      })
      .positional('files', { type: 'string', array: true, describe: 'import: tables (default: grid.files of the map); info: the grid.arrow' })
      .option('map', { type: 'string', describe: 'import: a TOML file with a [grid] table (column map); a whole config works too' })
      .option('out', { alias: 'o', type: 'string', describe: 'import/build: the Arrow cache to write (default grid.arrow)' })
      .option('overwrite', { type: 'boolean', default: false, describe: 'replace an existing output file' })
      .option('ages', { type: 'string', describe: 'build: log ages, as a list (9.0,9.05) or start:stop:step (8.5:10.1:0.05)' })
      .option('feh', { type: 'string', describe: 'build: [Fe/H] values, as a list or start:stop:step (write --feh=-2:0:0.25 when the first is negative)' })
      .option('bands', { type: 'string', default: 'B,V,I', describe: 'build: bands, comma-separated' })
      .option('alpha-fe', { type: 'number', default: 0, describe: 'build: [alpha/Fe] of the mixture' })
      .option('text', { type: 'string', describe: 'build: also write the grid in the stacked-text layout to this file' }),
  async run(args, ctx) {
    const { runGridCommand } = await import('../../pipeline/gridCommands.js');
    const res = await runGridCommand(
      {
        action: String(args.action) as 'import' | 'info' | 'build',
        files: (args.files as string[] | undefined) ?? [],
        map: args.map as string | undefined,
        out: args.out as string | undefined,
        overwrite: Boolean(args.overwrite),
        ages: args.ages as string | undefined,
        feh: args.feh as string | undefined,
        bands: String(args.bands),
        alphaFe: Number(args['alpha-fe'] ?? 0),
        text: args.text as string | undefined,
      },
      (m) => ctx.out.info(m),
    );
    ctx.out.result(ctx.args.json ? JSON.stringify(res.json, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2) : res.text);
    return 0;
  },
};

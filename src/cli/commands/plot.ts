import type { CommandSpec } from './types.js';

export const plotCommand: CommandSpec = {
  command: 'plot <run_dir>',
  describe: 'figures of a run: corner, walker traces, tau, CMD with posterior isochrones, posterior-predictive CMD (plots/*.svg)',
  builder: (y) =>
    y
      .positional('run_dir', { type: 'string', describe: 'the run directory a fit wrote' })
      .option('which', { type: 'string', describe: 'figures to make, comma-separated: corner,trace,tau,cmd,ppc (default: all the run has data for)' })
      .option('png', { type: 'boolean', default: false, describe: 'also write PNGs (twice the SVG size)' })
      .option('colour', { type: 'string', describe: 'CMD colour, e.g. B-V (default: the two bluest fitted bands, or BP-RP)' })
      .option('mag', { type: 'string', describe: 'CMD magnitude, e.g. V (default: the redder band of the colour, or G)' })
      .option('discard', { type: 'number', describe: 'steps to drop as burn-in (default: 2 tau_max, as coeval diagnose)' })
      .option('isochrones', { type: 'number', describe: 'posterior draws whose isochrones the CMD shows (default 80)' })
      .option('max-points', { type: 'number', describe: 'most stars drawn per CMD panel; crowded regions are thinned (default 5000)' })
      .option('ppc-stars', { type: 'number', describe: 'most stars in the posterior-predictive catalogue; a larger catalogue is compared with as many of its stars, chosen at random (default 50000)' })
      .option('seed', { type: 'number', describe: 'seed for the draws shown and the posterior-predictive catalogue, a whole number >= 1 (default 1)' }),
  async run(args, ctx) {
    const { plotRun, parseWhich } = await import('../../pipeline/runPlots.js');
    const r = await plotRun(String(args.run_dir), {
      which: parseWhich(args.which as string | undefined),
      png: Boolean(args.png),
      colour: args.colour as string | undefined,
      mag: args.mag as string | undefined,
      discard: args.discard as number | undefined,
      nIsochrones: args.isochrones as number | undefined,
      maxPoints: args['max-points'] as number | undefined,
      seed: args.seed as number | undefined,
      ppcStars: args['ppc-stars'] as number | undefined,
    });
    for (const w of r.written) ctx.out.result([w.svgPath, w.pngPath].filter(Boolean).join('\n'));
    for (const s of r.skipped) ctx.out.info(`skipped ${s.name}: ${s.reason}`);
    return 0;
  },
};

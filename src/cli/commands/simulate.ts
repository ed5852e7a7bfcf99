import type { CommandSpec } from './types.js';

/** Flags and the config keys they set (flags win over the file and over --set). */
const FLAG_KEYS: [string, string][] = [
  ['seed', 'simulate.seed'],
  ['stars', 'simulate.stars'],
  ['out', 'simulate.output'],
  ['format', 'simulate.format'],
  ['truth', 'simulate.truth_file'],
  ['id-prefix', 'simulate.id_prefix'],
  ['age-gyr', 'simulate.truth.age_gyr'],
  ['log-age', 'simulate.truth.log_age'],
  ['feh', 'simulate.truth.feh'],
  ['dm', 'simulate.truth.dm'],
  ['ebv', 'simulate.truth.ebv'],
  ['f-binary', 'simulate.truth.f_binary'],
  ['f-field', 'simulate.truth.f_field'],
  ['sigma-extra', 'simulate.truth.sigma_extra'],
  ['blue-stragglers', 'simulate.blue_straggler_fraction'],
  ['membership', 'simulate.membership'],
  ['parallax-error', 'simulate.parallax.error_mas'],
];

export const simulateCommand: CommandSpec = {
  command: 'simulate [config]',
  describe: 'draw a synthetic catalogue of a cluster with known parameters (CSV, Arrow or FITS) and its truth file',
  builder: (y) =>
    y
      .positional('config', { type: 'string', describe: 'a TOML file with [simulate] (and [likelihood], [model]); flags alone also work' })
      .option('out', { type: 'string', describe: 'the catalogue to write (.csv, .arrow or .fits)' })
      .option('format', { choices: ['auto', 'csv', 'arrow', 'fits'] as const, describe: 'output format (default: from the file name)' })
      .option('truth', { type: 'string', describe: 'the truth file (default: <catalogue>.truth.json)' })
      .option('seed', { type: 'number', describe: 'random seed (without a config: 1)' })
      .option('stars', { type: 'number', describe: 'number of catalogue stars' })
      .option('bands', { type: 'string', describe: 'comma-separated bands (without a config: B,V,I)' })
      .option('age-gyr', { type: 'number', describe: 'true age in Gyr' })
      .option('log-age', { type: 'number', describe: 'true log10(age / yr), instead of --age-gyr' })
      .option('feh', { type: 'number', describe: 'true [Fe/H]' })
      .option('dm', { type: 'number', describe: 'true distance modulus (m-M)_0' })
      .option('ebv', { type: 'number', describe: 'true E(B-V)' })
      .option('f-binary', { type: 'number', describe: 'binary fraction of cluster systems' })
      .option('f-field', { type: 'number', describe: 'fraction of catalogue stars that are field stars' })
      .option('sigma-extra', { type: 'number', describe: 'extra scatter in every band, mag' })
      .option('blue-stragglers', { type: 'number', describe: 'fraction of members that are blue stragglers' })
      .option('membership', { type: 'boolean', describe: 'give each star a prior membership probability' })
      .option('parallax-error', { type: 'number', describe: 'give each star a parallax with this error (mas)' })
      .option('id-prefix', { type: 'string', describe: 'prefix of the star identifiers' }),
  async run(args, ctx) {
    const { loadSimulationConfig, parseSimulationConfigText } = await import('../../config/index.js');
    const { simulateCluster } = await import('../../pipeline/simulate.js');
    const sets = [...ctx.args.set];
    const file = args.config as string | undefined;
    if (!file) {
      if (args.seed === undefined) sets.unshift('simulate.seed=1');
      if (args.bands === undefined) sets.unshift('simulate.bands=["B","V","I"]');
    }
    if (args.bands !== undefined) sets.push(`simulate.bands=${JSON.stringify(String(args.bands).split(',').map((b) => b.trim()).filter(Boolean))}`);
    for (const [flag, key] of FLAG_KEYS) {
      const v = args[flag];
      if (v === undefined) continue;
      sets.push(`${key}=${typeof v === 'string' ? JSON.stringify(v) : String(v)}`);
    }
    const loaded = file ? loadSimulationConfig(file, { sets }) : parseSimulationConfigText('', { sets });
    ctx.out.info(`coeval simulate: drawing ${loaded.config.simulate.stars} stars (seed ${loaded.config.simulate.seed})`);
    const r = await simulateCluster(loaded, { onNote: (line) => ctx.out.info(`note: ${line}`) });
    if (ctx.args.json) {
      ctx.out.result(JSON.stringify(r, null, 2));
    } else {
      const c = r.counts;
      ctx.out.result(
        [
          `wrote ${r.catalogPath} (${r.format}, ${r.nStars} stars: ${c.single} single, ${c.binary} binaries, ${c.field} field, ${c.blue_straggler} blue stragglers)`,
          `wrote ${r.truthPath} (true parameters: ${Object.entries(r.parameters).map(([k, v]) => `${k} ${Number((v as number).toPrecision(6))}`).join(', ')})`,
          `${(100 * r.acceptance).toFixed(1)}% of drawn cluster systems fell inside the selection window; ${r.seconds.toFixed(1)} s`,
        ].join('\n'),
      );
    }
    return 0;
  },
};

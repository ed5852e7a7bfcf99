import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import type { CommandSpec } from './types.js';

const repoRoot = resolve(fileURLToPath(import.meta.url), '../../../../..');

export const demoCommand: CommandSpec = {
  command: 'demo',
  describe: 'run coeval on the invented demo cluster (what exists of the pipeline so far: the catalogue check)',
  builder: (y) => y,
  async run(_args, ctx) {
    const { loadConfig } = await import('../../config/index.js');
    const { checkConfig, formatCheckReport } = await import('../../pipeline/index.js');
    const file = resolve(repoRoot, 'configs/demo.toml');
    ctx.out.info(`coeval demo: the invented globular cluster "Tessaly 7" (config ${file}).`);
    ctx.out.info(
      'The fit is not built yet. What this demo does today: read the config and the demo catalogue, and print the\n' +
        'summary of `coeval check`. The catalogue is a synthetic, non-physical stand-in (see demo-data/README.md).\n',
    );
    const loaded = loadConfig(file, { sets: ctx.args.set });
    const report = await checkConfig(loaded);
    ctx.out.result(ctx.args.json ? JSON.stringify(report, null, 2) : formatCheckReport(report, repoRoot));
    return 0;
  },
};

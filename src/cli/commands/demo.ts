import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import type { CommandSpec } from './types.js';

const repoRoot = resolve(fileURLToPath(import.meta.url), '../../../../..');

export const demoCommand: CommandSpec = {
  command: 'demo',
  describe: 'run coeval on the embedded demo cluster (what exists of the pipeline so far)',
  builder: (y) => y,
  async run(_args, ctx) {
    const { loadConfig } = await import('../../config/index.js');
    const file = resolve(repoRoot, 'configs/demo.toml');
    ctx.out.info(`coeval demo: validating ${file}.`);
    ctx.out.info('Only the config layer exists so far: the catalogue readers and the fit are not built yet, so this demo checks the config and stops.');
    const loaded = loadConfig(file, { sets: ctx.args.set });
    ctx.out.result(`config OK: catalogue ${loaded.config.catalogue.path}, bands ${Object.keys(loaded.config.photometry).join(', ')}`);
    return 0;
  },
};

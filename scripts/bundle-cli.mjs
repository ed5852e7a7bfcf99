// Build step: bundle the CLI entry with yargs into one file. Loading yargs as ~40 separate ES modules
// costs about 50 ms of the `coeval --help` start-up (measured by `npm run bench startup`); one file
// loads faster. Every relative import stays external, so the CLI and the library share one copy of each
// module (error classes must be the same objects for `instanceof` to work).
import { build } from 'esbuild';

await build({
  entryPoints: ['dist/src/cli/main.js'],
  outfile: 'dist/src/cli/main.bundle.js',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  logLevel: 'warning',
  plugins: [
    {
      name: 'keep-relative-imports-external',
      setup(b) {
        b.onResolve({ filter: /^\.\.?\// }, (args) =>
          args.kind === 'entry-point' || args.importer.includes('/node_modules/') ? undefined : { path: args.path, external: true },
        );
      },
    },
  ],
});

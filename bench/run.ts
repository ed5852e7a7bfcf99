/**
 * `npm run bench [group ...]`: run all benchmark groups, or the named ones; print each figure and merge
 * them into bench/results.json (name, value, unit, target, reference).
 */
import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import { formatFigure, meets, saveResults, type BenchGroup, type Figure } from './harness.js';
import { GROUPS } from './groups.js';

async function runBenchmarks(argv: string[]): Promise<number> {
  const wanted = argv.filter((a) => !a.startsWith('-'));
  const unknown = wanted.filter((w) => !GROUPS.some((g) => g.name === w));
  if (unknown.length > 0) {
    process.stderr.write(`unknown benchmark group(s): ${unknown.join(', ')}; groups are: ${GROUPS.map((g) => g.name).join(', ')}\n`);
    return 2;
  }
  const selected: BenchGroup[] = wanted.length ? GROUPS.filter((g) => wanted.includes(g.name)) : [...GROUPS];
  const figures: Figure[] = [];
  for (const group of selected) {
    process.stdout.write(`\n== ${group.name}: ${group.describe}\n`);
    await group.run({
      record: (f) => {
        const fig = { group: group.name, ...f };
        figures.push(fig);
        process.stdout.write(`${formatFigure(fig)}\n`);
      },
      log: (t) => process.stdout.write(`  ${t}\n`),
    });
  }
  const repoRoot = resolve(fileURLToPath(import.meta.url), '../../..');
  const out = resolve(repoRoot, 'bench/results.json');
  saveResults(out, figures, selected.map((g) => g.name));
  const missed = figures.filter((f) => meets(f) === false);
  process.stdout.write(`\n${figures.length} figures written to bench/results.json; ${missed.length} target(s) not met${missed.length ? `: ${missed.map((f) => `${f.group}/${f.name}`).join(', ')}` : ''}\n`);
  return 0;
}

runBenchmarks(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});

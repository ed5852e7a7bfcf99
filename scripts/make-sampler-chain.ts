/**
 * Print a chain from coeval's own sampler as CSV (one column per walker), for the tau check against emcee:
 *   node dist/scripts/make-sampler-chain.js > tests/diagnostics/fixtures/tau_sampler.csv
 * Parameter x0 of a 2-D normal target (coeval testbed gaussian), one ensemble of 8 walkers, 400 steps,
 * seed 9; values printed in shortest round-trip form, so every reader parses the same doubles.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ChainFile, RUN_LAYOUT } from '../src/io/index.js';
import { runTestbed } from '../src/pipeline/testbedRun.js';

const dir = mkdtempSync(join(tmpdir(), 'coeval-sampler-chain-'));
try {
  const { runDir } = await runTestbed({ runDir: join(dir, 'run'), ndim: 2, nWalkers: 8, nEnsembles: 1, steps: 400, seed: 9 });
  const f = ChainFile.open(join(runDir, RUN_LAYOUT.chainFile(0)));
  const c = f.chain({ parameters: ['x0'] });
  f.close();
  const lines = [Array.from({ length: c.nWalkers }, (_, w) => `w${w}`).join(',')];
  for (let d = 0; d < c.nDraws; d++) lines.push(Array.from({ length: c.nWalkers }, (_, w) => String(c.values.x0[w * c.nDraws + d])).join(','));
  process.stdout.write(`${lines.join('\n')}\n`);
} finally {
  rmSync(dir, { recursive: true, force: true });
}

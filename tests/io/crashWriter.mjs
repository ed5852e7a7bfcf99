// Writes chain batches forever through coeval's chain writer (built in dist/), printing the file size after
// each flushed batch, until it is killed. Usage: node crashWriter.mjs FILE ROWS_PER_BATCH
import process from 'node:process';
import { ChainWriter } from '../../dist/src/io/index.js';
import { ar1States } from '../../dist/scripts/ar1Run.js';

const [file, rowsArg] = process.argv.slice(2);
const parameters = ['a', 'b', 'c', 'd'].map((name) => ({ name, label: name, unit: 'dex' }));
const nWalkers = 32;
const writer = ChainWriter.create(file, { parameters, runId: 'crash-test', ensemble: 0, seed: 7, nWalkers, coevalVersion: 'test', blobNames: ['log_prior', 'log_likelihood'], maxBatchRows: Number(rowsArg) });
const stepsPerBatch = Number(rowsArg) / nWalkers;
let step = 0;
for (const state of ar1States({ parameters, mean: [0, 1, 2, 3], sd: [1, 1, 1, 1], rho: 0.5, nWalkers, nSteps: 1e9, seed: 7 })) {
  writer.append(state);
  step++;
  if (step % stepsPerBatch === 0) {
    writer.flush();
    process.stdout.write(`${step}\n`);
  }
}

/**
 * Write a run directory of analytic AR(1) chains, for trying `coeval diagnose` and `coeval summary`
 * without a sampler:  node dist/scripts/make-ar1-run.js DIR [--steps N] [--rho R] [--stuck] [--shift]
 */
import { writeAr1Run } from './ar1Run.js';

const args = process.argv.slice(2);
const dir = args.find((a) => !a.startsWith('--'));
if (!dir) {
  process.stderr.write('usage: node dist/scripts/make-ar1-run.js DIR [--steps N] [--rho R] [--stuck] [--shift] [--open]\n');
  process.exit(2);
}
const value = (name: string, dflt: number): number => {
  const i = args.indexOf(name);
  return i >= 0 ? Number(args[i + 1]) : dflt;
};
const path = writeAr1Run(dir, {
  parameters: [
    { name: 'log_age', label: 'log10(age / yr)', unit: 'dex' },
    { name: 'feh', label: '[Fe/H]', unit: 'dex' },
    { name: 'dm', label: '(m-M)_0', unit: 'mag' },
    { name: 'ebv', label: 'E(B-V)', unit: 'mag' },
  ],
  mean: [9.62, -0.31, 11.84, 0.27],
  sd: [0.035, 0.06, 0.025, 0.012],
  rho: value('--rho', 0.9),
  nWalkers: value('--walkers', 32),
  nEnsembles: value('--ensembles', 3),
  nSteps: value('--steps', 5000),
  seed: value('--seed', 42),
  flushEvery: 500,
  leaveOpen: args.includes('--open'),
  stuck: args.includes('--stuck') ? { ensemble: 1, walkers: [7] } : undefined,
  shifted: args.includes('--shift') ? { ensemble: 2, sd: 0.5 } : undefined,
});
process.stdout.write(`${path}\n`);

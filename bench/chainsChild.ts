/**
 * The child process of the chains benchmark (bench/chains.ts), so that its peak RSS is its own:
 *   node dist/bench/chainsChild.js write DIR STEPS   write a run of 3 ensembles x 32 walkers x STEPS steps
 *   node dist/bench/chainsChild.js diagnose DIR [THREADS]  diagnose and summarise it (diagnoseRunAsync;
 *                                                     THREADS worker threads, default the available cores)
 *   node dist/bench/chainsChild.js diagnose-sync DIR  the same with diagnoseRun, in the main thread
 *   node dist/bench/chainsChild.js idle               load the same modules and do nothing (reference)
 * Prints one JSON line: wall and CPU seconds, peak RSS in MB.
 */
import { writeAr1Run } from '../scripts/ar1Run.js';
import { diagnoseRun, diagnoseRunAsync } from '../src/pipeline/diagnoseRun.js';

const [mode, dir, stepsArg] = process.argv.slice(2);
const t0 = performance.now();
const c0 = process.cpuUsage();
let extra: Record<string, unknown> = {};
if (mode === 'write') {
  writeAr1Run(dir, {
    parameters: ['log_age', 'feh', 'dm', 'ebv'].map((name) => ({ name, label: name, unit: 'mag' })),
    mean: [9.6, -0.3, 11.8, 0.27],
    sd: [0.035, 0.06, 0.025, 0.012],
    rho: 0.95,
    nWalkers: 32,
    nEnsembles: 3,
    nSteps: Number(stepsArg),
    seed: 1,
    flushEvery: 1000,
  });
} else if (mode === 'diagnose' || mode === 'diagnose-sync') {
  const r = mode === 'diagnose' ? await diagnoseRunAsync(dir, { threads: stepsArg ? Number(stepsArg) : undefined }) : diagnoseRun(dir);
  extra = { verdict: r.diagnosis.verdict.status, draws: r.diagnosis.parameters[0].nDraws * r.diagnosis.parameters[0].nChains, tauMax: r.diagnosis.tauMax };
} else if (mode !== 'idle') {
  process.stderr.write(`unknown mode ${mode}\n`);
  process.exit(2);
}
const cpu = process.cpuUsage(c0);
process.stdout.write(
  `${JSON.stringify({ wallS: (performance.now() - t0) / 1000, cpuS: (cpu.user + cpu.system) / 1e6, peakRssMb: process.resourceUsage().maxRSS / 1024, ...extra })}\n`,
);

/**
 * Cross-check with Debian's python3-emcee (Foreman-Mackey et al. 2013), the reference implementation of the
 * affine-invariant ensemble sampler: emcee's stretch move and ours on the same 10-D Gaussian, same walkers
 * and run length, must agree in acceptance fraction and autocorrelation time within Monte Carlo error.
 * The numbers cannot be identical (different random streams); the claim is statistical equivalence.
 *
 * How the error is derived: each side makes 8 independent runs (different seeds), and each run gives one
 * acceptance fraction and one τ (averaged over the 10 parameters). The runs are independent, so each side's
 * mean has a standard error s / sqrt(8) from the spread of its runs; the difference of the two means, over
 * the root sum of squares of the two standard errors, is a Welch t statistic with about 14 degrees of
 * freedom, and must stay below 4 (exceeded by chance with probability about 0.1%).
 *
 * τ is estimated the same way on both sides: emcee's own `integrated_time` on emcee's chains, and on ours
 * our test estimator (helpers/stats.ts), which the first check shows gives emcee's numbers on the same chain.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, expect, it } from 'vitest';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import { gaussianDensity, identity } from '../../src/sampler/targets/gaussian.js';
import { REFERENCES, SYSTEM_PYTHON, describeWithReference } from '../helpers/reference.js';
import { meanAndSe } from './helpers/checks.js';
import { runTarget } from './helpers/run.js';
import { integratedTime } from './helpers/stats.js';
import { gaussianPrior } from './helpers/targets.js';

/** Seconds-long on an idle machine; the limit allows for a CPU shared with other jobs. */
const HEAVY_MS = 300_000;

const SCRIPT = resolve(fileURLToPath(import.meta.url), '../emcee_reference.py');
const NDIM = 10;
const NWALKERS = 32;
const NSTEPS = 4000;
const RUNS = 8;
const dir = mkdtempSync(join(tmpdir(), 'coeval-emcee-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function python<T>(args: string[]): T {
  const r = spawnSync(SYSTEM_PYTHON, [SCRIPT, ...args], { encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`emcee_reference.py ${args[0]} failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}

const ours = () =>
  runTarget({
    density: gaussianDensity({ mean: new Array(NDIM).fill(0) }),
    nWalkers: NWALKERS,
    nEnsembles: RUNS,
    steps: NSTEPS,
    burn: 0,
    seed: 2013,
    moves: stretchMove({ a: 2 }),
    init: { kind: 'prior', draw: gaussianPrior(new Array(NDIM).fill(0), identity(NDIM)) },
  });

describeWithReference('agreement with emcee (python3-emcee)', REFERENCES.emcee, () => {
  let run: Awaited<ReturnType<typeof ours>>;

  it('our τ estimator gives emcee.autocorr.integrated_time on the same chain', async () => {
    run = await ours();
    const path = join(dir, 'chain.f64');
    writeFileSync(path, Buffer.from(run.chains[0].buffer, run.chains[0].byteOffset, run.chains[0].byteLength));
    const theirs = python<number[]>(['tau', path, String(run.nRows), String(NWALKERS), String(NDIM)]);
    const mine = integratedTime(run.chains[0], run.nRows, NWALKERS, NDIM);
    // Same estimator, same data: only rounding differs (FFT sizes and order of sums).
    theirs.forEach((t, j) => expect(Math.abs(mine[j] - t) / t).toBeLessThan(1e-9));
  }, HEAVY_MS);

  it('acceptance fraction and τ agree with emcee\'s stretch move within Monte Carlo error', () => {
    const reference = python<{ acceptance: number; tau: number[] }[]>(['run', String(NDIM), String(NWALKERS), String(NSTEPS), ...Array.from({ length: RUNS }, (_, i) => String(100 + i))]);
    const emceeAcc = meanAndSe(reference.map((r) => r.acceptance));
    const emceeTau = meanAndSe(reference.map((r) => r.tau.reduce((a, b) => a + b, 0) / NDIM));
    const ourAcc = meanAndSe(run.acceptance);
    const ourTau = meanAndSe(run.chains.map((c) => integratedTime(c, run.nRows, NWALKERS, NDIM).reduce((a, b) => a + b, 0) / NDIM));
    const tAcc = Math.abs(ourAcc.mean - emceeAcc.mean) / Math.hypot(ourAcc.se, emceeAcc.se);
    const tTau = Math.abs(ourTau.mean - emceeTau.mean) / Math.hypot(ourTau.se, emceeTau.se);
    console.log(
      `acceptance: ours ${ourAcc.mean.toFixed(4)} ± ${ourAcc.se.toFixed(4)}, emcee ${emceeAcc.mean.toFixed(4)} ± ${emceeAcc.se.toFixed(4)}, |t| = ${tAcc.toFixed(2)}; ` +
        `τ: ours ${ourTau.mean.toFixed(1)} ± ${ourTau.se.toFixed(1)}, emcee ${emceeTau.mean.toFixed(1)} ± ${emceeTau.se.toFixed(1)}, |t| = ${tTau.toFixed(2)}`,
    );
    expect(tAcc).toBeLessThan(4);
    expect(tTau).toBeLessThan(4);
  }, HEAVY_MS);
});

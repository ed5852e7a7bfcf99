/**
 * diagnose and summary on run directories that the real sampler wrote through the Arrow chain sink
 * (coeval testbed): the analytic target's means and standard deviations are known, and a resumed run must
 * leave the same chain files as one that never stopped.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { ChainFile, readManifest, RUN_LAYOUT } from '../../src/io/index.js';
import { diagnoseRun } from '../../src/pipeline/diagnoseRun.js';
import { runTestbed, testbedTarget } from '../../src/pipeline/testbedRun.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'coeval-testbed-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('a sampler run on an analytic target', () => {
  it('is diagnosed converged, and its summary recovers the target within the Monte Carlo error', async () => {
    const { runDir } = await runTestbed({ runDir: join(dir, 'long'), ndim: 3, nWalkers: 16, nEnsembles: 3, steps: 10_000, seed: 1 });
    const r = diagnoseRun(runDir);
    expect(r.diagnosis.verdict.status, r.diagnosis.verdict.findings.join('\n')).toBe('converged');
    const { mean, sd } = testbedTarget(3);
    r.summary.parameters.forEach((p, j) => {
      // The median of a normal is its mean; allow 5 MCSE (exceeded by chance about once in 1.7 million).
      expect(Math.abs(p.median - mean[j]), `x${j} median`).toBeLessThan(5 * p.mcseMedian);
      // A sample sd from ESS effectively independent normal draws has relative standard error 1/sqrt(2 ESS).
      expect(Math.abs(p.sd - sd[j]) / sd[j], `x${j} sd`).toBeLessThan(5 / Math.sqrt(2 * p.essBulk));
    });
    expect(readManifest(runDir).status).toBe('finished');
  }, 120_000);

  it('resumed from its checkpoint, leaves chain files identical to an uninterrupted run', async () => {
    const opts = { ndim: 2, nWalkers: 8, nEnsembles: 2, seed: 5, checkpointEvery: 100 };
    const whole = await runTestbed({ ...opts, runDir: join(dir, 'whole'), steps: 600 });
    const first = await runTestbed({ ...opts, runDir: join(dir, 'parts'), steps: 300 });
    await runTestbed({ runDir: first.runDir, steps: 600, resume: true });
    for (let k = 0; k < 2; k++) {
      const a = ChainFile.open(join(whole.runDir, RUN_LAYOUT.chainFile(k)));
      const b = ChainFile.open(join(first.runDir, RUN_LAYOUT.chainFile(k)));
      expect(b.nSteps).toBe(600);
      const cols = { parameters: ['x0', 'x1', 'log_posterior', 'log_likelihood'], accepted: true, flat: true };
      const ca = a.chain(cols);
      const cb = b.chain(cols);
      expect([...cb.steps]).toEqual([...ca.steps]);
      for (const c of cols.parameters) expect(Buffer.from(cb.values[c].buffer).equals(Buffer.from(ca.values[c].buffer)), `ensemble ${k} ${c}`).toBe(true);
      expect([...(cb.accepted ?? [])]).toEqual([...(ca.accepted ?? [])]);
      a.close();
      b.close();
    }
  }, 120_000);

  it('runs from the command line, and diagnose reads what it wrote', () => {
    const runDir = join(dir, 'cli');
    const t = spawnSync(process.execPath, [join(root, 'bin/coeval.js'), 'testbed', 'gaussian', runDir, '--steps', '400', '--quiet'], { encoding: 'utf8' });
    expect(t.status, t.stderr).toBe(0);
    expect(t.stdout).toMatch(/400 steps \(steps\)/);
    const d = spawnSync(process.execPath, [join(root, 'bin/coeval.js'), 'diagnose', runDir, '--json'], { encoding: 'utf8' });
    expect(d.status, d.stderr).toBe(0);
    const json = JSON.parse(d.stdout) as { diagnosis: { verdict: { status: string }; nEnsembles: number; totalSteps: number }; summary: { provenance: string } };
    expect(json.diagnosis.nEnsembles).toBe(3);
    expect(json.diagnosis.totalSteps).toBe(400);
    expect(['run-longer', 'converged']).toContain(json.diagnosis.verdict.status);
    expect(json.summary.provenance).toMatch(/sampler test-bed/);
  }, 120_000);
});

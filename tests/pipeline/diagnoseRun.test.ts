/**
 * diagnose and summary end to end, on run directories written by the chain writer from analytic AR(1)
 * ensembles (scripts/ar1Run.ts), healthy and with injected faults; and the CLI commands on them.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { diagnoseRun, diagnoseRunAsync } from '../../src/pipeline/diagnoseRun.js';
import { formatSummary } from '../../src/report/summaryFormats.js';
import { writeAr1Run, type Ar1RunOptions } from '../../scripts/ar1Run.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'coeval-diagnose-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const base: Ar1RunOptions = {
  parameters: [
    { name: 'log_age', label: 'log10(age / yr)', unit: 'dex' },
    { name: 'ebv', label: 'E(B-V)', unit: 'mag' },
  ],
  mean: [9.7, 0.12],
  sd: [0.04, 0.01],
  rho: 0.5,
  nWalkers: 16,
  nEnsembles: 3,
  nSteps: 2000,
  seed: 3,
  flushEvery: 300,
};

const healthy = writeAr1Run(join(dir, 'healthy'), base);
const faulty = writeAr1Run(join(dir, 'faulty'), { ...base, stuck: { ensemble: 1, walkers: [7] }, shifted: { ensemble: 2, sd: 0.6 } });
const short = writeAr1Run(join(dir, 'short'), { ...base, rho: 0.95, nSteps: 300, leaveOpen: true });

function coeval(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [join(root, 'bin/coeval.js'), ...args], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('diagnoseRun', () => {
  it('gives the same diagnosis and summary, value for value, on worker threads as in the main thread', async () => {
    // The faulty run has a stuck walker and an ensemble in another mode: every path of the statistics.
    const sync = diagnoseRun(faulty);
    const r = await diagnoseRunAsync(faulty, { threads: 2 });
    // toEqual compares every number exactly (NaN equals NaN), the sorted draws included.
    expect(r.diagnosis).toEqual(sync.diagnosis);
    expect(r.summary).toEqual(sync.summary);
  });

  it('calls a healthy run converged, and its medians sit on the target within their MCSE', () => {
    const r = diagnoseRun(healthy);
    expect(r.diagnosis.verdict.status, r.diagnosis.verdict.findings.join('\n')).toBe('converged');
    expect(r.diagnosis.acceptance.stuck).toEqual([]);
    r.summary.parameters.forEach((p, i) => {
      // The target's median is its mean; 5 MCSE: a correct estimate fails about once in 1.7 million runs.
      expect(Math.abs(p.median - base.mean[i]), p.info.name).toBeLessThan(5 * p.mcseMedian);
      expect(p.rhat).toBeLessThan(1.01);
    });
    // The AR(1) tau is (1 + rho) / (1 - rho) = 3 steps; a suggested burn-in of 2 tau_max is a few steps.
    expect(r.discardSource).toBe('suggested');
    expect(r.diagnosis.discard).toBeGreaterThanOrEqual(4);
    expect(r.diagnosis.discard).toBeLessThan(12);
  });

  it('names the stuck walker and the ensemble in another mode', () => {
    const v = diagnoseRun(faulty).diagnosis.verdict;
    expect(v.status).toBe('problems');
    expect(v.findings.join('\n')).toMatch(/walker 7 of ensemble 1 is stuck/);
    expect(v.findings.join('\n')).toMatch(/log_age: the median of ensemble 2 is .* MCSE from the others'/);
    expect(v.findings.join('\n')).toMatch(/ebv: the median of ensemble 2/);
  });

  it('asks a short (still running) run to go on, with a number of steps that reaches 50 tau', () => {
    const r = diagnoseRun(short);
    const v = r.diagnosis.verdict;
    expect(v.status).toBe('run-longer');
    expect(r.files.every((f) => !f.closed)).toBe(true);
    const tauMax = r.diagnosis.tauMax;
    expect(v.moreSteps).toBeGreaterThanOrEqual(50 * tauMax - r.diagnosis.keptSteps);
    expect(v.headline).toMatch(/Run longer: about [\d,]+ more steps per walker/);
  });

  it('uses a burn-in given by the user', () => {
    const r = diagnoseRun(healthy, { discard: 500, thin: 2 });
    expect(r.discardSource).toBe('given');
    expect(r.diagnosis.keptSteps).toBe(1500);
    expect(r.summary.nDraws).toBe(750);
  });
});

describe('coeval diagnose and coeval summary', () => {
  it('diagnose prints the verdict and the table; --json gives the same as data', () => {
    const text = coeval('diagnose', healthy);
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toMatch(/^Converged: R-hat < 1\.01/);
    expect(text.stdout).toMatch(/parameter\s+R-hat\s+ESS bulk\s+ESS tail\s+tau/);
    expect(text.stdout).toMatch(/every walker of every ensemble as one chain/);
    expect(text.stdout).toMatch(/provenance: analytic test-bed/);
    const json = coeval('diagnose', faulty, '--json');
    expect(json.status, json.stderr).toBe(0);
    const data = JSON.parse(json.stdout) as { diagnosis: { verdict: { status: string }; acceptance: { stuck: { ensemble: number; walker: number }[] } }; summary: { parameters: { name: string }[] } };
    expect(data.diagnosis.verdict.status).toBe('problems');
    expect(data.diagnosis.acceptance.stuck).toMatchObject([{ ensemble: 1, walker: 7 }]);
    expect(data.summary.parameters.map((p) => p.name)).toEqual(['log_age', 'ebv']);
  });

  it('summary in every format, with the provenance in each', () => {
    const latex = coeval('summary', healthy, '--format', 'latex');
    expect(latex.status, latex.stderr).toBe(0);
    expect(latex.stdout).toMatch(/^% provenance: analytic test-bed/m);
    expect(latex.stdout.trim().split('\n').pop()).toMatch(/^\$9\.\d+\^\{\+0\.0\d+\}_\{-0\.0\d+\}\$ & \$0\.1\d+\^\{\+0\.0\d+\}_\{-0\.0\d+\}\$ \\\\$/);
    // The other formats in process (each CLI start costs seconds on a loaded machine).
    const r = diagnoseRun(healthy);
    const ctx = { runId: r.manifest.runId, drawsLine: r.drawsLine };
    const csv = formatSummary(r.summary, 'csv', ctx);
    const rows = csv.trim().split('\n').filter((l) => !l.startsWith('#'));
    expect(rows[0].split(',').slice(0, 4)).toEqual(['name', 'label', 'unit', 'median']);
    expect(rows[1].split(',')[0]).toBe('log_age');
    expect(Number(rows[1].split(',')[3])).toBe(r.summary.parameters[0].median);
    expect(csv).toMatch(/^# provenance: analytic/m);
    const json = JSON.parse(formatSummary(r.summary, 'json', ctx)) as { provenance: string; parameters: { median: number; latex: string }[] };
    expect(json.provenance).toMatch(/analytic test-bed/);
    expect(json.parameters[0].median).toBe(r.summary.parameters[0].median);
    expect(formatSummary(r.summary, 'text', ctx)).toMatch(/log10\(age \/ yr\)\s+dex\s+9\.\d+/);
    expect(coeval('summary', short).stderr).toMatch(/warning: Run longer/);
  });

  it('says what is wrong with a directory that is not a run', () => {
    const r = coeval('diagnose', dir);
    expect(r.status).toBe(4);
    expect(r.stderr).toMatch(/input error at .*manifest\.json: no manifest\.json in the run directory/);
    expect(r.stderr).not.toMatch(/at .*\.js:\d+/);
  });
});

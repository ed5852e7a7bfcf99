/**
 * Exact resume: a run killed with SIGKILL at an arbitrary step (or stopped by SIGTERM), then resumed
 * from its checkpoint, writes a chain bit-identical to a run that was never interrupted. The runs are
 * real child processes (fixtures/runChild.mjs, on the compiled library), and the worker count changes
 * between the original and the resumed run, which must not matter either.
 */
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { SamplerRng } from '../../src/sampler/rng.js';

/** Seconds-long on an idle machine; the limit allows for a CPU shared with other jobs. */
const HEAVY_MS = 300_000;

const CHILD = resolve(fileURLToPath(import.meta.url), '../fixtures/runChild.mjs');
const base = mkdtempSync(join(tmpdir(), 'coeval-resume-'));
afterAll(() => rmSync(base, { recursive: true, force: true }));

function runToEnd(dir: string, steps: number, workers: number, stop: string, resume = false): string {
  const r = spawnSync(process.execPath, [CHILD, dir, String(steps), String(workers), stop, ...(resume ? ['resume'] : [])], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`child exited ${r.status}: ${r.stderr}`);
  return r.stdout.trim().split('\n').pop() ?? '';
}

/** Start a run and send `signal` once it reports step >= atStep; resolves with its exit code and stderr. */
function runAndSignal(dir: string, steps: number, workers: number, stop: string, atStep: number, signal: NodeJS.Signals): Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string; lastStep: number }> {
  return new Promise((resolvePromise) => {
    const child = spawn(process.execPath, [CHILD, dir, String(steps), String(workers), stop], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    let lastStep = 0;
    let sent = false;
    let buffered = '';
    child.stdout.on('data', (d: Buffer) => {
      buffered += d.toString();
      const lines = buffered.split('\n');
      buffered = lines.pop() ?? '';
      for (const l of lines) {
        const m = /^step (\d+)$/.exec(l);
        if (m) lastStep = Number(m[1]);
      }
      if (!sent && lastStep >= atStep) {
        sent = true;
        child.kill(signal);
      }
    });
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('exit', (code, sig) => resolvePromise({ code, signal: sig, stderr, lastStep }));
  });
}

function mkdir(name: string): string {
  const d = join(base, name);
  spawnSync('mkdir', ['-p', d]);
  return d;
}

describe('exact resume in a child process', () => {
  // Kill points drawn from a seeded stream, so they fall at arbitrary places relative to the checkpoint
  // interval (25 steps) and the thinning (2), but the test is the same on every run.
  const draw = SamplerRng.fromSeed(4242);
  const killAt = [60 + draw.integer(200), 60 + draw.integer(200)];

  it('fixed steps: SIGKILL at a random step, resume (other worker count), bit-identical chain', async () => {
    const reference = mkdir('fixed-reference');
    expect(runToEnd(reference, 300, 0, 'fixed')).toBe('done 300 steps');
    const expected = readFileSync(join(reference, 'chain.bin'));

    for (const [i, at] of killAt.entries()) {
      const dir = mkdir(`fixed-killed-${i}`);
      const killed = await runAndSignal(dir, 300, 2, 'fixed', at, 'SIGKILL');
      expect(killed.signal).toBe('SIGKILL');
      expect(killed.lastStep).toBeLessThan(300);
      expect(runToEnd(dir, 300, 1, 'fixed', true)).toBe('done 300 steps');
      const got = readFileSync(join(dir, 'chain.bin'));
      expect(got.length).toBe(expected.length);
      expect(got.equals(expected), `chain after a kill at step ~${at} differs`).toBe(true);
    }
  }, HEAVY_MS);

  it('automatic stop (history decimated, τ checks): SIGKILL, resume, same chain and same stopping step', async () => {
    const reference = mkdir('auto-reference');
    const last = runToEnd(reference, 2000, 0, 'auto');
    expect(last).toMatch(/^done \d+ (converged|cap)$/);
    const expected = readFileSync(join(reference, 'chain.bin'));
    const dir = mkdir('auto-killed');
    const killed = await runAndSignal(dir, 2000, 0, 'auto', 150 + draw.integer(100), 'SIGKILL');
    expect(killed.signal).toBe('SIGKILL');
    expect(runToEnd(dir, 2000, 0, 'auto', true)).toBe(last);
    expect(readFileSync(join(dir, 'chain.bin')).equals(expected)).toBe(true);
  }, HEAVY_MS);

  it('SIGTERM: finishes the step, checkpoints, exits 130 with one line on how to resume; the resumed chain is identical', async () => {
    const reference = join(base, 'fixed-reference');
    const expected = readFileSync(join(reference, 'chain.bin'));
    const dir = mkdir('terminated');
    const stopped = await runAndSignal(dir, 300, 2, 'fixed', 120, 'SIGTERM');
    expect(stopped.code).toBe(130);
    const lines = stopped.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^interrupted by SIGTERM after step \d+; the checkpoint .*checkpoint\.json holds step \d+; resume with: node runChild\.mjs .* resume$/);
    expect(runToEnd(dir, 300, 2, 'fixed', true)).toBe('done 300 steps');
    expect(readFileSync(join(dir, 'chain.bin')).equals(expected)).toBe(true);
  }, HEAVY_MS);
});

/**
 * Smaller pieces: the stretch factor's distribution, the random stream's save/restore, the mixture's
 * state, checkpoint round trips and the errors on resuming with the wrong set-up, and progress output.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError, SamplingError } from '../../src/core/errors.js';
import { MemorySink } from '../../src/sampler/chainSink.js';
import { readCheckpoint } from '../../src/sampler/checkpoint.js';
import { inThreadEvaluator } from '../../src/sampler/evaluator.js';
import { deMove } from '../../src/sampler/moves/deMove.js';
import { stretchMove } from '../../src/sampler/moves/stretchMove.js';
import { progressReporter } from '../../src/sampler/progress.js';
import { createEnsembles, resumeEnsembles, runEnsembles } from '../../src/sampler/runEnsembles.js';
import { SamplerRng } from '../../src/sampler/rng.js';
import { gaussianDensity } from '../../src/sampler/targets/gaussian.js';
import type { EnsembleState } from '../../src/sampler/types.js';
import { ksPValue, ksStatistic, kolmogorovQ } from './helpers/stats.js';

const dir = mkdtempSync(join(tmpdir(), 'coeval-sampler-units-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('stretch move', () => {
  it('draws z from g(z) ∝ 1/sqrt(z) on [1/a, a] and returns (ndim - 1) log z', () => {
    // With the moving walker at 1 and the single complementary walker at 0, the proposal is z itself.
    // Goodman & Weare (2010, eq. 9): the CDF of z is (sqrt z - sqrt(1/a)) / (sqrt a - sqrt(1/a)).
    const a = 2.5;
    const rng = SamplerRng.fromSeed(12);
    const n = 20000;
    const zs = new Float64Array(n);
    const prop = new Float64Array(3);
    const lf = new Float64Array(1);
    const move = stretchMove({ a });
    for (let i = 0; i < n; i++) {
      move.propose({ ndim: 3, walkers: Float64Array.of(1, 1, 1), nUpdate: 1, complement: Float64Array.of(0, 0, 0), nComplement: 1 }, rng, prop, lf);
      zs[i] = prop[0];
      expect(lf[0]).toBeCloseTo(2 * Math.log(prop[0]), 12);
    }
    const cdf = (z: number) => (Math.sqrt(z) - Math.sqrt(1 / a)) / (Math.sqrt(a) - Math.sqrt(1 / a));
    expect(Math.min(...zs)).toBeGreaterThanOrEqual(1 / a);
    expect(Math.max(...zs)).toBeLessThanOrEqual(a);
    // Independent draws: the plain KS test applies; p > 1e-3.
    expect(ksPValue(ksStatistic(zs, cdf), n)).toBeGreaterThan(1e-3);
  });

  it('the KS p-value function matches the tabulated critical values of the Kolmogorov distribution', () => {
    // Asymptotic critical values: 1.358 at 5%, 1.628 at 1% (Smirnov 1948, Ann. Math. Stat. 19, 279, table).
    expect(kolmogorovQ(1.358)).toBeCloseTo(0.05, 3);
    expect(kolmogorovQ(1.628)).toBeCloseTo(0.01, 3);
  });
});

describe('DE move', () => {
  it('uses γ = 1 in about the configured share of proposals, and γ0 = 2.38 / sqrt(2 ndim) otherwise', () => {
    const ndim = 8;
    const rng = SamplerRng.fromSeed(4);
    const move = deMove({ modeHop: 0.25, jitter: 0.1 });
    // Complement: two walkers, 0 and e1, so the step is ±γ e1 and its length is γ.
    const comp = new Float64Array(2 * ndim);
    comp[ndim] = 1;
    const prop = new Float64Array(ndim);
    const lf = new Float64Array(1);
    let hops = 0;
    const n = 4000;
    let sum = 0;
    let m = 0;
    for (let i = 0; i < n; i++) {
      move.propose({ ndim, walkers: new Float64Array(ndim), nUpdate: 1, complement: comp, nComplement: 2 }, rng, prop, lf);
      expect(lf[0]).toBe(0);
      const g = Math.abs(prop[0]);
      if (g === 1) hops++;
      else {
        sum += g;
        m++;
      }
    }
    // Binomial(4000, 0.25): sd 27; 4 sd tolerance.
    expect(Math.abs(hops - 1000)).toBeLessThan(4 * Math.sqrt(4000 * 0.25 * 0.75));
    // Mean γ of the other steps: γ0 (the jitter is symmetric); sd of the mean 0.1 γ0 / sqrt(m); 4 sd.
    const g0 = 2.38 / Math.sqrt(2 * ndim);
    expect(Math.abs(sum / m - g0)).toBeLessThan((4 * 0.1 * g0) / Math.sqrt(m));
  });
});

describe('random stream', () => {
  it('resumes exactly from a saved state, and distinct (seed, stream) pairs give distinct streams', () => {
    const a = SamplerRng.fromSeed(7, 0);
    for (let i = 0; i < 1000; i++) a.normal();
    const saved = a.state;
    const next = Array.from({ length: 50 }, () => [a.uniform(), a.normal()]);
    const b = SamplerRng.fromSeed(0, 0);
    const restored = SamplerRng.fromState(saved);
    expect(Array.from({ length: 50 }, () => [restored.uniform(), restored.normal()])).toEqual(next);
    const firsts = new Set([SamplerRng.fromSeed(7, 0), SamplerRng.fromSeed(7, 1), SamplerRng.fromSeed(8, 0), b].map((r) => r.uniform()));
    expect(firsts.size).toBe(4);
  });
});

describe('checkpoints', () => {
  it('round-trip every array exactly, and refuse to resume with other moves', async () => {
    const evaluator = inThreadEvaluator(gaussianDensity({ mean: [0, 0], withBlobs: true }));
    const path = join(dir, 'cp.json');
    const moves = [
      { move: stretchMove(), weight: 3 },
      { move: deMove(), weight: 1 },
    ];
    const { samplers } = await createEnsembles({ evaluator, seed: 3, nEnsembles: 2, nWalkers: 6, moves, init: { kind: 'ball', center: [0, 0], scale: 1 } });
    await runEnsembles({ samplers, stop: { kind: 'fixed', steps: 40 }, checkpoint: { path, everySteps: 10, meta: { seed: 3 } }, handleSignals: false });
    const cp = readCheckpoint(path);
    expect(cp.step).toBe(40);
    expect(cp.meta).toEqual({ seed: 3 });
    const snap = samplers[1].snapshot();
    expect(cp.ensembles[1].positions).toEqual(snap.positions);
    expect(cp.ensembles[1].blobs).toEqual(snap.blobs);
    expect(cp.ensembles[1].rngState).toEqual(snap.rngState);
    expect(cp.ensembles[1].moves).toEqual(snap.moves);
    expect(snap.moves.proposed.reduce((x, y) => x + y, 0)).toBe(40 * 6);

    const wrong = await Promise.resolve().then(() => {
      try {
        resumeEnsembles(path, { evaluator, moves: stretchMove() });
      } catch (e) {
        return e;
      }
      return undefined;
    });
    expect(wrong).toBeInstanceOf(SamplingError);
    expect((wrong as Error).message).toMatch(/saved move mixture \(stretch 0\.750, de 0\.250\) differs from the one configured now \(stretch 1\.000\)/);
  });

  it('reports a file that is not a checkpoint, with its path', () => {
    const path = join(dir, 'junk.json');
    writeFileSync(path, '{"format":"something else"}');
    expect(() => readCheckpoint(path)).toThrow(InputError);
    expect(() => readCheckpoint(path)).toThrow(/not a sampler checkpoint/);
    expect(() => readCheckpoint(join(dir, 'missing.json'))).toThrow(/cannot read the checkpoint/);
  });

  it('thinning stores only steps that are multiples of thin, and the sink sees them in order', async () => {
    const evaluator = inThreadEvaluator(gaussianDensity({ mean: [0, 0] }));
    const { samplers } = await createEnsembles({ evaluator, seed: 5, nEnsembles: 2, nWalkers: 4, init: { kind: 'ball', center: [0, 0], scale: 1 } });
    const sink = new MemorySink();
    await runEnsembles({ samplers, stop: { kind: 'fixed', steps: 25 }, thin: 5, sink, handleSignals: false });
    expect(sink.states[0].map((s) => s.step)).toEqual([5, 10, 15, 20, 25]);
    expect(sink.states[1].map((s) => s.ensemble)).toEqual([1, 1, 1, 1, 1]);
  });
});

class Capture extends Writable {
  text = '';
  isTTY: boolean;
  constructor(tty: boolean) {
    super();
    this.isTTY = tty;
  }
  override _write(chunk: Buffer, _enc: string, cb: () => void): void {
    this.text += chunk.toString();
    cb();
  }
}

function fakeStates(step: number): EnsembleState[] {
  return [0, 1].map((e) => ({
    ensemble: e,
    step,
    nWalkers: 4,
    ndim: 1,
    positions: new Float64Array(4),
    logProb: Float64Array.of(-3, -2, -1.5, -step / 100),
    nBlobs: 0,
    blobs: new Float64Array(0),
    accepted: Uint8Array.of(1, 0, 0, step % 2),
  }));
}

describe('progress', () => {
  it('prints a plain line every interval when not on a terminal, and a final line', () => {
    const out = new Capture(false);
    let t = 0;
    const p = progressReporter({ stream: out, intervalSeconds: 10, now: () => t });
    for (let step = 1; step <= 100; step++) {
      t = step * 1000; // one second per step
      p.onStep(fakeStates(step), { step, maxSteps: 200, nEnsembles: 2, tau: step >= 50 ? Float64Array.of(12.34) : undefined });
    }
    p.onEnd?.({ steps: 100, stoppedBy: 'steps', acceptance: [0.4, 0.4] }, { step: 100, maxSteps: 200, nEnsembles: 2 });
    const lines = out.text.trim().split('\n');
    expect(lines[0]).toBe('step 1/200 (1%)  acceptance 0.500  tau -  best log-prob -0.0100000  ETA -');
    expect(lines).toHaveLength(11);
    expect(lines[9]).toMatch(/^step 91\/200 \(46%\) {2}acceptance 0\.\d+ {2}tau 12\.3 {2}best log-prob -0\.0100000 {2}ETA 1m49s$/);
    expect(lines[10]).toMatch(/done \(steps\)$/);
  });

  it('draws a bar on a terminal and prints nothing when quiet', () => {
    const tty = new Capture(true);
    const bar = progressReporter({ stream: tty });
    bar.onStep(fakeStates(1), { step: 1, maxSteps: 10, nEnsembles: 2 });
    bar.onEnd?.(undefined, { step: 1, maxSteps: 10, nEnsembles: 2 });
    expect(tty.text).toMatch(/1\/10 steps \| acceptance 0\.500 \| tau - \| best log-prob -0\.0100000 \| ETA/);
    // A notice (a signal was received) stops the bar so that the line stays readable.
    const tty2 = new Capture(true);
    const bar2 = progressReporter({ stream: tty2 });
    bar2.onStep(fakeStates(1), { step: 1, maxSteps: 10, nEnsembles: 2 });
    bar2.onNotice?.('SIGINT received: stopping after the current step');
    const before = tty2.text;
    bar2.onStep(fakeStates(2), { step: 2, maxSteps: 10, nEnsembles: 2 });
    expect(tty2.text).toBe(before);
    expect(before.endsWith('\nSIGINT received: stopping after the current step\n')).toBe(true);
    const quiet = new Capture(true);
    const q = progressReporter({ stream: quiet, quiet: true });
    q.onStep(fakeStates(1), { step: 1, maxSteps: 10, nEnsembles: 2 });
    expect(quiet.text).toBe('');
  });
});

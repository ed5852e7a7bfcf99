/**
 * Chain files: round trip through the writer and reader, the layout any Arrow reader sees (checked by a
 * separate process that uses apache-arrow alone), a writer killed in the middle of a batch, and resume.
 * The chains come from scripts/ar1Run.ts (AR(1) walkers, deterministic seeds).
 */
import { spawn, spawnSync } from 'node:child_process';
import { appendFileSync, existsSync, mkdtempSync, readFileSync, rmSync, statSync, truncateSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import type { InputError } from '../../src/core/errors.js';
import { ChainFile, ChainWriter, type ChainWriterOptions } from '../../src/io/index.js';
import { AR1_BLOB_NAMES, ar1States, type Ar1Options } from '../../scripts/ar1Run.js';

const here = (f: string): string => fileURLToPath(new URL(f, import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'coeval-chains-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const parameters = [
  { name: 'log_age', label: 'log10(age / yr)', unit: 'dex' },
  { name: 'dm', label: '(m-M)_0', unit: 'mag' },
];
const ar1: Ar1Options = { parameters, mean: [9.5, 12.3], sd: [0.05, 0.02], rho: 0.6, nWalkers: 6, nSteps: 50, seed: 11 };
const header: ChainWriterOptions = { parameters, runId: 'run-test', ensemble: 0, seed: 11, nWalkers: 6, coevalVersion: '0.0.0-test', blobNames: AR1_BLOB_NAMES, maxBatchRows: 6 * 7 };

/** What was appended, kept for comparison: per step, copies of positions, logProb, blobs, accepted. */
function record(opts: Ar1Options): { positions: Float64Array; logProb: Float64Array; blobs: Float64Array; accepted: Uint8Array }[] {
  const out: { positions: Float64Array; logProb: Float64Array; blobs: Float64Array; accepted: Uint8Array }[] = [];
  for (const s of ar1States(opts)) out.push({ positions: s.positions.slice(), logProb: s.logProb.slice(), blobs: s.blobs.slice(), accepted: s.accepted.slice() });
  return out;
}

function writeFile(path: string, opts: Ar1Options, close: boolean, flushEvery = 0): ChainWriter {
  const w = ChainWriter.create(path, header);
  for (const s of ar1States(opts)) {
    w.append(s);
    if (flushEvery && s.step % flushEvery === 0) w.flush();
  }
  if (close) w.close();
  else w.flush();
  return w;
}

function readWithArrowAlone(path: string): { schemaMetadata: Record<string, string>; fields: { name: string; type: string; metadata: Record<string, string> }[]; batches: number[]; rows: number; sums: Record<string, number>; error: string | null } {
  const r = spawnSync(process.execPath, [here('./readWithArrow.mjs'), path], { encoding: 'utf8', cwd: here('../..') });
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
}

describe('chain files', () => {
  const expected = record(ar1);
  const closedPath = join(dir, 'closed.arrows');
  writeFile(closedPath, ar1, true);

  it('read back exactly, in both layouts, with discard and thin as emcee counts them', () => {
    const f = ChainFile.open(closedPath);
    expect(f.nSteps).toBe(50);
    expect(f.lastStep).toBe(50);
    expect(f.closed).toBe(true);
    expect(f.tornBytes).toBe(0);
    expect(f.header).toMatchObject({ runId: 'run-test', ensemble: 0, seed: 11, nWalkers: 6, coevalVersion: '0.0.0-test' });
    expect(f.parameters).toEqual(parameters);
    // emcee's get_chain(discard=4, thin=3) keeps iterations 4+3-1, 4+2*3-1, ..., i.e. steps 7, 10, ..., 49.
    const c = f.chain({ discard: 4, thin: 3, parameters: ['dm', 'log_posterior', 'log_likelihood', 'log_prior'], accepted: true });
    expect(c.nDraws).toBe(Math.floor((50 - 4) / 3));
    expect([...c.steps]).toEqual(Array.from({ length: 15 }, (_, d) => 7 + 3 * d));
    for (let d = 0; d < c.nDraws; d++) {
      const e = expected[c.steps[d] - 1];
      for (let w = 0; w < 6; w++) {
        expect(c.values.dm[w * c.nDraws + d]).toBe(e.positions[w * 2 + 1]);
        expect(c.values.log_posterior[w * c.nDraws + d]).toBe(e.logProb[w]);
        expect(c.values.log_prior[w * c.nDraws + d]).toBe(e.blobs[2 * w]);
        expect(c.values.log_likelihood[w * c.nDraws + d]).toBe(e.blobs[2 * w + 1]);
        expect(c.accepted?.[w * c.nDraws + d]).toBe(e.accepted[w]);
      }
    }
    const flat = f.chain({ flat: true });
    expect(flat.values.log_age.length).toBe(300);
    for (let s = 0; s < 50; s++) for (let w = 0; w < 6; w++) expect(flat.values.log_age[s * 6 + w]).toBe(expected[s].positions[w * 2]);
    const acc = f.acceptance({ discard: 10 });
    expect(acc.steps).toBe(40);
    for (let w = 0; w < 6; w++) expect(acc.accepted[w]).toBe(expected.slice(10).reduce((n, e) => n + e.accepted[w], 0));
    f.close();
  });

  it('are read by apache-arrow alone, in a separate process, with units, labels and run metadata', () => {
    const got = readWithArrowAlone(closedPath);
    expect(got.error).toBeNull();
    expect(got.rows).toBe(300);
    expect(got.batches.length).toBe(Math.ceil(50 / 7)); // 7 steps of 6 walkers per batch
    expect(got.schemaMetadata).toMatchObject({ 'coeval.run_id': 'run-test', 'coeval.ensemble': '0', 'coeval.seed': '11', 'coeval.version': '0.0.0-test' });
    expect(JSON.parse(got.schemaMetadata['coeval.parameters'])).toEqual(parameters);
    expect(got.fields.map((f) => `${f.name}:${f.type}`)).toEqual(['step:Int32', 'walker:Int16', 'log_age:Float64', 'dm:Float64', 'log_prior:Float64', 'log_likelihood:Float64', 'log_posterior:Float64', 'accepted:Bool']);
    expect(got.fields[2].metadata).toEqual({ unit: 'dex', label: 'log10(age / yr)' });
    const sum = (f: (e: (typeof expected)[number], w: number) => number): number => expected.reduce((s, e) => s + Array.from({ length: 6 }, (_, w) => f(e, w)).reduce((a, b) => a + b, 0), 0);
    expect(got.sums.step).toBe(6 * (50 * 51) / 2);
    expect(got.sums.walker).toBe(50 * 15);
    expect(got.sums.accepted).toBe(sum((e, w) => e.accepted[w]));
    expect(got.sums.dm).toBeCloseTo(sum((e, w) => e.positions[w * 2 + 1]), 9);
  });

  it('of a running run (flushed, not closed: no end-of-stream marker) read completely by any reader', () => {
    const path = join(dir, 'running.arrows');
    const w = writeFile(path, ar1, false);
    const got = readWithArrowAlone(path);
    expect(got.error).toBeNull();
    expect(got.rows).toBe(300);
    const f = ChainFile.open(path);
    expect(f.closed).toBe(false);
    expect(f.nSteps).toBe(50);
    f.close();
    w.close();
  });

  it('keep every complete batch when the writer is killed (SIGKILL) in the middle of a batch', async () => {
    // A 16 MB batch takes milliseconds to write; the kill is sent as soon as the file starts to grow after a
    // batch boundary, so it lands inside the write. If it happens to land on a boundary, try again.
    const rowsPerBatch = 32 * 8192;
    let path = '';
    let boundary = 0;
    let stepsFlushed = 0;
    for (let attempt = 0; attempt < 5; attempt++) {
      path = join(dir, `killed-${attempt}.arrows`);
      const child = spawn(process.execPath, [here('./crashWriter.mjs'), path, String(rowsPerBatch)], { cwd: here('../..'), stdio: ['ignore', 'pipe', 'pipe'] });
      let stderr = '';
      child.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
      stepsFlushed = await new Promise<number>((resolve, reject) => {
        let text = '';
        child.stdout.on('data', (b: Buffer) => {
          text += b.toString();
          const lines = text.trim().split('\n');
          if (lines.length >= 2) resolve(Number(lines[1]));
        });
        child.on('exit', () => reject(new Error(`writer exited early: ${stderr}`)));
      });
      boundary = statSync(path).size;
      const deadline = Date.now() + 20_000;
      while (statSync(path).size === boundary && Date.now() < deadline) {
        /* wait for the next batch's bytes to start arriving */
      }
      child.kill('SIGKILL');
      await new Promise((r) => child.on('close', r));
      // On a busy machine the write may finish before the signal arrives: then the file ends on a batch
      // boundary and there is nothing torn to test; try again.
      const probe = ChainFile.open(path);
      const torn = probe.tornBytes > 0;
      probe.close();
      if (torn) break;
    }
    const f = ChainFile.open(path);
    expect(f.tornBytes, 'the kill never landed inside a batch in 5 attempts').toBeGreaterThan(0);
    expect(statSync(path).size).toBeGreaterThan(boundary);
    expect(f.nSteps % 8192).toBe(0);
    expect(f.nSteps).toBeGreaterThanOrEqual(stepsFlushed);
    const c = f.chain({ parameters: ['a'], discard: f.nSteps - 1 });
    expect(c.steps[0]).toBe(f.nSteps);
    f.close();
    const got = readWithArrowAlone(path);
    expect(got.rows).toBe(f.nSteps * 32);
    expect(got.error).toMatch(/Expected to read|bytes|message/i);
  }, 60_000);

  it('resume from a checkpoint: torn tail and rows after the checkpoint removed, then the run continues identically', () => {
    const path = join(dir, 'resume.arrows');
    // The uninterrupted run, for comparison.
    const full = record({ ...ar1, nSteps: 80 });
    // A run that checkpointed at step 31 (flush), wrote on to step 45, and crashed mid-batch.
    const w = ChainWriter.create(path, header);
    for (const s of ar1States({ ...ar1, nSteps: 45 })) {
      w.append(s);
      if (s.step === 31) w.flush();
    }
    w.flush();
    appendFileSync(path, Buffer.from([0xff, 0xff, 0xff, 0xff, 0x40, 0x01, 0, 0, 1, 2, 3]));
    const { writer, report } = ChainWriter.resume(path, { ...header, step: 31 });
    expect(report).toEqual({ step: 31, droppedRows: (45 - 31) * 6, tornBytes: 11 });
    let step = 0;
    for (const s of ar1States({ ...ar1, nSteps: 80 })) {
      step = s.step;
      if (step > 31) writer.append(s);
    }
    writer.close();
    const f = ChainFile.open(path);
    expect(f.nSteps).toBe(80);
    const c = f.chain({ parameters: ['log_age', 'log_posterior'], flat: true, accepted: true });
    for (let s = 0; s < 80; s++) {
      for (let w2 = 0; w2 < 6; w2++) {
        expect(c.values.log_age[s * 6 + w2]).toBe(full[s].positions[w2 * 2]);
        expect(c.values.log_posterior[s * 6 + w2]).toBe(full[s].logProb[w2]);
        expect(c.accepted?.[s * 6 + w2]).toBe(full[s].accepted[w2]);
      }
    }
    f.close();
    expect(readWithArrowAlone(path).error).toBeNull();
  });

  it('refuse to resume a file that ends before the checkpoint, or that belongs to another layout', () => {
    const path = join(dir, 'short.arrows');
    writeFile(path, { ...ar1, nSteps: 20 }, false);
    expect(() => ChainWriter.resume(path, { ...header, step: 30 })).toThrow(/ends at step 20, before the checkpoint's step 30/);
    expect(() => ChainWriter.resume(path, { ...header, nWalkers: 8, step: 10 })).toThrow(/different run layout/);
    expect(() => ChainWriter.create(path, header)).toThrow(/already exists/);
  });

  it('report a file that is not a chain file, or was cut before its schema, with its path', () => {
    const path = join(dir, 'empty.arrows');
    appendFileSync(path, Buffer.from([1, 2, 3]));
    expect(() => ChainFile.open(path)).toThrow(/not an Arrow IPC stream/);
    expect(existsSync(path)).toBe(true);
    truncateSync(path, 0);
    try {
      ChainFile.open(path);
      expect.unreachable('an empty file must not open');
    } catch (err) {
      expect((err as InputError).describe()).toMatch(/empty\.arrows.*\n(.*\n)*.*empty or was cut before its schema/);
    }
    expect(readFileSync(path).length).toBe(0);
  });
});

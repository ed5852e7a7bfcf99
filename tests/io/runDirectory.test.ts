import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createRunDirectory, newRunId, openRunDirectory, readManifest, RUN_FORMAT, RUN_LAYOUT, writeManifest, type RunManifest } from '../../src/io/index.js';

const dir = mkdtempSync(join(tmpdir(), 'coeval-rundir-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const manifest = (runId = newRunId()): RunManifest => ({
  format: RUN_FORMAT,
  runId,
  createdAt: '2026-01-01T00:00:00.000Z',
  coevalVersion: '0.1.0',
  parameters: [{ name: 'dm', label: '(m-M)_0', unit: 'mag' }],
  nEnsembles: 2,
  nWalkers: 8,
  seeds: [1, 2],
  chainFiles: [RUN_LAYOUT.chainFile(0), RUN_LAYOUT.chainFile(1)],
  provenance: { model: 'test' },
  config: { any: 'extra field the fit adds' },
});

describe('run directories', () => {
  it('are created with chains/ and manifest.json, leaving no temporary sibling', () => {
    const m = manifest();
    const path = createRunDirectory(join(dir, 'a'), m);
    expect(readdirSync(path).sort()).toEqual(['chains', 'manifest.json']);
    expect(readdirSync(dir).filter((f) => f.startsWith('.'))).toEqual([]);
    expect(openRunDirectory(path).manifest).toEqual(m);
  });

  it('are refused if they exist, unless overwriting a run directory', () => {
    const path = join(dir, 'b');
    createRunDirectory(path, manifest('first'));
    expect(() => createRunDirectory(path, manifest('second'))).toThrow(/already exists/);
    expect(readManifest(path).runId).toBe('first');
    createRunDirectory(path, manifest('second'), 'overwrite');
    expect(readManifest(path).runId).toBe('second');
    const plain = join(dir, 'not-a-run');
    mkdirSync(plain);
    writeFileSync(join(plain, 'precious.txt'), 'keep me');
    expect(() => createRunDirectory(plain, manifest(), 'overwrite')).toThrow(/not a coeval run directory/);
    expect(readFileSync(join(plain, 'precious.txt'), 'utf8')).toBe('keep me');
  });

  it('keep their manifest readable at every moment (written temp-then-rename), and check it when read', () => {
    const path = createRunDirectory(join(dir, 'c'), manifest());
    writeManifest(path, { ...readManifest(path), status: 'finished' });
    expect(readManifest(path).status).toBe('finished');
    expect(readdirSync(path).filter((f) => f.endsWith('.tmp'))).toEqual([]);
    writeFileSync(join(path, 'manifest.json'), JSON.stringify({ ...manifest(), nWalkers: 0 }));
    expect(() => readManifest(path)).toThrow(/manifest\.json: .*/);
    writeFileSync(join(path, 'manifest.json'), '{ not json');
    expect(() => readManifest(path)).toThrow(/not valid JSON/);
  });

  it('have sortable, distinct run ids', () => {
    const a = newRunId(new Date('2026-03-04T05:06:07.890Z'));
    expect(a).toMatch(/^20260304T050607Z-[0-9a-f]{8}$/);
    expect(newRunId()).not.toBe(newRunId());
    expect(existsSync(join(dir, 'missing'))).toBe(false);
    expect(() => openRunDirectory(join(dir, 'missing'))).toThrow(/does not exist/);
  });
});

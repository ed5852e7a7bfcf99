/**
 * Run directories (design.md section 6): created atomically, so that a directory either appears complete
 * with its manifest or not at all, and refused if it exists unless the run is resumed or the user asked
 * to overwrite it.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError, OutputError } from '../core/errors.js';
import { MANIFEST_FILE, readManifest, writeManifest, type RunManifest } from './manifest.js';

/** Where things live in a run directory. */
export const RUN_LAYOUT = {
  manifest: MANIFEST_FILE,
  chainsDir: 'chains',
  /** The sampler's checkpoint (written temp-then-rename by src/sampler/checkpoint.ts). */
  checkpoint: 'checkpoint.json',
  /** Chain file of ensemble k, relative to the run directory. */
  chainFile: (ensemble: number): string => `chains/ensemble-${ensemble}.arrows`,
} as const;

/** A run id: UTC time and random hex, sortable and unique enough for one user's runs. */
export function newRunId(now: Date = new Date()): string {
  const stamp = now.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  return `${stamp}-${randomBytes(4).toString('hex')}`;
}

export type RunDirectoryMode = 'new' | 'overwrite';

/**
 * Create `dir` with its chains/ folder and manifest.json. It is built under a temporary sibling name and
 * renamed into place, so no half-made run directory is ever seen. An existing `dir` is refused, unless
 * `mode` is 'overwrite' and it is a run directory (has a manifest.json): then the new one replaces it,
 * and the old one is removed only once the new one is in place.
 */
export function createRunDirectory(dir: string, manifest: RunManifest, mode: RunDirectoryMode = 'new'): string {
  const target = resolve(dir);
  const parent = dirname(target);
  if (!existsSync(parent)) throw new OutputError('the folder to create the run directory in does not exist', { where: { file: parent }, hint: 'create it first' });
  const exists = existsSync(target);
  if (exists) {
    if (mode !== 'overwrite') {
      throw new OutputError('the run directory already exists', {
        where: { file: target },
        hint: 'resume it, choose another directory, or ask to overwrite it',
      });
    }
    if (!statSync(target).isDirectory() || !existsSync(join(target, MANIFEST_FILE))) {
      throw new OutputError('refusing to overwrite: this is not a coeval run directory (no manifest.json)', { where: { file: target }, hint: 'choose another directory' });
    }
  }
  const tmp = join(parent, `.${basename(target)}.${process.pid}.${randomBytes(3).toString('hex')}.tmp`);
  try {
    mkdirSync(tmp);
    mkdirSync(join(tmp, RUN_LAYOUT.chainsDir));
    writeManifest(tmp, manifest);
    if (exists) {
      const old = `${tmp}.old`;
      renameSync(target, old);
      renameSync(tmp, target);
      rmSync(old, { recursive: true, force: true });
    } else {
      renameSync(tmp, target);
    }
  } catch (cause) {
    rmSync(tmp, { recursive: true, force: true });
    if (cause instanceof OutputError) throw cause;
    throw new OutputError('could not create the run directory', { where: { file: target }, cause, hint: (cause as Error).message });
  }
  return target;
}

/** Open an existing run directory (to resume, diagnose or summarise it): its manifest. */
export function openRunDirectory(dir: string): { dir: string; manifest: RunManifest } {
  const target = resolve(dir);
  if (!existsSync(target) || !statSync(target).isDirectory()) {
    throw new InputError('the run directory does not exist', { where: { file: target }, hint: 'give the directory that a fit wrote' });
  }
  return { dir: target, manifest: readManifest(target) };
}

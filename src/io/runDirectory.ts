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
  /**
   * Per-star results of a fit (Arrow IPC file), one row per catalogue star after filters: `id` (utf8),
   * `row` (int32, index in the filtered catalogue), per fitted band `<band>` and `<band>_err` (float64),
   * `p_single`, `p_binary`, `p_field` (posterior mean responsibilities), `membership_prior` (NaN when the
   * catalogue has none), `mass_median` (posterior median initial mass of the star, or of the primary of a
   * binary, given cluster membership; NaN when not computed). Schema metadata `coeval.stars` (JSON) says how
   * many posterior draws the averages use.
   */
  stars: 'stars.arrow',
  /** Diagnostics and verdict (JSON), and the summary in each format. */
  diagnostics: 'diagnostics.json',
  summary: (format: 'txt' | 'csv' | 'json' | 'tex'): string => `summary.${format}`,
  /** Plots: `<name>.svg`, and `<name>.png` when asked for. */
  plotsDir: 'plots',
  report: 'report.html',
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

/**
 * manifest.json: what a run directory holds and how it was made. The fields here are the ones storage,
 * diagnostics and summaries rely on; the fit adds its own (resolved config, priors, timings, ...), which
 * are kept as they are.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { writeFileAtomic } from '../core/atomicWrite.js';
import { InputError } from '../core/errors.js';

export const MANIFEST_FILE = 'manifest.json';
export const RUN_FORMAT = 'coeval-run 1';

const parameterInfo = z.object({ name: z.string().min(1), label: z.string(), unit: z.string() });

export const runManifestSchema = z.looseObject({
  format: z.literal(RUN_FORMAT),
  runId: z.string().min(1),
  /** ISO 8601 time the run directory was created. */
  createdAt: z.string(),
  coevalVersion: z.string(),
  /** The sampled parameters, in the order of the chain files' columns. */
  parameters: z.array(parameterInfo).min(1),
  nEnsembles: z.number().int().min(1),
  nWalkers: z.number().int().min(1),
  /** One seed per ensemble. */
  seeds: z.array(z.union([z.number(), z.string()])),
  /** Chain files relative to the run directory, one per ensemble, in ensemble order. */
  chainFiles: z.array(z.string()).min(1),
  /** What produced the posterior: every summary repeats it (stellar model, photometric calibration, caveats). */
  provenance: z.looseObject({ model: z.string(), calibration: z.string().optional(), notes: z.array(z.string()).optional() }).optional(),
  /** 'running' while the sampler works; the fit sets 'finished', 'interrupted' or 'failed'. */
  status: z.enum(['running', 'finished', 'interrupted', 'failed']).optional(),
});

export type RunManifest = z.infer<typeof runManifestSchema>;

/** Write manifest.json atomically (temp file, fsync, rename). */
export function writeManifest(runDir: string, manifest: RunManifest): void {
  runManifestSchema.parse(manifest);
  writeFileAtomic(join(runDir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
}

/** Read and check manifest.json. */
export function readManifest(runDir: string): RunManifest {
  const file = join(runDir, MANIFEST_FILE);
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (cause) {
    throw new InputError('no manifest.json in the run directory', {
      where: { file },
      cause,
      hint: 'give the directory that `coeval fit` created (it holds manifest.json and chains/)',
    });
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (cause) {
    throw new InputError(`manifest.json is not valid JSON: ${(cause as Error).message}`, { where: { file }, cause });
  }
  const parsed = runManifestSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new InputError(`manifest.json: ${issue.message}`, { where: { file, key: issue.path.join('.') }, expected: `a ${RUN_FORMAT} manifest` });
  }
  return parsed.data;
}

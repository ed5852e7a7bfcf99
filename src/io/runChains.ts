/**
 * The chains of a whole run: one writer that routes each ensemble's states to its file (the sink the
 * sampler's run loop is given), and one reader that gathers every ensemble's walkers into one set of
 * chains, ensemble-major (chain k * nWalkers + w is walker w of ensemble k).
 */
import { join } from 'node:path';
import { InputError } from '../core/errors.js';
import type { EnsembleState } from '../sampler/types.js';
import { ChainFile, type ChainOptions } from './chainReader.js';
import type { ChainSink } from '../sampler/chainSink.js';
import { ChainWriter, type ChainWriterOptions, type ResumeReport } from './chainWriter.js';
import type { RunManifest } from './manifest.js';

export interface RunChainWriterOptions {
  /** Blob names of the log-density (see ChainWriterOptions). */
  blobNames?: readonly string[];
  maxBatchRows?: number;
}

function writerOptions(manifest: RunManifest, k: number, opts: RunChainWriterOptions): ChainWriterOptions {
  return {
    parameters: manifest.parameters,
    runId: manifest.runId,
    ensemble: k,
    seed: manifest.seeds[k] ?? '',
    nWalkers: manifest.nWalkers,
    coevalVersion: manifest.coevalVersion,
    blobNames: opts.blobNames,
    maxBatchRows: opts.maxBatchRows,
  };
}

/**
 * The chain files of a run, written together: the sink the sampler's run loop is given. A new run's files
 * are created at once (`create`); a resumed run's files are reopened when the run loop calls `rewind` with
 * each ensemble's checkpointed step (`reopen`), which cuts torn tails and rows written after the checkpoint.
 */
export class RunChainWriter implements ChainSink {
  private writers: ChainWriter[] | undefined;
  private readonly pending?: { runDir: string; manifest: RunManifest; opts: RunChainWriterOptions };
  /** What `rewind` found and removed, per ensemble (empty for a new run). */
  readonly resumeReports: ResumeReport[] = [];

  private constructor(writers: ChainWriter[] | undefined, pending?: { runDir: string; manifest: RunManifest; opts: RunChainWriterOptions }) {
    this.writers = writers;
    this.pending = pending;
  }

  /** New chain files for every ensemble of the run in `runDir` (its manifest names them). */
  static create(runDir: string, manifest: RunManifest, opts: RunChainWriterOptions = {}): RunChainWriter {
    const writers: ChainWriter[] = [];
    try {
      for (let k = 0; k < manifest.nEnsembles; k++) writers.push(ChainWriter.create(join(runDir, manifest.chainFiles[k]), writerOptions(manifest, k, opts)));
    } catch (err) {
      for (const w of writers) w.close();
      throw err;
    }
    return new RunChainWriter(writers);
  }

  /** The chain files of a run to be resumed; they are opened and cut back when the run loop calls `rewind`. */
  static reopen(runDir: string, manifest: RunManifest, opts: RunChainWriterOptions = {}): RunChainWriter {
    return new RunChainWriter(undefined, { runDir, manifest, opts });
  }

  /** Reopen every chain file at its ensemble's checkpointed step (see ChainWriter.resume). */
  rewind(steps: readonly number[]): void {
    if (!this.pending) throw new Error('rewind is for a run reopened to resume (RunChainWriter.reopen)');
    const { runDir, manifest, opts } = this.pending;
    if (steps.length !== manifest.nEnsembles) throw new Error(`rewind got ${steps.length} steps for ${manifest.nEnsembles} ensembles`);
    this.close();
    const writers: ChainWriter[] = [];
    this.resumeReports.length = 0;
    try {
      for (let k = 0; k < manifest.nEnsembles; k++) {
        const r = ChainWriter.resume(join(runDir, manifest.chainFiles[k]), { ...writerOptions(manifest, k, opts), step: steps[k] });
        writers.push(r.writer);
        this.resumeReports.push(r.report);
      }
    } catch (err) {
      for (const w of writers) w.close();
      throw err;
    }
    this.writers = writers;
  }

  private get open(): ChainWriter[] {
    if (!this.writers) throw new Error('the chain files of a reopened run are written only after rewind');
    return this.writers;
  }

  append(state: EnsembleState): void {
    const w = this.open[state.ensemble];
    if (!w) throw new Error(`no chain file for ensemble ${state.ensemble}`);
    w.append(state);
  }

  flush(): void {
    for (const w of this.open) w.flush();
  }

  close(): void {
    for (const w of this.writers ?? []) w.close();
  }
}

export interface RunDraws {
  columns: string[];
  nEnsembles: number;
  nWalkers: number;
  /** Draws per walker (the same for every ensemble: the shortest file sets it). */
  nDraws: number;
  /** Stored steps used per file (after lining the ensembles up). */
  nSteps: number;
  steps: Int32Array;
  /** Per column, nEnsembles * nWalkers chains of nDraws, chain-major (not flat) or step-major per ensemble (flat). */
  values: Record<string, Float64Array>;
  accepted?: Uint8Array;
  /** Per ensemble: whether its file is closed, and torn bytes ignored. */
  files: { path: string; nSteps: number; closed: boolean; tornBytes: number }[];
}

/**
 * Read the chains of every ensemble of a run, lined up to the steps all ensembles have. With `shared`, the
 * value columns (all, or those named) live in SharedArrayBuffers, so that worker threads can read them
 * without a copy.
 */
export function readRunChains(runDir: string, manifest: RunManifest, opts: ChainOptions & { shared?: boolean | readonly string[] } = {}): RunDraws {
  const files = manifest.chainFiles.map((f) => ChainFile.open(join(runDir, f)));
  try {
    for (const f of files) {
      if (f.header.nWalkers !== manifest.nWalkers || f.header.runId !== manifest.runId) {
        throw new InputError('a chain file does not belong to this run', {
          where: { file: f.path },
          found: `run ${f.header.runId}, ${f.header.nWalkers} walkers`,
          expected: `run ${manifest.runId}, ${manifest.nWalkers} walkers (manifest.json)`,
        });
      }
    }
    const nSteps = Math.min(...files.map((f) => f.nSteps), opts.maxSteps ?? Infinity);
    const common = { ...opts, maxSteps: nSteps };
    const nDraws = files[0].drawCount(common);
    const nw = manifest.nWalkers;
    const columns = [...(opts.parameters ?? manifest.parameters.map((p) => p.name))];
    const size = files.length * nw * nDraws;
    const values: Record<string, Float64Array> = {};
    const shared = (c: string): boolean => (Array.isArray(opts.shared) ? opts.shared.includes(c) : opts.shared === true);
    for (const c of columns) values[c] = shared(c) ? new Float64Array(new SharedArrayBuffer(size * Float64Array.BYTES_PER_ELEMENT)) : new Float64Array(size);
    const accepted = opts.accepted ? new Uint8Array(size) : undefined;
    let steps: Int32Array = new Int32Array(0);
    files.forEach((f, k) => {
      steps = f.chainInto(common, { values, accepted, offset: k * nw * nDraws });
    });
    return {
      columns,
      nEnsembles: files.length,
      nWalkers: nw,
      nDraws,
      nSteps,
      steps,
      values,
      accepted,
      files: files.map((f) => ({ path: f.path, nSteps: f.nSteps, closed: f.closed, tornBytes: f.tornBytes })),
    };
  } finally {
    for (const f of files) f.close();
  }
}

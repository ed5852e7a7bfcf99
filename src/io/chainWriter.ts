/**
 * Writing a chain file while the sampler runs: rows are buffered in preallocated typed arrays and written
 * as one Arrow record batch whenever the buffer is full and at every `flush()` (which the run loop calls
 * before each checkpoint, and which also fsyncs). Memory stays at one buffer, whatever the run length.
 *
 * One file per ensemble; see ipcStream.ts for why the Arrow IPC stream format.
 */
import { closeSync, existsSync, fstatSync, fsyncSync, ftruncateSync, openSync, writeSync } from 'node:fs';
import type { Schema } from 'apache-arrow';
import { OutputError } from '../core/errors.js';
import type { ChainSink } from '../sampler/chainSink.js';
import type { EnsembleState } from '../sampler/types.js';
import { decodeBatch, decodeSchema, encodeBatch, encodeSchema, type ColumnBuffers } from './chainBatch.js';
import { chainSchema, headerFromSchema, STEP_COLUMN, type ChainFileHeader } from './chainSchema.js';
import { readMessageBytes, scanStream } from './ipcStream.js';

/**
 * What the sampler's run loop calls (src/sampler/chainSink.ts): append each stored state, flush (write and
 * fsync) before each checkpoint, close at the end. The writer of a run (RunChainWriter) adds `rewind`.
 */
export type { ChainSink } from '../sampler/chainSink.js';

export interface ChainWriterOptions extends ChainFileHeader {
  /**
   * Names of the blobs in `EnsembleState.blobs`, as the log-density declares them. The blobs named
   * `log_prior` and `log_likelihood` fill those columns; a column with no such blob holds NaN.
   */
  blobNames?: readonly string[];
  /** Rows buffered before a batch is written unasked (rounded to whole steps); default about 4 MB of rows. */
  maxBatchRows?: number;
}

export interface ResumeReport {
  /** Last step kept in the file (the checkpoint's step). */
  step: number;
  /** Rows beyond the checkpoint's step that were removed. */
  droppedRows: number;
  /** Bytes of a torn last batch that were removed. */
  tornBytes: number;
}

const TARGET_BATCH_BYTES = 4 << 20;

export class ChainWriter implements ChainSink {
  readonly path: string;
  readonly header: ChainFileHeader;
  private readonly schema: Schema;
  private readonly schemaBytes: Uint8Array;
  private fd: number | undefined;
  private position: number;
  private readonly capacity: number;
  private rows = 0;
  private readonly columns: ColumnBuffers;
  private readonly step: Int32Array;
  private readonly walker: Int16Array;
  private readonly params: Float64Array[];
  private readonly logPrior: Float64Array;
  private readonly logLikelihood: Float64Array;
  private readonly logPosterior: Float64Array;
  private readonly accepted: Uint8Array;
  private readonly logPriorBlob: number;
  private readonly logLikelihoodBlob: number;
  private lastStepWritten: number;

  private constructor(path: string, fd: number, position: number, lastStep: number, opts: ChainWriterOptions) {
    this.path = path;
    this.fd = fd;
    this.position = position;
    this.lastStepWritten = lastStep;
    this.header = { parameters: opts.parameters, runId: opts.runId, ensemble: opts.ensemble, seed: opts.seed, nWalkers: opts.nWalkers, coevalVersion: opts.coevalVersion };
    this.schema = chainSchema(this.header);
    this.schemaBytes = encodeSchema(this.schema);
    const nw = opts.nWalkers;
    const rowBytes = 4 + 2 + 8 * (opts.parameters.length + 3) + 1;
    const wanted = opts.maxBatchRows ?? Math.floor(TARGET_BATCH_BYTES / rowBytes);
    this.capacity = Math.max(1, Math.floor(wanted / nw)) * nw;
    this.step = new Int32Array(this.capacity);
    this.walker = new Int16Array(this.capacity);
    this.params = opts.parameters.map(() => new Float64Array(this.capacity));
    this.logPrior = new Float64Array(this.capacity);
    this.logLikelihood = new Float64Array(this.capacity);
    this.logPosterior = new Float64Array(this.capacity);
    this.accepted = new Uint8Array(Math.ceil(this.capacity / 8));
    this.columns = [this.step, this.walker, ...this.params, this.logPrior, this.logLikelihood, this.logPosterior, this.accepted];
    const blobs = opts.blobNames ?? [];
    this.logPriorBlob = blobs.indexOf('log_prior');
    this.logLikelihoodBlob = blobs.indexOf('log_likelihood');
  }

  /** Start a new chain file; refuses to replace an existing one. */
  static create(path: string, opts: ChainWriterOptions): ChainWriter {
    if (existsSync(path)) throw new OutputError('the chain file already exists', { where: { file: path }, hint: 'resume the run, or start it in a new run directory' });
    let fd: number;
    try {
      fd = openSync(path, 'wx');
    } catch (cause) {
      throw new OutputError('could not create the chain file', { where: { file: path }, cause, hint: (cause as Error).message });
    }
    const writer = new ChainWriter(path, fd, 0, 0, opts);
    writer.writeBytes(writer.schemaBytes);
    fsyncSync(fd);
    return writer;
  }

  /**
   * Reopen a chain file to continue a run from a checkpoint at `step`: a torn last batch and an end-of-stream
   * marker are cut off, and so are rows of steps after `step` (written after the checkpoint, before a crash).
   * Throws if the file's schema differs from `opts`, or if the file ends before `step`.
   */
  static resume(path: string, opts: ChainWriterOptions & { step: number }): { writer: ChainWriter; report: ResumeReport } {
    let fd: number;
    try {
      fd = openSync(path, 'r+');
    } catch (cause) {
      throw new OutputError('could not open the chain file to resume', { where: { file: path }, cause, hint: (cause as Error).message });
    }
    try {
      const size = fstatSync(fd).size;
      const scan = scanStream(fd, size, path);
      const schemaMessage = scan.messages[0];
      const schemaBytes = readMessageBytes(fd, schemaMessage.offset, schemaMessage.end);
      const found = headerFromSchema(decodeSchema(schemaBytes), path);
      const describe = (h: ChainFileHeader): string =>
        `${h.parameters.map((p) => `${p.name} [${p.unit}]`).join(', ')}; ${h.nWalkers} walkers; run ${h.runId}, ensemble ${h.ensemble}`;
      if (describe(found) !== describe(opts)) {
        throw new OutputError('the chain file was written for a different run layout and cannot be resumed', {
          where: { file: path },
          found: describe(found),
          expected: describe(opts),
        });
      }
      // Continue with the file's own header (it may name an older coeval version), so that new batches
      // follow the same schema message.
      const writer = new ChainWriter(path, fd, 0, 0, { ...found, blobNames: opts.blobNames, maxBatchRows: opts.maxBatchRows });
      if (!sameBytes(schemaBytes, writer.schemaBytes)) {
        throw new OutputError('the chain file\'s schema was written by a different coeval layout and cannot be appended to', { where: { file: path } });
      }
      // Walk back from the last batch, dropping batches that lie wholly after the checkpoint and cutting the
      // one that straddles it.
      let end = scan.dataEnd;
      let droppedRows = 0;
      let keep: { batchBytes: Uint8Array; rows: number } | undefined;
      let lastStep = 0;
      for (let i = scan.messages.length - 1; i >= 1; i--) {
        const m = scan.messages[i];
        if (m.kind !== 'batch') continue;
        const bytes = readMessageBytes(fd, m.offset, m.end);
        const batch = decodeBatch(concat(schemaBytes, bytes));
        const steps = batch.getChild(STEP_COLUMN)?.toArray() as Int32Array;
        const first = steps[0];
        const last = steps[steps.length - 1];
        if (last <= opts.step) {
          lastStep = last;
          break;
        }
        end = m.offset;
        if (first > opts.step) {
          droppedRows += m.rows;
          continue;
        }
        // Straddles: keep the rows up to the checkpoint's step.
        let k = 0;
        while (k < steps.length && steps[k] <= opts.step) k++;
        droppedRows += m.rows - k;
        keep = { batchBytes: bytes, rows: k };
        lastStep = steps[k - 1];
        break;
      }
      if (lastStep !== opts.step) {
        throw new OutputError(`the chain file ends at step ${lastStep}, before the checkpoint's step ${opts.step}`, {
          where: { file: path },
          hint: 'the chain file lost rows that the checkpoint counts on; start the run again in a new run directory',
        });
      }
      ftruncateSync(fd, end);
      writer.position = end;
      writer.lastStepWritten = lastStep;
      if (keep) {
        writer.loadRows(decodeBatch(concat(schemaBytes, keep.batchBytes)), keep.rows);
        writer.writeBatch();
      }
      fsyncSync(fd);
      return { writer, report: { step: lastStep, droppedRows, tornBytes: scan.tornBytes } };
    } catch (err) {
      closeSync(fd);
      throw err;
    }
  }

  /** The last step appended (0 before the first). */
  get lastStep(): number {
    return this.lastStepWritten;
  }

  append(state: EnsembleState): void {
    const { nWalkers, ndim, ensemble, step } = state;
    if (this.fd === undefined) throw new Error('append after close');
    if (ensemble !== this.header.ensemble) throw new Error(`state of ensemble ${ensemble} given to the writer of ensemble ${this.header.ensemble}`);
    if (nWalkers !== this.header.nWalkers || ndim !== this.params.length) {
      throw new Error(`state has ${nWalkers} walkers x ${ndim} parameters; the chain file has ${this.header.nWalkers} x ${this.params.length}`);
    }
    if (!(step > this.lastStepWritten)) throw new Error(`steps must increase: got ${step} after ${this.lastStepWritten}`);
    if (this.rows + nWalkers > this.capacity) this.writeBatch();
    const { positions, logProb, blobs, nBlobs, accepted } = state;
    for (let w = 0; w < nWalkers; w++) {
      const r = this.rows + w;
      this.step[r] = step;
      this.walker[r] = w;
      for (let j = 0; j < ndim; j++) this.params[j][r] = positions[w * ndim + j];
      this.logPrior[r] = this.logPriorBlob >= 0 ? blobs[w * nBlobs + this.logPriorBlob] : NaN;
      this.logLikelihood[r] = this.logLikelihoodBlob >= 0 ? blobs[w * nBlobs + this.logLikelihoodBlob] : NaN;
      this.logPosterior[r] = logProb[w];
      if (accepted[w]) this.accepted[r >> 3] |= 1 << (r & 7);
    }
    this.rows += nWalkers;
    this.lastStepWritten = step;
  }

  flush(): void {
    if (this.fd === undefined) return;
    this.writeBatch();
    fsyncSync(this.fd);
  }

  close(): void {
    if (this.fd === undefined) return;
    this.writeBatch();
    // The end-of-stream marker: continuation indicator and a zero metadata length.
    this.writeBytes(Uint8Array.of(0xff, 0xff, 0xff, 0xff, 0, 0, 0, 0));
    fsyncSync(this.fd);
    closeSync(this.fd);
    this.fd = undefined;
  }

  private writeBatch(): void {
    if (this.rows === 0) return;
    this.writeBytes(encodeBatch(this.schema, this.schemaBytes, this.columns, this.rows));
    this.rows = 0;
    this.accepted.fill(0);
  }

  private writeBytes(bytes: Uint8Array): void {
    if (this.fd === undefined) throw new Error('write after close');
    let off = 0;
    try {
      while (off < bytes.length) {
        const n = writeSync(this.fd, bytes, off, bytes.length - off, this.position);
        off += n;
        this.position += n;
      }
    } catch (cause) {
      throw new OutputError('could not write the chain file', { where: { file: this.path }, cause, hint: (cause as Error).message });
    }
  }

  /** Put the first `rows` rows of a decoded batch back into the buffer (resume cuts a batch this way). */
  private loadRows(batch: ReturnType<typeof decodeBatch>, rows: number): void {
    this.schema.fields.forEach((field, i) => {
      const col = batch.getChildAt(i);
      if (!col) throw new Error(`column ${field.name} missing`);
      const target = this.columns[i];
      if (target instanceof Uint8Array) {
        for (let r = 0; r < rows; r++) if (col.get(r)) target[r >> 3] |= 1 << (r & 7);
      } else {
        (target as Float64Array).set((col.toArray() as Float64Array).subarray(0, rows));
      }
    });
    this.rows = rows;
  }
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  const out = new Uint8Array(new ArrayBuffer(a.length + b.length));
  out.set(a, 0);
  out.set(b, a.length);
  return out;
}

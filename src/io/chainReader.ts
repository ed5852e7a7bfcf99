/**
 * Reading chain files, also while they are being written or after a crash: only complete record batches
 * are read (see ipcStream.ts), one at a time, so memory holds the requested columns and one batch.
 */
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { InputError } from '../core/errors.js';
import type { ParameterInfo } from '../core/parameters.js';
import { decodeBatch } from './chainBatch.js';
import { ACCEPTED_COLUMN, headerFromSchema, LOG_COLUMNS, STEP_COLUMN, WALKER_COLUMN, type ChainFileHeader } from './chainSchema.js';
import { decodeSchema } from './chainBatch.js';
import { readMessageBytes, scanStream, type StreamMessage } from './ipcStream.js';

export interface ChainOptions {
  /** Stored steps to drop at the start (burn-in), as emcee's get_chain counts them. Default 0. */
  discard?: number;
  /** Keep every `thin`-th stored step after the discarded ones (emcee's convention). Default 1. */
  thin?: number;
  /**
   * false (default): each column walker-major, walker w's draws at [w * nDraws, (w + 1) * nDraws), the
   * draws x chains layout the diagnostics take. true: one sample, step-major ([d * nWalkers + w]), like
   * emcee's flat chain.
   */
  flat?: boolean;
  /** Float columns to return: parameter names and/or log_prior, log_likelihood, log_posterior. Default: every parameter. */
  parameters?: readonly string[];
  /** Also return the `accepted` flags, in the same layout. Default false. */
  accepted?: boolean;
  /** Read only the first `maxSteps` stored steps (to line ensembles up). */
  maxSteps?: number;
}

export interface ChainDraws {
  /** The returned columns, in the order asked. */
  columns: string[];
  nWalkers: number;
  /** Draws per walker after discard and thin. */
  nDraws: number;
  flat: boolean;
  /** Step number of each draw (length nDraws). */
  steps: Int32Array;
  values: Record<string, Float64Array>;
  /** 1 where the walker's proposal was accepted at that step (when asked). */
  accepted?: Uint8Array;
}

/** Where `chainInto` writes: arrays large enough for this file's draws at `offset`. */
interface Target {
  values: Record<string, Float64Array>;
  accepted?: Uint8Array;
  offset: number;
}

export class ChainFile {
  readonly path: string;
  readonly header: ChainFileHeader;
  /** Complete steps stored (rows / walkers). */
  readonly nSteps: number;
  /** Last step number stored (0 when none). */
  readonly lastStep: number;
  /** True when the file ends with the end-of-stream marker (the run closed it). */
  readonly closed: boolean;
  /** Bytes of a torn last batch that are ignored. */
  readonly tornBytes: number;
  private readonly batches: StreamMessage[];
  private readonly schemaBytes: Uint8Array;
  private readonly fd: number;

  private constructor(path: string, fd: number) {
    this.path = path;
    this.fd = fd;
    const scan = scanStream(fd, fstatSync(fd).size, path);
    this.schemaBytes = readMessageBytes(fd, scan.messages[0].offset, scan.messages[0].end);
    this.header = headerFromSchema(decodeSchema(this.schemaBytes), path);
    this.batches = scan.messages.filter((m) => m.kind === 'batch' && m.rows > 0);
    const rows = this.batches.reduce((s, m) => s + m.rows, 0);
    this.nSteps = Math.floor(rows / this.header.nWalkers);
    this.closed = scan.ended;
    this.tornBytes = scan.tornBytes;
    this.lastStep = this.nSteps > 0 ? this.readLastStep() : 0;
  }

  static open(path: string): ChainFile {
    let fd: number;
    try {
      fd = openSync(path, 'r');
    } catch (cause) {
      throw new InputError('cannot open the chain file', { where: { file: path }, cause, hint: (cause as Error).message });
    }
    try {
      return new ChainFile(path, fd);
    } catch (err) {
      closeSync(fd);
      throw err;
    }
  }

  get parameters(): readonly ParameterInfo[] {
    return this.header.parameters;
  }

  close(): void {
    closeSync(this.fd);
  }

  /** Draws per walker that `chain(opts)` returns. */
  drawCount(opts: Pick<ChainOptions, 'discard' | 'thin' | 'maxSteps'> = {}): number {
    const { discard, thin, stored } = this.window(opts);
    return Math.max(0, Math.floor((stored - discard) / thin));
  }

  /** The chain, after discard and thin, as typed arrays (see ChainOptions for the layouts). */
  chain(opts: ChainOptions = {}): ChainDraws {
    const columns = this.columnsOf(opts);
    const nDraws = this.drawCount(opts);
    const size = nDraws * this.header.nWalkers;
    const values: Record<string, Float64Array> = {};
    for (const c of columns) values[c] = new Float64Array(size);
    const accepted = opts.accepted ? new Uint8Array(size) : undefined;
    const steps = this.chainInto(opts, { values, accepted, offset: 0 });
    return { columns, nWalkers: this.header.nWalkers, nDraws, flat: opts.flat ?? false, steps, values, accepted };
  }

  /** Accepted proposals of each walker over the stored steps after `discard`, and how many steps that is. */
  acceptance(opts: Pick<ChainOptions, 'discard' | 'maxSteps'> = {}): { accepted: Uint32Array; steps: number } {
    const nw = this.header.nWalkers;
    const draws = this.chain({ ...opts, thin: 1, parameters: [], accepted: true });
    const counts = new Uint32Array(nw);
    const a = draws.accepted as Uint8Array;
    for (let w = 0; w < nw; w++) {
      let c = 0;
      for (let d = 0; d < draws.nDraws; d++) c += a[w * draws.nDraws + d];
      counts[w] = c;
    }
    return { accepted: counts, steps: draws.nDraws };
  }

  /** Read the selected draws into `target` (used to gather several ensembles into one array); returns the steps. */
  chainInto(opts: ChainOptions, target: Target): Int32Array {
    const nw = this.header.nWalkers;
    const columns = this.columnsOf(opts);
    const flat = opts.flat ?? false;
    const { discard, thin, stored } = this.window(opts);
    const nDraws = this.drawCount(opts);
    const steps = new Int32Array(nDraws);
    const first = discard + thin - 1;
    const limitRow = stored * nw;
    let row0 = 0;
    let buffer = new Uint8Array(0);
    for (const m of this.batches) {
      if (row0 >= limitRow) break;
      const rows = m.rows;
      const rowEnd = Math.min(row0 + rows, limitRow);
      // Skip batches that hold no kept step.
      const firstStepIndex = Math.floor(row0 / nw);
      const lastStepIndex = Math.floor((rowEnd - 1) / nw);
      if (holdsKeptStep(firstStepIndex, lastStepIndex, first, thin)) {
        const len = m.end - m.offset;
        if (buffer.length < this.schemaBytes.length + len) {
          buffer = new Uint8Array(new ArrayBuffer(this.schemaBytes.length + len));
          buffer.set(this.schemaBytes, 0);
        }
        let got = 0;
        while (got < len) {
          const n = readSync(this.fd, buffer, this.schemaBytes.length + got, len - got, m.offset + got);
          if (n === 0) throw new InputError('the chain file shrank while it was being read', { where: { file: this.path } });
          got += n;
        }
        const batch = decodeBatch(buffer.subarray(0, this.schemaBytes.length + len));
        const stepCol = batch.getChild(STEP_COLUMN)?.data[0].values as Int32Array;
        const walkerCol = batch.getChild(WALKER_COLUMN)?.data[0].values as Int16Array;
        const cols = columns.map((c) => batch.getChild(c)?.data[0].values as Float64Array);
        const outs = columns.map((c) => target.values[c]);
        const acc = target.accepted ? batch.getChild(ACCEPTED_COLUMN)?.data[0] : undefined;
        for (let r = 0; r < rowEnd - row0; r++) {
          const globalRow = row0 + r;
          const s = Math.floor(globalRow / nw);
          const w = globalRow - s * nw;
          if (walkerCol[r] !== w) {
            throw new InputError(`row ${globalRow + 1} belongs to walker ${walkerCol[r]}, expected walker ${w}`, {
              where: { file: this.path, row: globalRow + 1 },
              expected: 'rows in step order, walkers 0..n-1 within each step, as coeval writes them',
            });
          }
          if (s < first || (s - first) % thin !== 0) continue;
          const d = (s - first) / thin;
          if (w === 0) steps[d] = stepCol[r];
          const at = target.offset + (flat ? d * nw + w : w * nDraws + d);
          for (let k = 0; k < cols.length; k++) outs[k][at] = cols[k][r];
          if (acc && target.accepted) {
            const bit = acc.offset + r;
            target.accepted[at] = (acc.values[bit >> 3] >> (bit & 7)) & 1;
          }
        }
      }
      row0 += rows;
    }
    return steps;
  }

  private window(opts: Pick<ChainOptions, 'discard' | 'thin' | 'maxSteps'>): { discard: number; thin: number; stored: number } {
    const discard = opts.discard ?? 0;
    const thin = opts.thin ?? 1;
    if (!(Number.isInteger(discard) && discard >= 0)) throw new RangeError(`discard must be a whole number >= 0, got ${discard}`);
    if (!(Number.isInteger(thin) && thin >= 1)) throw new RangeError(`thin must be a whole number >= 1, got ${thin}`);
    const stored = Math.min(this.nSteps, opts.maxSteps ?? Infinity);
    return { discard, thin, stored };
  }

  private columnsOf(opts: ChainOptions): string[] {
    const names = opts.parameters ?? this.header.parameters.map((p) => p.name);
    const known = new Set<string>([...this.header.parameters.map((p) => p.name), ...LOG_COLUMNS]);
    for (const n of names) {
      if (!known.has(n)) {
        throw new InputError(`the chain file has no column "${n}"`, { where: { file: this.path }, expected: [...known].join(', ') });
      }
    }
    return [...names];
  }

  private readLastStep(): number {
    // The step of the last complete step's rows: in the batch holding row nSteps * nWalkers - 1.
    const target = this.nSteps * this.header.nWalkers - 1;
    let row0 = 0;
    for (const m of this.batches) {
      if (target < row0 + m.rows) {
        const bytes = readMessageBytes(this.fd, m.offset, m.end);
        const buf = new Uint8Array(new ArrayBuffer(this.schemaBytes.length + bytes.length));
        buf.set(this.schemaBytes, 0);
        buf.set(bytes, this.schemaBytes.length);
        const steps = decodeBatch(buf).getChild(STEP_COLUMN)?.data[0].values as Int32Array;
        return steps[target - row0];
      }
      row0 += m.rows;
    }
    return 0;
  }
}

/** Whether stored-step indices a..b include one of first, first + thin, first + 2 thin, ... */
function holdsKeptStep(a: number, b: number, first: number, thin: number): boolean {
  const i0 = Math.max(a, first);
  const k = i0 + ((thin - ((i0 - first) % thin)) % thin);
  return k <= b;
}

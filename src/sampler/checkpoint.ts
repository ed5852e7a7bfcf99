/**
 * The checkpoint file: everything needed to continue a run bit for bit. One JSON document, written
 * atomically (temp file, fsync, rename), so a kill at any moment leaves either the previous checkpoint or
 * the new one. Numeric arrays are stored as base64 of their little-endian bytes, which round-trips every
 * double exactly (NaN and infinities included, which JSON numbers cannot hold).
 *
 * Format "coeval-sampler-checkpoint", version 1:
 *   { format, version, written (ISO time), step, thin, elapsedSeconds, meta (the caller's, e.g. seed and
 *     config), ensembles: [ { ensemble, step, nWalkers, ndim, nBlobs, positions: f64, logProb: f64,
 *     blobs: f64, accepted: u8, acceptedCount: f64, rngState: u32 (stdlib MT19937 state array),
 *     moves: { names, weights, proposed, accepted } } ],
 *     autoStop: null | { stride, count, rows: [f64 per ensemble], lastTau: f64 | null } }
 * where f64/u32/u8 mark base64 strings of Float64Array/Uint32Array/Uint8Array bytes.
 */
import { readFileSync } from 'node:fs';
import { endianness } from 'node:os';
import { writeFileAtomic } from '../core/atomicWrite.js';
import { InputError } from '../core/errors.js';
import type { EnsembleSnapshot } from './ensembleSampler.js';
import type { AutoStopState } from './stopRule.js';

export const CHECKPOINT_FORMAT = 'coeval-sampler-checkpoint';
export const CHECKPOINT_VERSION = 1;

export interface Checkpoint {
  step: number;
  thin: number;
  elapsedSeconds: number;
  meta: unknown;
  ensembles: EnsembleSnapshot[];
  autoStop: AutoStopState | null;
}

if (endianness() !== 'LE') {
  // Typed-array bytes are written as they lie in memory; every platform Node supports today is little-endian.
  throw new Error('checkpoints are written in little-endian byte order; this platform is big-endian');
}

const b64 = (a: ArrayBufferView): string => Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');

function fromB64<T>(s: unknown, Ctor: { new (buf: ArrayBuffer): T; BYTES_PER_ELEMENT: number }, what: string, file: string): T {
  if (typeof s !== 'string') throw broken(file, `${what} is missing`);
  const bytes = Buffer.from(s, 'base64');
  if (bytes.byteLength % Ctor.BYTES_PER_ELEMENT !== 0) throw broken(file, `${what} has a length that is not a whole number of values`);
  const copy = new ArrayBuffer(bytes.byteLength);
  new Uint8Array(copy).set(bytes);
  return new Ctor(copy);
}

function broken(file: string, why: string): InputError {
  return new InputError(`the checkpoint is not usable: ${why}`, {
    where: { file },
    hint: 'start the run afresh, or point to the checkpoint of the run you want to resume',
  });
}

export function writeCheckpoint(path: string, cp: Checkpoint): void {
  const doc = {
    format: CHECKPOINT_FORMAT,
    version: CHECKPOINT_VERSION,
    written: new Date().toISOString(),
    step: cp.step,
    thin: cp.thin,
    elapsedSeconds: cp.elapsedSeconds,
    meta: cp.meta ?? null,
    ensembles: cp.ensembles.map((s) => ({
      ensemble: s.ensemble,
      step: s.step,
      nWalkers: s.nWalkers,
      ndim: s.ndim,
      nBlobs: s.nBlobs,
      positions: b64(s.positions),
      logProb: b64(s.logProb),
      blobs: b64(s.blobs),
      accepted: b64(s.accepted),
      acceptedCount: b64(s.acceptedCount),
      rngState: b64(s.rngState),
      moves: s.moves,
    })),
    autoStop: cp.autoStop
      ? { stride: cp.autoStop.stride, count: cp.autoStop.count, rows: cp.autoStop.rows.map(b64), lastTau: cp.autoStop.lastTau ? b64(cp.autoStop.lastTau) : null }
      : null,
  };
  writeFileAtomic(path, `${JSON.stringify(doc)}\n`);
}

export function readCheckpoint(path: string): Checkpoint {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    throw new InputError(`cannot read the checkpoint: ${(err as Error).message}`, { where: { file: path }, hint: 'check the run directory; a run that never reached its first checkpoint cannot be resumed' });
  }
  let doc: Record<string, unknown>;
  try {
    doc = JSON.parse(text) as Record<string, unknown>;
  } catch {
    throw broken(path, 'it is not valid JSON');
  }
  if (doc.format !== CHECKPOINT_FORMAT) throw broken(path, `it is not a sampler checkpoint (format ${JSON.stringify(doc.format)})`);
  if (doc.version !== CHECKPOINT_VERSION) throw broken(path, `it has version ${JSON.stringify(doc.version)}; this coeval reads version ${CHECKPOINT_VERSION}`);
  const ens = doc.ensembles;
  if (!Array.isArray(ens) || ens.length === 0) throw broken(path, 'it holds no ensembles');
  const ensembles = ens.map((raw: Record<string, unknown>, i: number): EnsembleSnapshot => {
    const what = (k: string): string => `ensembles[${i}].${k}`;
    const s: EnsembleSnapshot = {
      ensemble: Number(raw.ensemble),
      step: Number(raw.step),
      nWalkers: Number(raw.nWalkers),
      ndim: Number(raw.ndim),
      nBlobs: Number(raw.nBlobs),
      positions: fromB64(raw.positions, Float64Array, what('positions'), path),
      logProb: fromB64(raw.logProb, Float64Array, what('logProb'), path),
      blobs: fromB64(raw.blobs, Float64Array, what('blobs'), path),
      accepted: fromB64(raw.accepted, Uint8Array, what('accepted'), path),
      acceptedCount: fromB64(raw.acceptedCount, Float64Array, what('acceptedCount'), path),
      rngState: fromB64(raw.rngState, Uint32Array, what('rngState'), path),
      moves: raw.moves as EnsembleSnapshot['moves'],
    };
    if (s.positions.length !== s.nWalkers * s.ndim || s.logProb.length !== s.nWalkers || s.blobs.length !== s.nWalkers * s.nBlobs) {
      throw broken(path, `${what('positions')} and its companions do not match nWalkers ${s.nWalkers} x ndim ${s.ndim}`);
    }
    return s;
  });
  const a = doc.autoStop as Record<string, unknown> | null;
  return {
    step: Number(doc.step),
    thin: Number(doc.thin),
    elapsedSeconds: Number(doc.elapsedSeconds),
    meta: doc.meta,
    ensembles,
    autoStop: a
      ? {
          stride: Number(a.stride),
          count: Number(a.count),
          rows: (a.rows as unknown[]).map((r, e) => fromB64(r, Float64Array, `autoStop.rows[${e}]`, path)),
          lastTau: a.lastTau === null ? null : fromB64(a.lastTau, Float64Array, 'autoStop.lastTau', path),
        }
      : null,
  };
}

/**
 * Writing a large file in pieces without ever showing a torn one: the pieces go to a temporary sibling,
 * which is fsynced and renamed over the target at the end (as core/atomicWrite.ts does for whole buffers,
 * which a catalogue of millions of rows would not fit in as one string).
 */
import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { OutputError } from '../core/errors.js';

export class AtomicFileStream {
  private readonly path: string;
  private readonly tmp: string;
  private fd: number | undefined;

  constructor(path: string) {
    this.path = path;
    this.tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
    try {
      this.fd = openSync(this.tmp, 'w');
    } catch (cause) {
      throw new OutputError(`could not write ${path}`, { where: { file: path }, cause, hint: `check that the folder exists and is writable (${(cause as Error).message})` });
    }
  }

  write(data: string | Uint8Array): void {
    if (this.fd === undefined) throw new Error('write after close');
    const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
    try {
      let off = 0;
      while (off < bytes.length) off += writeSync(this.fd, bytes, off, bytes.length - off);
    } catch (cause) {
      this.abort();
      throw new OutputError(`could not write ${this.path}`, { where: { file: this.path }, cause, hint: (cause as Error).message });
    }
  }

  /** Make the file appear under its name, complete. */
  commit(): void {
    if (this.fd === undefined) throw new Error('commit after close');
    try {
      fsyncSync(this.fd);
      closeSync(this.fd);
      this.fd = undefined;
      renameSync(this.tmp, this.path);
    } catch (cause) {
      this.abort();
      throw new OutputError(`could not write ${this.path}`, { where: { file: this.path }, cause, hint: (cause as Error).message });
    }
  }

  /** Drop the temporary file. */
  abort(): void {
    if (this.fd !== undefined) {
      try {
        closeSync(this.fd);
      } catch {
        // already failing: the original error is the one to report
      }
      this.fd = undefined;
    }
    rmSync(this.tmp, { force: true });
  }
}

import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { dirname, basename, join } from 'node:path';
import { OutputError } from './errors.js';

/**
 * Write a file so that readers see either the old content or the new, never a torn mix: write a
 * temporary sibling, fsync it, then rename over the target (rename is atomic within one filesystem).
 */
export function writeFileAtomic(path: string, data: string | Uint8Array): void {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
  let fd: number | undefined;
  try {
    fd = openSync(tmp, 'w');
    const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
    let off = 0;
    while (off < bytes.length) off += writeSync(fd, bytes, off, bytes.length - off);
    fsyncSync(fd);
    closeSync(fd);
    fd = undefined;
    renameSync(tmp, path);
  } catch (err) {
    if (fd !== undefined) closeSync(fd);
    rmSync(tmp, { force: true });
    throw new OutputError(`could not write ${path}`, {
      where: { file: path },
      cause: err,
      hint: `check that the folder exists and is writable (${(err as Error).message})`,
    });
  }
}

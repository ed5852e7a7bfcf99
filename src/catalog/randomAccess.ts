import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { isGzip, readAllBytes } from './openBytes.js';

/** A file read at arbitrary offsets: positional reads for a plain file, memory for a gzipped one. */
export interface RandomAccess {
  readonly size: number;
  /** Up to `length` bytes from `offset` (fewer at the end of the file). */
  read(offset: number, length: number): Buffer;
  close(): void;
}

export function openRandomAccess(path: string): RandomAccess {
  if (isGzip(path)) {
    const all = readAllBytes(path);
    return { size: all.length, read: (o, l) => all.subarray(o, Math.min(all.length, o + l)), close: () => undefined };
  }
  const fd = openSync(path, 'r');
  const size = fstatSync(fd).size;
  return {
    size,
    read(offset, length) {
      const n = Math.max(0, Math.min(length, size - offset));
      const buf = Buffer.allocUnsafe(n);
      let got = 0;
      while (got < n) {
        const r = readSync(fd, buf, got, n - got, offset + got);
        if (r === 0) break;
        got += r;
      }
      return buf.subarray(0, got);
    },
    close: () => closeSync(fd),
  };
}

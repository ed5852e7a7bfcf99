import { closeSync, createReadStream, openSync, readFileSync, readSync } from 'node:fs';
import { createGunzip, gunzipSync } from 'node:zlib';
import { InputError } from '../core/errors.js';

/** Archives often deliver catalogues gzipped (`.csv.gz`, `.vot.gz`, `.fits.gz`); they are read as they come. */
export function isGzip(path: string): boolean {
  const head = readHead(path, 2);
  return head.length === 2 && head[0] === 0x1f && head[1] === 0x8b;
}

/** The first `n` bytes of the file as stored (not decompressed). */
export function readHead(path: string, n: number): Buffer {
  const fd = openSync(path, 'r');
  try {
    const buf = Buffer.alloc(n);
    const got = readSync(fd, buf, 0, n, 0);
    return buf.subarray(0, got);
  } finally {
    closeSync(fd);
  }
}

/** The first bytes of the content, decompressing a gzipped file, for format detection. */
export function sniffContent(path: string, n = 4096): Buffer {
  if (!isGzip(path)) return readHead(path, n);
  const gz = readHead(path, 1 << 16);
  try {
    return gunzipSync(gz, { finishFlush: 2 /* Z_SYNC_FLUSH: accept a truncated stream */ }).subarray(0, n);
  } catch {
    return Buffer.alloc(0);
  }
}

/** The file's content as a stream of chunks, decompressed when gzipped. */
export function openBytes(path: string, chunkBytes = 1 << 20): AsyncIterable<Buffer> {
  const raw = createReadStream(path, { highWaterMark: chunkBytes });
  if (!isGzip(path)) return raw;
  const gunzip = createGunzip({ chunkSize: chunkBytes });
  raw.on('error', (e) => gunzip.destroy(e));
  return wrapGzipErrors(raw.pipe(gunzip), path);
}

/** The whole content in memory, decompressed when gzipped (for formats that need random access). */
export function readAllBytes(path: string): Buffer {
  const buf = readFileSync(path);
  if (buf.length < 2 || buf[0] !== 0x1f || buf[1] !== 0x8b) return buf;
  try {
    return gunzipSync(buf);
  } catch (e) {
    throw gzipError(path, e);
  }
}

async function* wrapGzipErrors(stream: AsyncIterable<Buffer>, path: string): AsyncIterable<Buffer> {
  try {
    for await (const chunk of stream) yield chunk;
  } catch (e) {
    throw gzipError(path, e);
  }
}

function gzipError(path: string, e: unknown): InputError {
  return new InputError('the gzip-compressed file could not be decompressed (it may be truncated or corrupt)', {
    where: { file: path },
    found: (e as Error).message,
    hint: 'download the file again, or check it with `gzip -t`',
  });
}

/**
 * Catalogue reading: time and peak RSS to read a 10^6-row CSV and a 10^6-row FITS table into a Catalog
 * (targets from issue 2: <= 5 s and <= 400 MB each). Each read runs in its own child process, so its peak
 * RSS is its own (it includes Node's own ~40-50 MB). References measured in the same run: reading the
 * same file's bytes with a bare fs.readFileSync, and reading a 10^5-row file (how the time scales).
 * The files are generated into a temporary folder: 10 columns shaped like an archive result (int64 id,
 * three bands with errors, parallax and error, membership), with invented numbers.
 */
import { spawnSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchGroup } from './harness.js';

const root = resolve(fileURLToPath(import.meta.url), '../../..');
const reader = resolve(root, 'dist/bench/catalogRead.js');
const COLUMNS = ['source_id', 'Vmag', 'e_Vmag', 'Imag', 'e_Imag', 'Bmag', 'e_Bmag', 'parallax', 'parallax_error', 'pmem'];

const CONFIG = (file: string): string => `[catalogue]
path = "${file}"
id = "source_id"
membership = "pmem"
parallax = "parallax"
parallax_error = "parallax_error"
[[catalogue.cuts]]
column = "pmem"
min = 0.1
[photometry.B]
mag = "Bmag"
err = "e_Bmag"
[photometry.V]
mag = "Vmag"
err = "e_Vmag"
[photometry.I]
mag = "Imag"
err = "e_Imag"
`;

/** Row i's values: deterministic, cheap, and not all alike (so parsing is not trivially fast). */
function row(i: number): [bigint, number[]] {
  const x = ((i * 2654435761) % 4294967296) / 4294967296;
  const v = 14 + 9 * x;
  return [4611686018427387904n + BigInt(i) * 7919n, [v, 0.004 + 0.05 * x * x, v - 0.9 - 0.3 * x, 0.005 + 0.04 * x, v + 0.7 + 0.4 * x, 0.006 + 0.06 * x, 0.4 + 0.2 * (x - 0.5), 0.02 + 0.1 * x, x]];
}

function writeCsv(path: string, n: number): void {
  const fd = openSync(path, 'w');
  writeSync(fd, `${COLUMNS.join(',')}\n`);
  let chunk: string[] = [];
  for (let i = 0; i < n; i++) {
    const [id, vals] = row(i);
    chunk.push(`${id},${vals.map((v) => v.toFixed(5)).join(',')}`);
    if (chunk.length === 10000) {
      writeSync(fd, `${chunk.join('\n')}\n`);
      chunk = [];
    }
  }
  if (chunk.length) writeSync(fd, `${chunk.join('\n')}\n`);
  closeSync(fd);
}

function card(text: string): string {
  return text.padEnd(80, ' ').slice(0, 80);
}

/** A FITS file with an empty primary HDU and one BINTABLE (K id, nine D columns), FITS Standard 4.0. */
function writeFits(path: string, n: number): void {
  const rowBytes = 8 * COLUMNS.length;
  const header = (cards: string[]): string => {
    const all = [...cards, card('END')].join('');
    return all.padEnd(Math.ceil(all.length / 2880) * 2880, ' ');
  };
  const val = (k: string, v: string): string => card(`${k.padEnd(8)}= ${v.padStart(20)}`);
  const str = (k: string, v: string): string => card(`${k.padEnd(8)}= '${v.padEnd(8)}'`);
  const primary = header([val('SIMPLE', 'T'), val('BITPIX', '8'), val('NAXIS', '0'), val('EXTEND', 'T')]);
  const cols = COLUMNS.flatMap((c, k) => [str(`TTYPE${k + 1}`, c), str(`TFORM${k + 1}`, k === 0 ? 'K' : 'D')]);
  const ext = header([str('XTENSION', 'BINTABLE'), val('BITPIX', '8'), val('NAXIS', '2'), val('NAXIS1', String(rowBytes)), val('NAXIS2', String(n)), val('PCOUNT', '0'), val('GCOUNT', '1'), val('TFIELDS', String(COLUMNS.length)), ...cols]);
  const fd = openSync(path, 'w');
  writeSync(fd, primary + ext, null, 'latin1');
  const per = 10000;
  const buf = Buffer.alloc(per * rowBytes);
  for (let i0 = 0; i0 < n; i0 += per) {
    const m = Math.min(per, n - i0);
    for (let k = 0; k < m; k++) {
      const [id, vals] = row(i0 + k);
      const o = k * rowBytes;
      buf.writeBigInt64BE(id, o);
      vals.forEach((v, j) => buf.writeDoubleBE(v, o + 8 + 8 * j));
    }
    writeSync(fd, buf, 0, m * rowBytes);
  }
  const size = 5760 + n * rowBytes; // after the two headers (one block each)
  const pad = (2880 - (size % 2880)) % 2880;
  if (pad) writeSync(fd, Buffer.alloc(pad));
  closeSync(fd);
}

interface Measure {
  ms: number;
  /** User + system CPU time of the read: less sensitive than wall time to other jobs on the machine. */
  cpuMs: number;
  maxRssMB: number;
  nStars: number;
}

function measure(mode: 'catalog' | 'bytes', path: string): Measure {
  const r = spawnSync(process.execPath, [reader, mode, path], { encoding: 'utf8', maxBuffer: 1 << 20 });
  if (r.status !== 0) throw new Error(`reading ${path} failed: ${r.stderr}`);
  return JSON.parse(r.stdout.trim()) as Measure;
}

export const catalogBench: BenchGroup = {
  name: 'catalog',
  describe: 'read time and peak RSS for 10^6-row CSV and FITS catalogues (each read in its own process)',
  async run(ctx) {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-bench-'));
    try {
      for (const kind of ['csv', 'fits'] as const) {
        const files: Record<number, string> = {};
        for (const n of [100_000, 1_000_000]) {
          const file = join(dir, `stars_${n}.${kind}`);
          if (kind === 'csv') writeCsv(file, n);
          else writeFits(file, n);
          writeFileSync(join(dir, `${kind}_${n}.toml`), CONFIG(file));
          files[n] = file;
        }
        const mb = statSync(files[1_000_000]).size / 2 ** 20;
        ctx.log(`${kind.toUpperCase()}: 10^6 rows x ${COLUMNS.length} columns, ${mb.toFixed(0)} MB`);
        const small = measure('catalog', join(dir, `${kind}_100000.toml`));
        const bytes = measure('bytes', files[1_000_000]);
        const big = measure('catalog', join(dir, `${kind}_1000000.toml`));
        if (big.nStars < 800_000) throw new Error(`unexpected star count ${big.nStars}`);
        ctx.record({ name: `${kind} 10^6 rows: read time`, value: big.ms, unit: 'ms', target: { op: '<=', value: 5000 }, reference: { name: 'bare fs.readFileSync of the same file', value: bytes.ms } });
        ctx.record({ name: `${kind} 10^6 rows: CPU time of the read`, value: big.cpuMs, unit: 'ms', reference: { name: 'bare fs.readFileSync of the same file', value: bytes.cpuMs }, note: 'user + system, all threads' });
        ctx.record({ name: `${kind} 10^6 rows: peak RSS`, value: big.maxRssMB, unit: 'MB', target: { op: '<=', value: 400 }, reference: { name: 'bare fs.readFileSync of the same file', value: bytes.maxRssMB } });
        ctx.record({ name: `${kind} 10^5 rows: read time`, value: small.ms, unit: 'ms', reference: { name: '10^6 rows / 10', value: big.ms / 10 } });
        ctx.record({ name: `${kind} 10^5 rows: peak RSS`, value: small.maxRssMB, unit: 'MB' });
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};

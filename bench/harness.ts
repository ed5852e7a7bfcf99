/**
 * The benchmark harness. A benchmark group measures its figures and records each one with its unit, its
 * target (when the issue sets one) and, where there is one, a reference measured in the same run (a naive
 * implementation, a baseline, or the same work with other settings), so that numbers from one machine can be
 * read against each other rather than against a remembered figure.
 */
import { mkdirSync, readFileSync, existsSync } from 'node:fs';
import { dirname } from 'node:path';
import { writeFileAtomic } from '../src/core/atomicWrite.js';

export interface Figure {
  group: string;
  name: string;
  value: number;
  unit: string;
  /** The target and which way is good: `<=` for times and memory, `>=` for speed-ups. */
  target?: { op: '<=' | '>='; value: number };
  /** The same quantity for a reference measured in this run. */
  reference?: { name: string; value: number };
  note?: string;
}

export interface BenchContext {
  record(f: Omit<Figure, 'group'>): void;
  log(text: string): void;
}

export interface BenchGroup {
  name: string;
  describe: string;
  run(ctx: BenchContext): Promise<void>;
}

export function meets(f: Figure): boolean | undefined {
  if (!f.target) return undefined;
  return f.target.op === '<=' ? f.value <= f.target.value : f.value >= f.target.value;
}

export function formatFigure(f: Figure): string {
  const v = formatNumber(f.value);
  let s = `  ${f.name}: ${v} ${f.unit}`;
  if (f.target) s += `   target ${f.target.op} ${formatNumber(f.target.value)} ${f.unit}: ${meets(f) ? 'met' : 'NOT MET'}`;
  if (f.reference) s += `   (reference ${f.reference.name}: ${formatNumber(f.reference.value)} ${f.unit})`;
  if (f.note) s += `   [${f.note}]`;
  return s;
}

function formatNumber(x: number): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e5 || a < 1e-3) return x.toExponential(3);
  return Number(x.toPrecision(4)).toString();
}

/** Merge this run's figures into the results file, replacing earlier figures of the same groups. */
export function saveResults(path: string, figures: Figure[], groupsRun: string[]): void {
  let previous: Figure[] = [];
  if (existsSync(path)) {
    try {
      previous = (JSON.parse(readFileSync(path, 'utf8')) as { figures: Figure[] }).figures ?? [];
    } catch {
      previous = [];
    }
  }
  const kept = previous.filter((f) => !groupsRun.includes(f.group));
  mkdirSync(dirname(path), { recursive: true });
  const doc = {
    machine: { node: process.version, platform: process.platform, arch: process.arch, cpus: (globalThis as { navigator?: { hardwareConcurrency?: number } }).navigator?.hardwareConcurrency },
    updated: new Date().toISOString(),
    figures: [...kept, ...figures],
  };
  writeFileAtomic(path, `${JSON.stringify(doc, null, 2)}\n`);
}

/** Median of repeated timings, in milliseconds. */
export function medianMs(samples: number[]): number {
  const s = [...samples].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Time `fn` n times (after `warmup` untimed calls); returns each duration in ms. */
export function timeRepeated(fn: () => void, n: number, warmup = 3): number[] {
  for (let i = 0; i < warmup; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = process.hrtime.bigint();
    fn();
    out.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  return out;
}

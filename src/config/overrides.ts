import { parse as parseToml } from 'smol-toml';
import { UsageError } from '../core/errors.js';

/**
 * Apply `--set section.key=value` overrides to a raw config object, before validation, so that they go
 * through the same checks as the file. The value is read as a TOML value (`8`, `true`, `[1, 2]`,
 * `"text"`); anything that is not valid TOML is taken as a plain string, so `--set catalogue.path=a.csv`
 * needs no quotes.
 */
export function applyOverrides(raw: Record<string, unknown>, sets: readonly string[]): Record<string, unknown> {
  for (const s of sets) {
    const eq = s.indexOf('=');
    if (eq <= 0) {
      throw new UsageError(`--set needs the form section.key=value`, {
        found: s,
        expected: 'e.g. --set sampler.walkers=64 or --set catalogue.path=stars.csv',
      });
    }
    const path = s.slice(0, eq).trim().split('.');
    if (path.some((p) => p === '')) {
      throw new UsageError(`--set has an empty key segment`, { found: s, expected: 'a dotted key such as output.dir' });
    }
    setPath(raw, path, parseValue(s.slice(eq + 1).trim()));
  }
  return raw;
}

function parseValue(text: string): unknown {
  try {
    return (parseToml(`v = ${text}`) as { v: unknown }).v;
  } catch {
    return text;
  }
}

function setPath(obj: Record<string, unknown>, path: string[], value: unknown): void {
  let node: Record<string, unknown> = obj;
  for (let i = 0; i < path.length - 1; i++) {
    const next = node[path[i]];
    if (typeof next !== 'object' || next === null || Array.isArray(next)) {
      node[path[i]] = {};
    }
    node = node[path[i]] as Record<string, unknown>;
  }
  node[path[path.length - 1]] = value;
}

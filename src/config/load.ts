import { basename, dirname, extname, resolve } from 'node:path';
import { parse as parseToml, TomlError } from 'smol-toml';
import { z } from 'zod';
import { ConfigError, showValue } from '../core/errors.js';
import { readTextFile } from '../core/files.js';
import { didYouMean } from '../core/suggest.js';
import { locateKey } from './locateKey.js';
import { applyOverrides } from './overrides.js';
import { configSchema, type CoevalConfig } from './schema.js';
import { keysAt } from './schemaShape.js';
import { gridSection, type GridConfig } from './sections/grid.js';
import { simulationConfigSchema, type SimulationConfig } from './sections/simulate.js';

/** A validated config, with where it came from, so relative paths can be resolved. */
export interface LoadedConfig {
  config: CoevalConfig;
  /** The config file as given (undefined when built from text in memory). */
  file?: string;
  /** Folder that relative paths in the config are resolved against. */
  baseDir: string;
  /** The `--set` overrides that were applied, in order. */
  overrides: string[];
}

export interface LoadOptions {
  /** `--set section.key=value` overrides, applied after the file. */
  sets?: readonly string[];
}

/** Parse TOML text (a leading byte-order mark is dropped); a syntax error becomes a located ConfigError. */
function parseTomlLocated(text: string, file: string | undefined, what: string): Record<string, unknown> {
  try {
    return parseToml(text.replace(/^\uFEFF/, '')) as Record<string, unknown>;
  } catch (err) {
    if (err instanceof TomlError) {
      throw new ConfigError(`${what} is not valid TOML: ${err.message.split('\n')[0]}`, {
        where: { file, line: err.line, column: err.column },
        expected: 'TOML (https://toml.io): [section] headers and key = value lines',
        hint: 'fix the syntax at the position shown',
      });
    }
    throw err;
  }
}

/** Read, layer and validate a config file: defaults, then the file, then `--set` overrides. */
export function loadConfig(file: string, options: LoadOptions = {}): LoadedConfig {
  const text = readTextFile(file, 'config file');
  return parseConfigText(text, { file, sets: options.sets });
}

export function parseConfigText(text: string, opts: { file?: string; baseDir?: string; sets?: readonly string[] } = {}): LoadedConfig {
  const file = opts.file;
  const raw = parseTomlLocated(text, file, 'the config');
  const sets = [...(opts.sets ?? [])];
  applyOverrides(raw, sets);
  const config = validate(raw, text, file);
  const baseDir = opts.baseDir ?? (file ? dirname(resolve(file)) : process.cwd());
  return { config, file, baseDir, overrides: sets };
}

/**
 * Read the `[grid]` table of a TOML file: a column-map file for `coeval grid import`, or a whole config
 * (its other sections are ignored). Errors are located as in configs.
 */
export function loadGridMap(file: string): { grid: GridConfig; baseDir: string } {
  const text = readTextFile(file, 'grid column-map file');
  const raw = parseTomlLocated(text, file, 'the column map');
  const { grid } = validate(raw, text, file, z.looseObject({ grid: gridSection }));
  return { grid, baseDir: dirname(resolve(file)) };
}

/** A simulation config as read from a file or text: `[simulate]`, `[likelihood]`, `[model]`. */
export interface LoadedSimulationConfig {
  config: SimulationConfig;
  file?: string;
  baseDir: string;
  overrides: string[];
}

/**
 * Read a simulation config (`coeval simulate`): defaults, the file (when given), then `--set` overrides,
 * validated with located errors as fit configs are. Without a file, `text` may be empty and the overrides
 * supply everything.
 */
export function parseSimulationConfigText(text: string, opts: { file?: string; baseDir?: string; sets?: readonly string[] } = {}): LoadedSimulationConfig {
  const file = opts.file;
  const raw = parseTomlLocated(text, file, 'the simulation config');
  const sets = [...(opts.sets ?? [])];
  applyOverrides(raw, sets);
  const config = validate(raw, text, file, simulationConfigSchema);
  const baseDir = opts.baseDir ?? (file ? dirname(resolve(file)) : process.cwd());
  return { config, file, baseDir, overrides: sets };
}

export function loadSimulationConfig(file: string, options: LoadOptions = {}): LoadedSimulationConfig {
  return parseSimulationConfigText(readTextFile(file, 'simulation config file'), { file, sets: options.sets });
}

/** Resolve a path written in the config against the config file's folder. */
export function resolveConfigPath(loaded: LoadedConfig, p: string): string {
  return resolve(loaded.baseDir, p);
}

/** The run directory: `output.dir`, or runs/<config name>. */
export function runDirectory(loaded: LoadedConfig): string {
  const dir = loaded.config.output.dir;
  if (dir !== undefined) return resolveConfigPath(loaded, dir);
  const name = loaded.file ? basename(loaded.file, extname(loaded.file)) : 'run';
  return resolve(loaded.baseDir, 'runs', name);
}

function validate<T = CoevalConfig>(raw: Record<string, unknown>, text: string, file: string | undefined, schema: z.ZodType<T> = configSchema as unknown as z.ZodType<T>): T {
  const result = schema.safeParse(raw, { reportInput: true });
  if (result.success) return result.data;
  const problems = result.error.issues.map((issue) => describeIssue(issue, raw, schema));
  const first = problems[0];
  const loc = locateKey(text, first.path);
  const more = problems.slice(1).map((p) => `\n  also: key ${p.key || '(top level)'}: ${p.message}`).join('');
  throw new ConfigError(`${first.message}${more}`, {
    where: { file, line: loc?.line, column: loc?.column, key: first.key || '(top level)' },
    found: first.found,
    expected: first.expected,
    hint: first.hint,
  });
}

interface Problem {
  path: (string | number)[];
  key: string;
  message: string;
  found?: unknown;
  expected?: string;
  hint?: string;
}

function describeIssue(issue: z.core.$ZodIssue, raw: unknown, schema: z.ZodType): Problem {
  const path = issue.path.map((p) => (typeof p === 'number' ? p : String(p)));
  const key = path.join('.');
  const found = 'input' in issue ? issue.input : valueAt(raw, path);
  switch (issue.code) {
    case 'unrecognized_keys': {
      const valid = keysAt(schema, issue.path);
      const unknown = issue.keys[0];
      const keyPath = [...path, unknown];
      return {
        path: keyPath,
        key: keyPath.join('.'),
        message: `unknown key "${unknown}"${issue.keys.length > 1 ? ` (and ${issue.keys.slice(1).map((k) => `"${k}"`).join(', ')})` : ''}`,
        expected: `one of: ${valid.join(', ')}`,
        hint: didYouMean(unknown, valid) ?? 'remove the key, or check its spelling and section',
      };
    }
    case 'invalid_type':
      if (found === undefined) {
        return { path, key, message: `missing required key`, expected: `a ${issue.expected}`, hint: `add ${path[path.length - 1]} = ... to the config` };
      }
      return { path, key, message: `wrong type`, found, expected: `a ${issue.expected}, not a ${typeName(found)}` };
    case 'invalid_value':
      return { path, key, message: `value not allowed`, found, expected: `one of ${issue.values.map((v) => showValue(v)).join(', ')}` };
    case 'too_small':
      return { path, key, message: `value too small`, found, expected: `${issue.inclusive === false ? '>' : '>='} ${issue.minimum}${issue.origin === 'string' ? ' characters' : issue.origin === 'array' ? ' entries' : ''}` };
    case 'too_big':
      return { path, key, message: `value too large`, found, expected: `${issue.inclusive === false ? '<' : '<='} ${issue.maximum}${issue.origin === 'string' ? ' characters' : issue.origin === 'array' ? ' entries' : ''}` };
    case 'invalid_union':
      return { path, key, message: `this table matches none of its allowed forms`, found, expected: unionExpectation(path) };
    default:
      return { path, key, message: issue.message, found };
  }
}

function unionExpectation(path: (string | number)[]): string {
  if (path[0] === 'photometry') return 'either { mag, err } columns, or { flux, flux_err, zero_point }';
  return 'one of the forms described in the documentation of this key';
}

function typeName(v: unknown): string {
  if (Array.isArray(v)) return 'array';
  if (v === null) return 'null';
  if (typeof v === 'object') return 'table';
  return typeof v;
}

function valueAt(obj: unknown, path: (string | number)[]): unknown {
  let node = obj;
  for (const p of path) {
    if (typeof node !== 'object' || node === null) return undefined;
    node = (node as Record<string | number, unknown>)[p];
  }
  return node;
}

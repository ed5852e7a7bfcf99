/**
 * The error hierarchy. Every failure a user can cause maps to one kind, and each kind to one exit code,
 * so that batch scripts can tell a bad config from a bad catalogue from a sampler that could not start.
 * A message always says where (file:line:column, FITS HDU/row/column, or a config key), what was expected,
 * and what to do about it.
 */

export type ErrorKind = 'usage' | 'config' | 'input' | 'model' | 'sampling' | 'output';

/** One exit code per kind. 1 is left for internal errors (bugs), 130 for an interrupted run. */
export const EXIT_CODES: Readonly<Record<ErrorKind | 'internal' | 'interrupted', number>> = {
  internal: 1,
  usage: 2,
  config: 3,
  input: 4,
  model: 5,
  sampling: 6,
  output: 7,
  interrupted: 130,
};

/** Where a problem is. Fill what is known; `formatLocation` prints the most specific form. */
export interface Location {
  file?: string;
  line?: number;
  column?: number;
  /** FITS header-data unit (0 = primary), or VOTable table index. */
  hdu?: number;
  /** Data row, 1-based as a user counts them. */
  row?: number;
  /** Column name in a table. */
  field?: string;
  /** Dotted config key path, e.g. `catalogue.columns.parallax`. */
  key?: string;
}

export function formatLocation(loc: Location | undefined): string {
  if (!loc) return '';
  const parts: string[] = [];
  if (loc.file !== undefined) {
    let s = loc.file;
    if (loc.line !== undefined) {
      s += `:${loc.line}`;
      if (loc.column !== undefined) s += `:${loc.column}`;
    }
    parts.push(s);
  }
  if (loc.hdu !== undefined) parts.push(`HDU ${loc.hdu}`);
  if (loc.row !== undefined) parts.push(`row ${loc.row}`);
  if (loc.field !== undefined) parts.push(`column "${loc.field}"`);
  if (loc.key !== undefined) parts.push(`key ${loc.key}`);
  return parts.join(', ');
}

export interface ErrorDetails {
  where?: Location;
  /** What was found, shown verbatim (quoted when it is a string). */
  found?: unknown;
  /** What was expected, in words. */
  expected?: string;
  /** What the user can do about it. */
  hint?: string;
  cause?: unknown;
}

export class CoevalError extends Error {
  readonly kind: ErrorKind;
  readonly where?: Location;
  readonly found?: unknown;
  readonly expected?: string;
  readonly hint?: string;

  constructor(kind: ErrorKind, message: string, details: ErrorDetails = {}) {
    super(message, details.cause === undefined ? undefined : { cause: details.cause });
    this.kind = kind;
    this.where = details.where;
    this.found = details.found;
    this.expected = details.expected;
    this.hint = details.hint;
  }

  get exitCode(): number {
    return EXIT_CODES[this.kind];
  }

  /** The text shown to users: location, problem, expectation, hint. No stack. */
  describe(): string {
    const loc = formatLocation(this.where);
    let text = `${this.kind} error${loc ? ` at ${loc}` : ''}: ${this.message}`;
    if (this.found !== undefined) text += `\n  found: ${showValue(this.found)}`;
    if (this.expected !== undefined) text += `\n  expected: ${this.expected}`;
    if (this.hint !== undefined) text += `\n  what to do: ${this.hint}`;
    return text;
  }
}

export class UsageError extends CoevalError {
  constructor(message: string, details?: ErrorDetails) {
    super('usage', message, details);
  }
}
export class ConfigError extends CoevalError {
  constructor(message: string, details?: ErrorDetails) {
    super('config', message, details);
  }
}
export class InputError extends CoevalError {
  constructor(message: string, details?: ErrorDetails) {
    super('input', message, details);
  }
}
export class ModelError extends CoevalError {
  constructor(message: string, details?: ErrorDetails) {
    super('model', message, details);
  }
}
export class SamplingError extends CoevalError {
  constructor(message: string, details?: ErrorDetails) {
    super('sampling', message, details);
  }
}
export class OutputError extends CoevalError {
  constructor(message: string, details?: ErrorDetails) {
    super('output', message, details);
  }
}

/** Raised when a run is stopped by SIGINT/SIGTERM after a clean checkpoint. */
export class InterruptedError extends Error {
  readonly exitCode = EXIT_CODES.interrupted;
}

export function showValue(v: unknown): string {
  if (typeof v === 'string') return JSON.stringify(v);
  if (typeof v === 'number' || typeof v === 'boolean' || v === null || v === undefined) return String(v);
  if (typeof v === 'bigint') return `${v}n`;
  try {
    const s = JSON.stringify(v);
    return s.length > 200 ? `${s.slice(0, 197)}...` : s;
  } catch {
    return String(v);
  }
}

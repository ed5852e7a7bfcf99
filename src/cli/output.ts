/**
 * Where text goes: results to stdout, progress and messages to stderr (so that `coeval ... > out.json`
 * captures only results). `--quiet` silences messages, never results or errors. Colour only on a TTY
 * and only when NO_COLOR is unset (https://no-color.org).
 */
export interface Output {
  readonly quiet: boolean;
  readonly json: boolean;
  /** A result: stdout. */
  result(text: string): void;
  /** Progress or information: stderr, unless quiet. */
  info(text: string): void;
  /** A warning: stderr, even when quiet. */
  warn(text: string): void;
  /** Emphasis for stderr text, when colour is allowed. */
  bold(text: string): string;
  /** Whether stderr is an interactive terminal (progress bars go there). */
  readonly interactive: boolean;
}

export interface OutputOptions {
  quiet?: boolean;
  json?: boolean;
  stdout?: NodeJS.WritableStream & { isTTY?: boolean };
  stderr?: NodeJS.WritableStream & { isTTY?: boolean };
  env?: NodeJS.ProcessEnv;
}

export function createOutput(opts: OutputOptions = {}): Output {
  const stdout = opts.stdout ?? process.stdout;
  const stderr = opts.stderr ?? process.stderr;
  const env = opts.env ?? process.env;
  const colour = Boolean(stderr.isTTY) && Boolean(stdout.isTTY) && env.NO_COLOR === undefined;
  const quiet = opts.quiet ?? false;
  return {
    quiet,
    json: opts.json ?? false,
    interactive: Boolean(stderr.isTTY),
    result: (t) => void stdout.write(t.endsWith('\n') ? t : `${t}\n`),
    info: (t) => {
      if (!quiet) stderr.write(t.endsWith('\n') ? t : `${t}\n`);
    },
    warn: (t) => void stderr.write(`${colour ? '\x1b[33mwarning:\x1b[0m' : 'warning:'} ${t}\n`),
    bold: (t) => (colour ? `\x1b[1m${t}\x1b[0m` : t),
  };
}

/** Run the real CLI (bin/coeval.js, built dist/) as a child process, as a user would. */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { expect } from 'vitest';

export const REPO_ROOT = resolve(import.meta.dirname, '../..');

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], cwd = REPO_ROOT): CliResult {
  const r = spawnSync(process.execPath, [resolve(REPO_ROOT, 'bin/coeval.js'), ...args], {
    cwd,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/**
 * A user error: the expected exit code, a message on stderr matching every pattern (location first), and
 * no stack trace (no "    at " frames) since --debug was not given.
 */
export function expectUserError(r: CliResult, exitCode: number, ...patterns: RegExp[]): void {
  const shown = `exit ${r.status}\nstderr:\n${r.stderr}\nstdout:\n${r.stdout}`;
  expect(r.status, shown).toBe(exitCode);
  for (const p of patterns) expect(r.stderr, shown).toMatch(p);
  expect(r.stderr, shown).not.toMatch(/^\s+at .+\(.*:\d+:\d+\)$/m);
  expect(r.stderr, shown).not.toMatch(/internal error/);
}

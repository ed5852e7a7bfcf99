import type { Argv } from 'yargs';
import type { CommandContext } from '../context.js';

/**
 * One CLI command. Modules that define commands must stay light to import: `run` loads the library
 * code it needs with a dynamic import, so that `coeval --help` does not pay for it.
 */
export interface CommandSpec {
  command: string | string[];
  describe: string;
  builder: (y: Argv) => Argv;
  /** Returns the exit code. Throw a CoevalError for a failure the user can fix. */
  run: (args: Record<string, unknown>, ctx: CommandContext) => Promise<number>;
}

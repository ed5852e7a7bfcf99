import type { Output } from './output.js';

/** Options every command accepts. */
export interface GlobalArgs {
  quiet: boolean;
  json: boolean;
  debug: boolean;
  set: string[];
}

/** What a command handler receives besides its own arguments. */
export interface CommandContext {
  out: Output;
  args: GlobalArgs;
}

import { checkCommand } from './check.js';
import { configCommand } from './config.js';
import { demoCommand } from './demo.js';
import type { CommandSpec } from './types.js';

/** Every command, in the order `coeval --help` lists them. */
export const COMMANDS: readonly CommandSpec[] = [demoCommand, checkCommand, configCommand];

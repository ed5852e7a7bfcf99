import { checkCommand } from './check.js';
import { configCommand } from './config.js';
import { demoCommand } from './demo.js';
import { diagnoseCommand } from './diagnose.js';
import { fitCommand } from './fit.js';
import { gridCommand } from './grid.js';
import { isochroneCommand } from './isochrone.js';
import { plotCommand } from './plot.js';
import { reportCommand } from './report.js';
import { simulateCommand } from './simulate.js';
import { summaryCommand } from './summary.js';
import { testbedCommand } from './testbed.js';
import type { CommandSpec } from './types.js';

/** Every command, in the order `coeval --help` lists them. */
export const COMMANDS: readonly CommandSpec[] = [demoCommand, checkCommand, fitCommand, isochroneCommand, configCommand, diagnoseCommand, summaryCommand, plotCommand, reportCommand, testbedCommand, gridCommand, simulateCommand];

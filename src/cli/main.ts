/**
 * The command-line entry. It only parses arguments and dispatches; every command's work is done by the
 * library (src/index.ts), loaded lazily so that `coeval --help` starts fast.
 */
import yargs, { type Argv } from 'yargs';
import { CoevalError, EXIT_CODES, InterruptedError, UsageError } from '../core/errors.js';
import { COMMANDS } from './commands/index.js';
import type { CommandContext, GlobalArgs } from './context.js';
import { createOutput } from './output.js';

export async function main(argv: readonly string[]): Promise<number> {
  // A reader that closes early (`coeval ... | head`) is not an error: stop writing quietly.
  process.stdout.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EPIPE') process.exit(0);
    throw err;
  });
  const debug = argv.includes('--debug');
  const early = createOutput({ quiet: argv.includes('--quiet') || argv.includes('-q'), json: argv.includes('--json') });
  let exitCode = 0;
  let pending: Promise<number> | undefined;

  const parser = yargs([...argv])
    .scriptName('coeval')
    .usage('$0 <command> [options]\n\nBayesian ages, distances, reddening and metallicities of star clusters from their photometry.')
    .option('quiet', { alias: 'q', type: 'boolean', default: false, describe: 'print no progress or messages (results and errors still print)' })
    .option('json', { type: 'boolean', default: false, describe: 'print results as JSON' })
    .option('debug', { type: 'boolean', default: false, describe: 'show stack traces for errors' })
    .option('set', { type: 'string', array: true, default: [] as string[], describe: 'override a config key: --set section.key=value (repeatable)' })
    .strict()
    .demandCommand(1, 'name a command; `coeval --help` lists them')
    .recommendCommands()
    .help()
    .alias('help', 'h')
    .version()
    .wrap(Math.min(100, process.stdout.columns ?? 100))
    .exitProcess(false)
    .fail((msg, err) => {
      if (err) throw err;
      throw new UsageError(msg ?? 'bad command line', { hint: 'run `coeval --help`, or `coeval <command> --help`' });
    });

  for (const cmd of COMMANDS) {
    parser.command(
      cmd.command,
      cmd.describe,
      (y: Argv) => cmd.builder(y),
      (args: Record<string, unknown>) => {
        const g = args as unknown as GlobalArgs;
        const ctx: CommandContext = { out: createOutput({ quiet: g.quiet, json: g.json }), args: g };
        pending = cmd.run(args, ctx);
      },
    );
  }

  try {
    await parser.parseAsync();
    if (pending) exitCode = await pending;
  } catch (err) {
    exitCode = report(err, early, debug);
  }
  return exitCode;
}

function report(err: unknown, out: ReturnType<typeof createOutput>, debug: boolean): number {
  if (err instanceof CoevalError) {
    process.stderr.write(`coeval: ${err.describe()}\n`);
    if (debug && err.stack) process.stderr.write(`${err.stack}\n`);
    return err.exitCode;
  }
  if (err instanceof InterruptedError) {
    out.info(err.message);
    return err.exitCode;
  }
  const e = err instanceof Error ? err : new Error(String(err));
  process.stderr.write(`coeval: internal error: ${e.message}\n`);
  if (debug) process.stderr.write(`${e.stack ?? ''}\n`);
  else process.stderr.write('  this is a bug in coeval; rerun with --debug and report the stack trace\n');
  return EXIT_CODES.internal;
}

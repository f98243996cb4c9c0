/**
 * The command line: a thin layer that parses arguments, calls one core entry
 * point per command, hands results to writers and maps errors to exit codes
 * (0 success, 1 failure while working, 2 bad input). One line per problem; a
 * stack trace only with --verbose.
 */
import { Command, CommanderError } from 'commander';
import { registerCheck } from './commands/check.js';
import { registerDemo } from './commands/demo.js';
import { registerWirings } from './commands/wirings.js';
import { registerAnalyze } from './commands/analyze.js';
import { registerNetlist } from './commands/netlist.js';
import { registerRender } from './commands/render.js';
import { registerShortlist } from './commands/shortlist.js';
import { registerCompare } from './commands/compare.js';
import type { Io } from './io.js';
import { COILBENCH_VERSION } from './version.js';
import { EXIT_BAD_INPUT, EXIT_OK, describeCommanderMessage, describeError } from './describe-error.js';

export { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_INTERRUPTED, EXIT_OK } from './describe-error.js';

const VERSION = COILBENCH_VERSION;

function buildProgram(io: Io): Command {
  const program = new Command('coilbench');
  program
    .description('Hear every way a guitar\'s pickup coils can be wired, before soldering anything.')
    .version(VERSION)
    .option('--verbose', 'show stack traces on errors')
    .exitOverride()
    .showHelpAfterError('(run coilbench --help for usage)')
    .configureOutput({
      writeOut: (text) => io.stdout(text),
      writeErr: (text) => io.stderr(text),
      outputError: (text, write) => write(describeCommanderMessage(text)),
    });
  registerDemo(program, io);
  registerCheck(program, io);
  registerWirings(program, io);
  registerAnalyze(program, io);
  registerNetlist(program, io);
  registerRender(program, io);
  registerShortlist(program, io);
  registerCompare(program, io);
  for (const command of program.commands) {
    command.exitOverride().configureOutput({
      writeOut: (text) => io.stdout(text),
      writeErr: (text) => io.stderr(text),
      outputError: (text, write) => write(describeCommanderMessage(text)),
    });
    command.showHelpAfterError(`(run coilbench ${command.name()} --help for usage)`);
  }
  return program;
}

/** Run coilbench with user arguments (no node or script path). Resolves to the exit status. */
export async function main(argv: readonly string[], io: Io): Promise<number> {
  const verbose = argv.includes('--verbose');
  const program = buildProgram(io);
  try {
    await program.parseAsync([...argv], { from: 'user' });
    return EXIT_OK;
  } catch (error) {
    return reportError(error, io, verbose);
  }
}

function reportError(error: unknown, io: Io, verbose: boolean): number {
  if (error instanceof CommanderError) {
    if (error.code === 'commander.helpDisplayed' || error.code === 'commander.version' || error.code === 'commander.help') {
      return EXIT_OK;
    }
    return EXIT_BAD_INPUT; // commander has already printed its message
  }
  const described = describeError(error, verbose);
  for (const line of described.lines) io.stderr(line);
  return described.status;
}

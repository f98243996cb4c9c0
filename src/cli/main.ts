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
import { EXIT_BAD_INPUT, EXIT_OK, describeCommanderError, describeError } from './describe-error.js';
import { removeLeftoversSync } from './interrupt.js';

export { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_INTERRUPTED, EXIT_OK } from './describe-error.js';

const VERSION = COILBENCH_VERSION;

function buildProgram(io: Io): Command {
  const program = new Command('coilbench');
  program
    .description('Hear every way a guitar\'s pickup coils can be wired, before soldering anything.')
    .version(VERSION)
    .option('--verbose', 'show stack traces on errors')
    .exitOverride()
    .configureOutput({
      writeOut: (text) => io.stdout(text),
      writeErr: (text) => io.stderr(text),
      outputError: () => undefined, // reported as one problem line by describeCommanderError
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
      outputError: () => undefined, // reported as one problem line by describeCommanderError
    });
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
    return reportError(error, io, verbose, argv, program);
  }
}

function reportError(error: unknown, io: Io, verbose: boolean, argv: readonly string[], program: Command): number {
  if (error instanceof CommanderError) {
    if (error.code === 'commander.helpDisplayed' || error.code === 'commander.version' || error.code === 'commander.help') {
      return EXIT_OK;
    }
    const commandName = argv.find((word) => program.commands.some((command) => command.name() === word));
    for (const line of describeCommanderError(error.code, error.message, commandName)) io.stderr(line);
    return EXIT_BAD_INPUT;
  }
  removeLeftoversSync(); // a failed render leaves no scratch audio and no temporary file
  const described = describeError(error, verbose);
  for (const line of described.lines) io.stderr(line);
  return described.status;
}

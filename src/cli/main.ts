/**
 * The command line: a thin layer that parses arguments, calls one core entry
 * point per command, hands results to writers and maps errors to exit codes
 * (0 success, 1 failure while working, 2 bad input). One line per problem; a
 * stack trace only with --verbose.
 */
import { Command, CommanderError } from 'commander';
import type { Io } from './io.js';
import { COILBENCH_VERSION } from './version.js';
import { collectOption } from './collect-option.js';
import { EXIT_BAD_INPUT, EXIT_OK, describeCommanderError, describeError } from './describe-error.js';
import { removeLeftoversSync } from './interrupt.js';

export { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_INTERRUPTED, EXIT_OK } from './describe-error.js';

const VERSION = COILBENCH_VERSION;

type Register = (program: Command, io: Io) => void;

/**
 * Each command's module, loaded only when needed (start-up): a command line
 * naming one command loads that command alone; help, a mistyped command or
 * none loads them all. Listed in the order help shows them.
 */
const COMMANDS: ReadonlyArray<readonly [string, () => Promise<Register>]> = [
  ['demo', async () => (await import('./commands/demo.js')).registerDemo],
  ['check', async () => (await import('./commands/check.js')).registerCheck],
  ['wirings', async () => (await import('./commands/wirings.js')).registerWirings],
  ['analyze', async () => (await import('./commands/analyze.js')).registerAnalyze],
  ['netlist', async () => (await import('./commands/netlist.js')).registerNetlist],
  ['render', async () => (await import('./commands/render.js')).registerRender],
  ['shortlist', async () => (await import('./commands/shortlist.js')).registerShortlist],
  ['compare', async () => (await import('./commands/compare.js')).registerCompare],
  ['fit-coil', async () => (await import('./commands/fit-coil.js')).registerFitCoil],
  ['switch', async () => (await import('./commands/switch.js')).registerSwitch],
];

/** The registration functions the command line needs: the named command's, or every one. */
async function loadCommands(argv: readonly string[]): Promise<Register[]> {
  const named = argv.find((argument) => !argument.startsWith('-'));
  const wanted = COMMANDS.filter(([name]) => name === named);
  return Promise.all((wanted.length === 1 ? wanted : COMMANDS).map(([, load]) => load()));
}

function buildProgram(io: Io, registers: readonly Register[]): Command {
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
  for (const register of registers) register(program, io);
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
  const program = buildProgram(io, await loadCommands(argv));
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
    // The first word naming a command is the command.
    const command = argv.map((word) => program.commands.find((each) => each.name() === word)).find((found) => found !== undefined);
    // The options used that take one value per use (collectOption): the likely source of an extra argument.
    const repeatable = (command?.options ?? []).flatMap((option) => (option.parseArg === collectOption && option.long !== undefined && argv.includes(option.long) ? [option.long] : []));
    for (const line of describeCommanderError(error.code, error.message, command?.name(), repeatable)) io.stderr(line);
    return EXIT_BAD_INPUT;
  }
  removeLeftoversSync(); // a failed render leaves no scratch audio and no temporary file
  const described = describeError(error, verbose);
  for (const line of described.lines) io.stderr(line);
  return described.status;
}

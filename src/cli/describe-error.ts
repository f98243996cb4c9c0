/**
 * The one error path of the command line: any fault a command throws becomes
 * lines `coilbench: <what>: <why>` and an exit status (2 bad input, 1 failure
 * while working). Names from files and arguments are escaped and shortened so
 * every message stays one line; a stack trace only with --verbose.
 */
import {
  InputError,
  WorkError,
  describeFileSystemCode,
  escapeForMessage,
  fileSystemCodeOf,
  formatProblem,
  type InputProblem,
  isPathProblem,
} from '../errors/index.js';

export const EXIT_OK = 0;
export const EXIT_FAILURE = 1;
export const EXIT_BAD_INPUT = 2;
/** Exit status after an interrupt (128 + SIGINT's number 2, the shell convention). */
export const EXIT_INTERRUPTED = 130;

/** Longest message text shown from an unexpected error, characters. */
const MAX_MESSAGE_SHOWN = 300;
/** Longest path shown in a file-system message, characters. */
const MAX_PATH_SHOWN = 120;

export interface DescribedError {
  /** Lines to print on standard error, each ending in a newline. */
  readonly lines: readonly string[];
  readonly status: number;
}

/** Turn anything a command threw into its lines and exit status. */
export function describeError(error: unknown, verbose: boolean): DescribedError {
  const stack = verbose && error instanceof Error && error.stack ? [`${error.stack}\n`] : [];
  if (error instanceof InputError) {
    return { lines: [...error.problems.map((problem) => `coilbench: ${formatProblem(problem)}\n`), ...stack], status: EXIT_BAD_INPUT };
  }
  if (error instanceof WorkError) {
    return { lines: [`coilbench: ${escapeForMessage(error.message, MAX_MESSAGE_SHOWN)}\n`, ...stack], status: EXIT_FAILURE };
  }
  const code = fileSystemCodeOf(error);
  if (code !== undefined) {
    const path = (error as { path?: unknown }).path;
    const where = typeof path === 'string' ? escapeForMessage(path, MAX_PATH_SHOWN) : 'a file';
    if (isPathProblem(code)) {
      return { lines: [`coilbench: ${where}: expected a path that can be used, got ${describeFileSystemCode(code)}\n`, ...stack], status: EXIT_BAD_INPUT };
    }
    return { lines: [`coilbench: ${where}: ${describeFileSystemCode(code)}\n`, ...stack], status: EXIT_FAILURE };
  }
  if (error instanceof RangeError && /call stack/iu.test(error.message)) {
    return { lines: [`coilbench: input nested too deeply to read${verbose ? '' : ' (run with --verbose for details)'}\n`, ...stack], status: EXIT_BAD_INPUT };
  }
  const message = error instanceof Error ? error.message : String(error);
  const hint = verbose ? '' : ' (run with --verbose for details)';
  return { lines: [`coilbench: internal error: ${escapeForMessage(message, MAX_MESSAGE_SHOWN)}${hint}\n`, ...stack], status: EXIT_FAILURE };
}

/** How many arguments commander wanted and got, from its "Expected 1 argument but got 2." */
function argumentCounts(text: string): { readonly wanted: number; readonly given: number } | null {
  const match = /Expected (\d+) arguments? but got (\d+)/u.exec(text);
  return match ? { wanted: Number(match[1]), given: Number(match[2]) } : null;
}

function countOfArguments(count: number): string {
  return count === 1 ? '1 argument' : `${count} arguments`;
}

/**
 * Commander's own refusals (unknown option, missing value, unknown command) as
 * one problem line each. `repeatable` names the options the command line used
 * that take one value per use (`--only a --only b`): a second value after one
 * of them is read as an extra argument, and the line says how to give it.
 */
export function describeCommanderError(code: string, message: string, command: string | undefined, repeatable: readonly string[] = []): string[] {
  const text = message.replace(/^error: /u, '');
  const quoted = /'([^']*)'/u.exec(text)?.[1] ?? '';
  const help = `coilbench ${command === undefined ? '' : `${command} `}--help`;
  const suggestion = /\(Did you mean ([^?]+)\?\)/u.exec(text)?.[1];
  const problem = ((): InputProblem => {
    switch (code) {
      case 'commander.unknownOption':
        return { path: quoted, expected: `an option listed by ${help}${suggestion ? ` (did you mean ${suggestion}?)` : ''}`, got: 'an unknown option' };
      case 'commander.unknownCommand':
        return { path: 'command', expected: `a command listed by coilbench --help${suggestion ? ` (did you mean ${suggestion}?)` : ''}`, got: JSON.stringify(quoted) };
      case 'commander.optionMissingArgument':
        return { path: quoted.split(' ').find((word) => word.startsWith('--')) ?? quoted, expected: 'a value after the option', got: 'nothing' };
      case 'commander.missingArgument':
        return { path: `<${quoted}>`, expected: `the ${quoted} argument (see ${help})`, got: 'nothing' };
      case 'commander.excessArguments': {
        const counts = argumentCounts(text);
        const flag = repeatable[0];
        const repeat = flag === undefined ? '' : `; ${flag} takes one value each time, so repeat it for more (${flag} "…" ${flag} "…")`;
        if (counts === null) return { path: 'arguments', expected: `the arguments listed by ${help}${repeat}`, got: text };
        return { path: 'arguments', expected: `${countOfArguments(counts.wanted)} (see ${help})${repeat}`, got: countOfArguments(counts.given) };
      }
      default:
        return { path: 'command line', expected: `arguments as listed by ${help}`, got: text.split('\n')[0] ?? text };
    }
  })();
  return [`coilbench: ${formatProblem(problem)}\n`];
}

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
    const status = isPathProblem(code) ? EXIT_BAD_INPUT : EXIT_FAILURE;
    return { lines: [`coilbench: ${where}: ${describeFileSystemCode(code)}\n`, ...stack], status };
  }
  if (error instanceof RangeError && /call stack/iu.test(error.message)) {
    return { lines: [`coilbench: input nested too deeply to read${verbose ? '' : ' (run with --verbose for details)'}\n`, ...stack], status: EXIT_BAD_INPUT };
  }
  const message = error instanceof Error ? error.message : String(error);
  const hint = verbose ? '' : ' (run with --verbose for details)';
  return { lines: [`coilbench: internal error: ${escapeForMessage(message, MAX_MESSAGE_SHOWN)}${hint}\n`, ...stack], status: EXIT_FAILURE };
}

/** Commander's own message (unknown option, missing argument) as escaped lines, without its "error: " prefix. */
export function describeCommanderMessage(text: string): string {
  return text
    .replace(/^error: /u, '')
    .split('\n')
    .filter((line) => line !== '')
    .map((line) => `coilbench: ${escapeForMessage(line, MAX_MESSAGE_SHOWN)}\n`)
    .join('');
}

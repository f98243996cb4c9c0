/**
 * Errors that carry what the user got wrong, in one grammar:
 * `<path>: expected <what>, got <value>`.
 *
 * `InputError` means bad input (exit status 2); `WorkError` means a failure
 * while working on valid input (exit status 1). Both hold fields, not strings
 * to parse, so the CLI and tests can read them.
 */

/** One problem found in the input. */
export interface InputProblem {
  /** Where the problem is: a JSON path like `coils[1].inductance`, an option like `--volume`, or a file name. */
  readonly path: string;
  /** What was expected, in words: `a positive inductance like "2.5H"`. */
  readonly expected: string;
  /** What was found, already shown as the user would write it (quoted string, number, `nothing`). */
  readonly got: string;
}

import { escapeForMessage } from './escape-text.js';

/** Longest shown form of an offending value before it is elided. */
const MAX_SHOWN_CHARACTERS = 60;
/** Longest shown path (a field path or a file name) before it is elided. */
const MAX_SHOWN_PATH = 120;
/** Longest shown expectation; ours are short, but they may quote a name from the file. */
const MAX_SHOWN_EXPECTED = 400;

/** Show a value from the input the way the user wrote it: hidden characters visible, elided with its length if long. */
export function showValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  let text: string;
  try {
    text = JSON.stringify(value) ?? String(value);
  } catch {
    text = String(value);
  }
  return escapeForMessage(text, MAX_SHOWN_CHARACTERS);
}

/** Render one problem as one line of text (names from the input escaped and shortened). */
export function formatProblem(problem: InputProblem): string {
  return `${escapeForMessage(problem.path, MAX_SHOWN_PATH)}: expected ${escapeForMessage(problem.expected, MAX_SHOWN_EXPECTED)}, got ${escapeForMessage(problem.got, MAX_SHOWN_EXPECTED)}`;
}

/** Make a problem from a path, the expectation and the raw value found. */
export function problemAt(path: string, expected: string, value: unknown): InputProblem {
  return { path, expected, got: showValue(value) };
}

/** Bad input: one or more problems, each with its path. Exit status 2. */
export class InputError extends Error {
  readonly problems: readonly InputProblem[];
  constructor(problems: readonly InputProblem[]) {
    super(problems.map(formatProblem).join('\n'));
    this.name = 'InputError';
    this.problems = problems;
  }

  /** Convenience for a single problem. */
  static at(path: string, expected: string, value: unknown): InputError {
    return new InputError([problemAt(path, expected, value)]);
  }
}

/** A failure while working on valid input (a file could not be written, a reference tool failed). Exit status 1. */
export class WorkError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'WorkError';
  }
}

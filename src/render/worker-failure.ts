/**
 * A worker thread's failure as data, both ends: the worker posts it
 * (`failureOf`), and the parent rethrows it with its class (`errorOfFailure`):
 * an InputError when it carries the input's problems (exit 2), a WorkError
 * otherwise (exit 1). Error objects do not cross threads with their class.
 */
import { type InputProblem, InputError, WorkError } from '../errors/index.js';

export interface WorkerFailure {
  readonly kind: 'failed';
  readonly message: string;
  readonly problems?: readonly InputProblem[];
}

/** What a worker posts for an error it caught. */
export function failureOf(error: unknown): WorkerFailure {
  const message = error instanceof Error ? error.message : String(error);
  return { kind: 'failed', message, ...(error instanceof InputError ? { problems: error.problems } : {}) };
}

/** The error a parent throws for a worker's failure; `what` names the worker in a WorkError ("render worker"). */
export function errorOfFailure(failure: Pick<WorkerFailure, 'message' | 'problems'>, what: string): Error {
  return failure.problems ? new InputError(failure.problems) : new WorkError(`${what} failed: ${failure.message}`);
}

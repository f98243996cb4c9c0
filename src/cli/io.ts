/**
 * What a command may touch of the outside world. `main` receives it, so tests
 * run commands in-process with captured output.
 */
export interface Io {
  /** Write to standard output (results only). */
  readonly stdout: (text: string) => void;
  /** Write to standard error (progress, notes, errors). */
  readonly stderr: (text: string) => void;
  /** Is standard error a terminal (progress bars only then)? */
  readonly stderrIsTerminal: boolean;
  /** Directory relative paths are resolved against. */
  readonly cwd: string;
}

/** The real process's streams. */
export function processIo(): Io {
  return {
    stdout: (text) => {
      process.stdout.write(text);
    },
    stderr: (text) => {
      process.stderr.write(text);
    },
    stderrIsTerminal: Boolean(process.stderr.isTTY),
    cwd: process.cwd(),
  };
}

/** Output captured in memory, for tests. */
export interface CapturedIo extends Io {
  readonly out: () => string;
  readonly err: () => string;
}

export function captureIo(cwd: string = process.cwd()): CapturedIo {
  let out = '';
  let err = '';
  return {
    stdout: (text) => {
      out += text;
    },
    stderr: (text) => {
      err += text;
    },
    stderrIsTerminal: false,
    cwd,
    out: () => out,
    err: () => err,
  };
}

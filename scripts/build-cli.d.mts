// Types of build-cli.mjs for the tests that bundle the command line themselves (test/interruption.test.ts).
/** Source files of the worker entries the render starts (src/render/*-worker.ts). */
export function workerEntries(repository?: string): string[];
/** Bundle the command line and its workers into `outFolder` (dist/ by default); cli.js is made executable. */
export function bundleCommandLine(outFolder?: string, repository?: string): Promise<void>;

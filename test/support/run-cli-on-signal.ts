/**
 * Runs the coilbench CLI in a child process once a signal file appears, so
 * a test can start several runs at the same instant (the module loading,
 * which takes seconds, is done before). Usage:
 *   node --import tsx run-cli-on-signal.ts <ready-file> <go-file> <coilbench arguments…>
 * Writes <ready-file> when loaded, waits for <go-file>, runs, exits with the
 * CLI's status.
 */
import { existsSync, writeFileSync } from 'node:fs';
import { main, processIo } from '../../src/cli/index.js';

/** How often the go file is looked for, ms. */
const POLL_MS = 2;

const [readyFile, goFile, ...argv] = process.argv.slice(2);
if (readyFile === undefined || goFile === undefined) throw new Error('usage: run-cli-on-signal <ready-file> <go-file> <arguments…>');
writeFileSync(readyFile, String(process.pid));
while (!existsSync(goFile)) await new Promise((resolve) => setTimeout(resolve, POLL_MS));
process.exitCode = await main(argv, processIo());

/**
 * Runs one coilbench command in this fresh process with its standard output
 * thrown away, then prints {seconds, cpuSeconds, peakRssMb, status, outputMb} as the last line
 * (for scripts/bench/six-elements.ts).
 */
import { performance } from 'node:perf_hooks';
import { main } from '../../src/cli/index.js';

const started = performance.now();
let bytes = 0;
const status = await main(process.argv.slice(2), {
  stdout: (text) => {
    bytes += text.length;
  },
  stderr: () => undefined,
  stderrIsTerminal: false,
  cwd: process.cwd(),
});
const seconds = (performance.now() - started) / 1000;
/** process.cpuUsage() is in microseconds. */
const MICROSECONDS_PER_SECOND = 1e6;
const usage = process.cpuUsage();
const cpuSeconds = (usage.user + usage.system) / MICROSECONDS_PER_SECOND;
/** process.resourceUsage().maxRSS is in kibibytes. */
const KIB_PER_MIB = 1024;
console.log(JSON.stringify({ seconds, cpuSeconds, peakRssMb: process.resourceUsage().maxRSS / KIB_PER_MIB, status, outputMb: bytes / 1e6 }));

/**
 * `npm run bench`: prints speed figures for the main stages on this machine.
 * Nothing here is asserted; quote the figures in issue notes.
 */
import { cpus } from 'node:os';
import { benchCircuit } from './bench/circuit.js';
import { benchEnumerate } from './bench/enumerate.js';

console.log(`coilbench bench — node ${process.version}, ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown cpu'})`);
benchEnumerate();
await benchCircuit();

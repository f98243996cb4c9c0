/**
 * `npm run bench`: prints speed figures for the main stages on this machine.
 * Nothing here is asserted; quote the figures in issue notes.
 */
import { cpus } from 'node:os';
import { benchChain } from './bench/chain.js';
import { benchCircuit } from './bench/circuit.js';
import { benchDistinct } from './bench/distinct.js';
import { benchEnumerate } from './bench/enumerate.js';
import { benchListeningPage } from './bench/listening-page.js';
import { benchMeasures } from './bench/measures.js';
import { benchRender } from './bench/render.js';
import { benchStrings } from './bench/strings.js';

console.log(`coilbench bench — node ${process.version}, ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown cpu'})`);
benchEnumerate();
benchStrings();
await benchMeasures();
await benchChain();
await benchCircuit();
await benchListeningPage();
benchRender();
benchDistinct();

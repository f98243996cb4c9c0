/**
 * `npm run bench`: prints speed figures for the main stages on this machine.
 * Nothing here is asserted; quote the figures in issue notes.
 *
 *   npm run bench                    every section
 *   npm run bench -- commands render only these sections (names below)
 */
import { cpus } from 'node:os';
import { allocateFeedbackEagerly } from '../src/cli/eager-feedback.js';
import { benchChain } from './bench/chain.js';
import { benchCircuit } from './bench/circuit.js';
import { benchCommands } from './bench/command.js';
import { benchDistinct } from './bench/distinct.js';
import { benchEnumerate } from './bench/enumerate.js';
import { benchFigures } from './bench/figures.js';
import { benchListeningPage } from './bench/listening-page.js';
import { benchMeasures } from './bench/measures.js';
import { benchRender } from './bench/render.js';
import { benchStrings } from './bench/strings.js';
import { benchSwitch } from './bench/switch.js';
import { benchSixElements } from './bench/six-elements.js';

// The in-process sections run with the V8 setting the command line uses (src/cli/eager-feedback.ts), so they
// measure the code as users run it.
allocateFeedbackEagerly();

const SECTIONS: ReadonlyArray<readonly [string, () => unknown]> = [
  ['commands', benchCommands],
  ['render', benchRender],
  ['enumerate', benchEnumerate],
  ['strings', benchStrings],
  ['measures', benchMeasures],
  ['figures', benchFigures],
  ['chain', benchChain],
  ['circuit', benchCircuit],
  ['page', benchListeningPage],
  ['distinct', benchDistinct],
  ['switch', benchSwitch],
  ['six-elements', benchSixElements],
];

const wanted = process.argv.slice(2);
const unknown = wanted.filter((name) => !SECTIONS.some(([section]) => section === name));
if (unknown.length > 0) {
  console.error(`bench: unknown section ${unknown.join(', ')}; sections: ${SECTIONS.map(([name]) => name).join(', ')}`);
  process.exit(2);
}
console.log(`coilbench bench — node ${process.version}, ${cpus().length} cores (${cpus()[0]?.model ?? 'unknown cpu'})`);
for (const [name, run] of SECTIONS) if (wanted.length === 0 || wanted.includes(name)) await run();

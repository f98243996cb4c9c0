/**
 * The wirings the page renders ahead while it is idle after the first sound.
 * A browser compiles a function's fast code only once the function has run
 * (just-in-time compilation), so the first wiring of many coils a listener
 * chooses would otherwise wait for the engine's code to be compiled as it
 * renders: measured in chromium, 150–180 ms of synthesis for the first
 * wiring of a four- or five-coil guitar against 30–55 ms for the next ones.
 * Rendering ahead one wiring of each path the engine takes (nodal analysis
 * for a wiring holding both coils of a coupled pair, series–parallel
 * reduction for the others), each with as many elements as the guitar
 * allows and with series and parallel parts, compiles that code before it is
 * needed; the renders stay in the page's cache, ready to play. The chain a
 * listener has not heard yet is warmed too (`drive`'s audio context is made
 * for a moment of silence, wiring-engine.ts).
 */
import { usesCoupledCoils } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { type Wiring, topologyOf } from '../wiring/index.js';

/**
 * Up to two wirings, in list order: one that uses a coupled pair and one that
 * does not, each the largest of its kind that mixes series and parallel (so
 * both reductions run), or the largest of its kind when none mixes them.
 */
export function warmUpWirings(guitar: Guitar, wirings: readonly Wiring[]): Wiring[] {
  const rank = (wiring: Wiring): number => 2 * wiring.elements.length + (topologyOf(wiring.network) === 'series-parallel' ? 1 : 0);
  let coupled: Wiring | null = null;
  let plain: Wiring | null = null;
  for (const wiring of wirings) {
    if (usesCoupledCoils(guitar, wiring.network)) {
      if (coupled === null || rank(wiring) > rank(coupled)) coupled = wiring;
    } else if (plain === null || rank(wiring) > rank(plain)) plain = wiring;
  }
  return [coupled, plain].filter((wiring): wiring is Wiring => wiring !== null);
}

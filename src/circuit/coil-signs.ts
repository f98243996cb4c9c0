/**
 * Sign conventions that tie a wiring's acoustic phase to the leads of each
 * coil (derived from Faraday's law, docs/physics.md §6; the humbucking principle
 * is US Patent 2,896,491).
 *
 * - Winding sign w = +1 for "cw", −1 for "ccw": the sense of the turns seen
 *   from the top, going from the start lead to the finish lead.
 * - Magnet sign m = +1 when the north pole faces the strings, −1 for south.
 * - A uniform mains field induces, from start to finish, an EMF of sign w
 *   (the magnet plays no part). A vibrating string modulates the magnet's own
 *   flux through the coil, so its EMF from start to finish has sign w·m.
 * - Element phase p = −1 when written `~`, else +1. The connection c = +1
 *   puts the coil's finish lead on the network's + side (towards hot) and its
 *   start lead on the − side; c = −1 the other way round.
 * - The string signal reaching the network is then c·w·m. Choosing
 *   c = p·w·m makes it p, as the wiring says; the hum EMF is c·w = p·m.
 */
import type { MagnetPole, Winding } from '../guitar/index.js';

export type Sign = 1 | -1;

export function windingSign(winding: Winding): Sign {
  return winding === 'cw' ? 1 : -1;
}

export function magnetSign(magnet: MagnetPole): Sign {
  return magnet === 'north' ? 1 : -1;
}

/** p: −1 for an element written `~`. */
export function phaseSign(inverted: boolean): Sign {
  return inverted ? -1 : 1;
}

/** c = p·w·m: +1 puts the finish lead towards hot, −1 the start lead. */
export function connectionSign(phase: Sign, winding: Winding, magnet: MagnetPole): Sign {
  return (phase * windingSign(winding) * magnetSign(magnet)) as Sign;
}

/** Sign of the hum EMF a coil puts into the network: c·w = p·m. */
export function humSign(phase: Sign, magnet: MagnetPole): Sign {
  return (phase * magnetSign(magnet)) as Sign;
}

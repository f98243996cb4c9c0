/** Ties wiring expressions to a guitar: which names exist, and finding an expression among enumerated wirings. */
import { InputError } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import { parseWiring, type WiringVocabulary } from './parse-wiring.js';
import { printNetwork } from './print-wiring.js';
import type { Wiring } from './wiring.js';

/** The names a guitar's wiring expressions may use. */
export function vocabularyOf(guitar: Pick<Guitar, 'elements' | 'coils' | 'pickups'>): WiringVocabulary {
  const housedCoils = new Map<string, string>();
  for (const pickup of guitar.pickups) {
    if (pickup.leads !== 2) continue;
    for (const index of pickup.coilIndices) {
      const coil = guitar.coils[index];
      if (coil) housedCoils.set(coil.id, pickup.name);
    }
  }
  return { elementIds: guitar.elements.map((element) => element.id), housedCoils };
}

/**
 * Find the enumerated wiring an expression denotes, or accept a wiring id
 * ("w12"). `path` names the option or field in messages.
 */
export function findWiring(
  text: string,
  wirings: readonly Wiring[],
  vocabulary: WiringVocabulary,
  path: string,
): Wiring {
  const trimmed = text.trim();
  if (/^w\d+$/u.test(trimmed)) {
    const byId = wirings.find((wiring) => wiring.id === trimmed);
    if (!byId) throw InputError.at(path, `a wiring number from w1 to w${wirings.length}`, trimmed);
    return byId;
  }
  const canonical = printNetwork(parseWiring(trimmed, vocabulary, path), vocabulary.elementIds);
  const found = wirings.find((wiring) => wiring.expression === canonical);
  if (!found) throw InputError.at(path, 'a series–parallel wiring of the guitar\'s coils', trimmed);
  return found;
}

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { usesCoupledCoils } from '../circuit/index.js';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings, topologyOf } from '../wiring/index.js';
import { warmUpWirings } from './warm-up.js';

const guitarOf = (file: string) => parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', file), 'utf8'), file);

describe('warmUpWirings', () => {
  it('takes the largest wiring through each path of the engine', () => {
    const guitar = guitarOf('humbucker-two-single-coil.json');
    const wirings = enumerateWirings(guitar.elements);
    const [coupled, plain] = warmUpWirings(guitar, wirings);
    expect(usesCoupledCoils(guitar, coupled!.network)).toBe(true);
    expect(usesCoupledCoils(guitar, plain!.network)).toBe(false);
    expect(coupled!.elements.length).toBe(guitar.elements.length);
    // Without both coils of the humbucker, at most one of them: every other element.
    expect(plain!.elements.length).toBe(guitar.elements.length - 1);
    // Series and parallel parts both, and the first such of its size in list order.
    for (const wiring of [coupled!, plain!]) expect(topologyOf(wiring.network)).toBe('series-parallel');
    const first = wirings.findIndex((wiring) => wiring.elements.length === guitar.elements.length && topologyOf(wiring.network) === 'series-parallel');
    expect(wirings.indexOf(coupled!)).toBe(first);
  });

  it('has only the series–parallel path to warm on a guitar without coupled coils', () => {
    const guitar = guitarOf('three-single-coil.json');
    const warm = warmUpWirings(guitar, enumerateWirings(guitar.elements));
    expect(warm).toHaveLength(1);
    expect(warm[0]!.elements.length).toBe(3);
    expect(topologyOf(warm[0]!.network)).toBe('series-parallel');
  });

  it('takes the largest wiring of a kind when none mixes series and parallel', () => {
    const guitar = guitarOf('three-single-coil.json');
    const pairs = enumerateWirings(guitar.elements).filter((wiring) => wiring.elements.length <= 2);
    const [warm] = warmUpWirings(guitar, pairs);
    expect(warm!.elements.length).toBe(2);
  });
});

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type Guitar, parseGuitar, parseGuitarText } from '../guitar/index.js';
import { createRandom } from '../math/index.js';
import { type Wiring, enumerateWirings, printNetwork } from '../wiring/index.js';
import { randomInterestingPlan } from '../../test/support/random-switch-plan.js';
import {
  type PositionWish,
  type SwitchKit,
  enumerateTargetPartitions,
  parseSwitchTexts,
  presetSwitch,
  readPlanPositions,
  readPositionWiring,
  solveSwitchPlan,
  solveSwitchRequest,
} from './index.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');
const THREE = parseGuitarText(readFileSync(join(samples, 'three-single-coil.json'), 'utf8'));

/** One four-conductor humbucker: two coils, opposite windings and magnets (invented values). */
const HUMBUCKER: Guitar = parseGuitar({
  name: 'one humbucker (invented values)',
  coils: [
    { id: 'screw', pickup: 'bridge', position: '51mm', resistance: '4.1k', inductance: '2.1H', winding: 'cw', magnet: 'north' },
    { id: 'slug', pickup: 'bridge', position: '33mm', resistance: '4.0k', inductance: '2.0H', winding: 'ccw', magnet: 'south' },
  ],
});

function wish(guitar: Guitar, wirings: readonly Wiring[], text: string): PositionWish {
  if (text === 'off' || text === 'free') return { kind: text };
  const ids = guitar.elements.map((element) => element.id);
  const found = wirings.find((wiring) => wiring.expression === text || printNetwork(wiring.network, ids) === text);
  if (!found) throw new Error(`no wiring ${text}`);
  return { kind: 'wiring', network: found.network, expression: found.expression };
}

function readings(guitar: Guitar, kit: SwitchKit, wishes: readonly PositionWish[]) {
  const result = solveSwitchPlan(kit, guitar.elements.length, wishes);
  if (result.plan === null) return { result, read: [] as string[] };
  const ids = guitar.elements.map((element) => element.id);
  return {
    result,
    read: readPlanPositions(guitar, result.plan).map((position) =>
      position.reading.kind === 'wiring' ? printNetwork(position.reading.network, ids) : position.reading.kind,
    ),
  };
}

describe('presets', () => {
  it('a five-position lever makes five positions from three lugs, the in-between ones touching two (common practice)', () => {
    const lever = presetSwitch('lever-5-position-2-pole');
    expect(lever?.contactLugs).toBe(3);
    expect(lever?.positions).toEqual([[0], [0, 1], [1], [1, 2], [2]]);
    expect(presetSwitch('rotary-6-position-2-pole')?.positions).toHaveLength(6);
    expect(presetSwitch('lever-5-position-9-pole')).toBeNull();
  });

  it('a kit\'s positions are the combinations of its switches\' (a five-position lever and a push-pull: ten)', () => {
    const kit = parseSwitchTexts(['lever-5-position-2-pole', 'push-pull-2-pole']);
    expect(solveSwitchPlan(kit, 1, []).status).toBe('found');
    expect(kit.switches.reduce((n, s) => n * s.positions.length, 1)).toBe(10);
  });
});

describe('checks of the trade (common practice)', () => {
  it('a two-coil humbucker on one two-pole, two-position toggle reaches series and one coil', () => {
    const wirings = enumerateWirings(HUMBUCKER.elements);
    const kit = parseSwitchTexts(['toggle-2-position-2-pole']);
    const { result, read } = readings(HUMBUCKER, kit, [wish(HUMBUCKER, wirings, 'screw + slug'), wish(HUMBUCKER, wirings, 'screw')]);
    expect(result.status).toBe('found');
    expect(read).toEqual(['screw + slug', 'screw']);
    // With coupled coils the unused coil must be left open, not shorted: still possible, one lead switched.
    const open = solveSwitchPlan(kit, HUMBUCKER.elements.length, [wish(HUMBUCKER, wirings, 'screw + slug'), wish(HUMBUCKER, wirings, 'screw')], { allowShorted: false });
    expect(open.status).toBe('found');
    const second = readPlanPositions(HUMBUCKER, open.plan as NonNullable<typeof open.plan>)[1];
    const slug = second?.circuit.coils.find((placed) => placed.coil === 1);
    expect(slug === undefined || slug.start === null || slug.finish === null).toBe(true);
  });

  it('three single coils on a five-position lever with one pole of three lugs: each coil alone and the adjacent pairs in parallel', () => {
    const wirings = enumerateWirings(THREE.elements);
    const kit = parseSwitchTexts(['lever-5-position-1-pole']);
    const wanted = ['neck', 'neck // mid', 'mid', 'mid // bridge', 'bridge'];
    const { result, read } = readings(THREE, kit, wanted.map((text) => wish(THREE, wirings, text)));
    expect(result.status).toBe('found');
    expect(read).toEqual(wanted);
  });

  it('…and, with each coil alone on positions 1, 3 and 5, nothing that needs a series connection in 2 or 4', () => {
    // (With other positions free a fixed series joint needs no switch at all, so the claim is about this layout.)
    const wirings = enumerateWirings(THREE.elements);
    const kit = parseSwitchTexts(['lever-5-position-1-pole']);
    const series = wirings.filter((wiring) => wiring.expression.includes('+'));
    expect(series.length).toBeGreaterThan(20);
    const singles = ['neck', 'mid', 'bridge'].map((text) => wish(THREE, wirings, text));
    for (const wiring of series) {
      const wanted: PositionWish = { kind: 'wiring', network: wiring.network, expression: wiring.expression };
      for (const at of [1, 3]) {
        const wishes: PositionWish[] = [singles[0], { kind: 'free' }, singles[1], { kind: 'free' }, singles[2]] as PositionWish[];
        wishes[at] = wanted;
        expect(solveSwitchPlan(kit, THREE.elements.length, wishes).status, `${wiring.expression} at ${at + 1}`).toBe('impossible');
      }
    }
  });

  it('refuses eight different wirings on a five-position switch, with the reason', () => {
    const wirings = enumerateWirings(THREE.elements);
    const kit = parseSwitchTexts(['lever-5-position-4-pole']);
    const wishes = wirings.slice(0, 8).map((wiring): PositionWish => ({ kind: 'wiring', network: wiring.network, expression: wiring.expression }));
    const request = solveSwitchRequest(kit, THREE.elements.length, wishes, { stepBudget: 20_000 });
    expect(request.result.status).toBe('impossible');
    expect(request.tooMany).toEqual({ wishes: 8, positions: 5 });
  });

  it('an in-between lever position keeps the joints of its neighbours: series there after a single coil is refused at once', () => {
    const wirings = enumerateWirings(THREE.elements);
    const kit = parseSwitchTexts(['lever-5-position-4-pole']);
    const result = solveSwitchPlan(kit, THREE.elements.length, [wish(THREE, wirings, 'neck'), wish(THREE, wirings, 'neck + mid')]);
    expect(result.status).toBe('impossible');
    expect(result.containment).toEqual({ inner: 0, outer: 1 });
  });

  it('finds the smallest change: one coil and series need a second pole on a one-pole toggle', () => {
    const wirings = enumerateWirings(HUMBUCKER.elements);
    const kit = parseSwitchTexts(['toggle-2-position-1-pole']);
    const wishes = [wish(HUMBUCKER, wirings, 'screw + slug'), wish(HUMBUCKER, wirings, 'screw // slug')];
    const request = solveSwitchRequest(kit, HUMBUCKER.elements.length, wishes);
    expect(request.result.status).toBe('impossible');
    expect(request.change?.description).toMatch(/one more pole/u);
    expect(request.change?.result.status).toBe('found');
  });
});

describe('target partitions and the reading agree', () => {
  it('every layout partition of every three-coil wiring reads back as that wiring', () => {
    const ids = THREE.elements.map((element) => element.id);
    for (const wiring of enumerateWirings(THREE.elements)) {
      const target = enumerateTargetPartitions(wiring.network, THREE.elements.length);
      for (const partition of target.partitions) {
        // Unused leads each on a point of their own.
        const components = Array.from(partition, (node, item) => (node >= 0 ? node : 1000 + item));
        const reading = readPositionWiring(THREE, components);
        expect(reading.kind === 'wiring' ? printNetwork(reading.network, ids) : reading.kind).toBe(wiring.expression);
      }
    }
  });
});

/** Kits of every kind; the exact search settles each of them (the bench times the bigger ones). */
const KITS = [
  ['toggle-2-position-1-pole'],
  ['toggle-2-position-2-pole'],
  ['toggle-3-position-2-pole'],
  ['lever-3-position-1-pole'],
  ['lever-5-position-1-pole'],
  ['rotary-4-position-1-pole'],
  ['toggle-2-position-1-pole', 'push-pull-1-pole'],
  ['lever-5-position-2-pole'],
  ['lever-5-position-3-pole'],
  ['lever-5-position-4-pole'],
  ['lever-3-position-4-pole'],
  ['rotary-6-position-2-pole'],
  ['lever-5-position-2-pole', 'push-pull-1-pole'],
];
const FOUR_POLE_LEVER = ['lever-5-position-4-pole'];
const TWO_HUMBUCKERS = parseGuitarText(readFileSync(join(samples, 'two-humbucker.json'), 'utf8'));

/** Property runs: the default keeps `npm test` short; COILBENCH_SWITCH_RUNS=500 (or more) is the heavy variant. */
const RUNS = Number(process.env['COILBENCH_SWITCH_RUNS'] ?? 40);
/** Steps allowed per search in the property (the command's default is 2 000 000; our choice: room to spare). */
const PROPERTY_STEP_BUDGET = 5_000_000;

/** A random lug wiring of the kit, its positions read off as wishes; the search must find a plan that reads back the same. */
function searchFindsPlan(guitar: Guitar, kitTexts: readonly string[], seed: number, minWirings: number): void {
  const kit = parseSwitchTexts(kitTexts);
  const made = randomInterestingPlan(guitar, kit, createRandom(seed), minWirings);
  if (made === null) return;
  const result = solveSwitchPlan(kit, guitar.elements.length, made.wishes, { stepBudget: PROPERTY_STEP_BUDGET });
  expect(result.status, made.wishes.map((wanted) => (wanted.kind === 'wiring' ? wanted.expression : wanted.kind)).join(' | ')).toBe('found');
  const ids = guitar.elements.map((element) => element.id);
  const read = readPlanPositions(guitar, result.plan as NonNullable<typeof result.plan>);
  made.wishes.forEach((wanted, index) => {
    const got = read[index]?.reading;
    if (wanted.kind === 'wiring') expect(got?.kind === 'wiring' ? printNetwork(got.network, ids) : got?.kind).toBe(wanted.expression);
    if (wanted.kind === 'off') expect(['off', 'unclean']).toContain(got?.kind);
  });
}

describe('property: whenever a plan exists, the search finds one', () => {
  it('random lug wirings of kits of every kind, their positions read off as wishes', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: KITS.length - 1 }), fc.integer({ min: 1, max: 2 ** 30 }), fc.boolean(), (k, seed, humbucker) => {
        searchFindsPlan(humbucker ? HUMBUCKER : THREE, KITS[k] as string[], seed, 2);
      }),
      { numRuns: RUNS, seed: 14 },
    );
  });

  it('five-position four-pole levers: three single coils and two four-conductor humbuckers, three or more different wirings', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 30 }), fc.boolean(), (seed, humbuckers) => {
        searchFindsPlan(humbuckers ? TWO_HUMBUCKERS : THREE, FOUR_POLE_LEVER, seed, 3);
      }),
      { numRuns: RUNS, seed: 44 },
    );
  });
});

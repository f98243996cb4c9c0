/**
 * A random physical lug wiring of a kit, and the wishes read off it: every
 * position that reads as a clean wiring or off becomes that wish, the rest
 * are free. So a plan is known to exist for the wishes (this one), and the
 * search must find one (test and bench).
 */
import type { Random } from '../../src/math/index.js';
import {
  type PositionWish,
  type SwitchKit,
  type SwitchPlan,
  itemCount,
  kitLugLayout,
  readPlanPositions,
} from '../../src/switching/index.js';
import type { Guitar } from '../../src/guitar/index.js';
import { printNetwork } from '../../src/wiring/index.js';

/** Chance a lug is left empty, and chance an item starts a net of its own (our choice: gives varied, mostly clean positions). */
const EMPTY_LUG_CHANCE = 0.2;
const NEW_NET_CHANCE = 0.5;
const JUMPER_CHANCE = 0.15;

function pick(random: Random, count: number): number {
  return Math.min(count - 1, Math.floor(random() * count));
}

export function randomSwitchPlan(guitar: Guitar, kit: SwitchKit, random: Random): SwitchPlan {
  const items = itemCount(guitar);
  const itemNets: number[] = [0, 1];
  let fixed = 2;
  for (let item = 2; item < items; item += 1) {
    if (random() < NEW_NET_CHANCE) itemNets.push(fixed++);
    else itemNets.push(pick(random, fixed));
  }
  const layout = kitLugLayout(kit);
  const lugNets: number[] = [];
  let jumpers = 0;
  for (let lug = 0; lug < layout.lugCount; lug += 1) {
    const roll = random();
    if (roll < EMPTY_LUG_CHANCE) lugNets.push(-1);
    else if (roll < EMPTY_LUG_CHANCE + JUMPER_CHANCE) {
      const use = pick(random, jumpers + 1);
      if (use === jumpers) jumpers += 1;
      lugNets.push(fixed + use);
    } else lugNets.push(pick(random, fixed));
  }
  return { kit, itemNets, fixedNetCount: fixed, lugNets, jumperNetCount: jumpers };
}

export function wishesOfPlan(guitar: Guitar, plan: SwitchPlan): PositionWish[] {
  const ids = guitar.elements.map((element) => element.id);
  return readPlanPositions(guitar, plan).map((position): PositionWish => {
    const reading = position.reading;
    if (reading.kind === 'wiring') return { kind: 'wiring', network: reading.network, expression: printNetwork(reading.network, ids) };
    if (reading.kind === 'off') return { kind: 'off' };
    return { kind: 'free' };
  });
}

/** A random plan whose wishes hold at least `minWirings` different wirings (tries up to `attempts` plans; null if none). */
export function randomInterestingPlan(guitar: Guitar, kit: SwitchKit, random: Random, minWirings: number, attempts = 500): { plan: SwitchPlan; wishes: PositionWish[] } | null {
  for (let k = 0; k < attempts; k += 1) {
    const plan = randomSwitchPlan(guitar, kit, random);
    const wishes = wishesOfPlan(guitar, plan);
    const distinct = new Set(wishes.flatMap((wish) => (wish.kind === 'wiring' ? [wish.expression] : [])));
    if (distinct.size >= minWirings) return { plan, wishes };
  }
  return null;
}

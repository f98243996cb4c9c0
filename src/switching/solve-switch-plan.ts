/**
 * The lug wiring that gives the wanted wiring in each position of a kit,
 * by an exact search (docs/switching.md has the argument in full).
 *
 * A plan is (a) a partition of the items (hot, ground, every element lead)
 * into fixed nets: items joined by wire whatever the switches do; and
 * (b) for every lug of every pole, the net soldered to it: none, a fixed
 * net, or a jumper net (lugs joined to each other only). Every physical
 * wiring of the lugs is one such plan, so searching them all is complete.
 * In a position, each pole joins its common's net to the nets of the
 * contact lugs it touches; the points of the position are the nets so
 * joined (union–find).
 *
 * A position realises its wish when, on hot, ground and the leads of the
 * elements the wiring uses, its points are one of the wiring's layout
 * partitions (target-partitions.ts), and every other element is open (a
 * lead alone on its point) or shorted (both leads on one point): either way
 * no current from it reaches the output. `off`: every element so. `free`:
 * anything.
 *
 * Pruning keeps completeness because points only ever merge as more of the
 * plan is decided (a lug left undecided joins nothing):
 * - refinement: if two used leads already share a point that no layout
 *   partition allows, no completion can separate them;
 * - unused elements: two points that already hold used leads of different
 *   layout points can never merge, so an unused element with its leads on
 *   two such points can be neither open nor shorted;
 * - counting: each contact a pole closes in a position merges at most two
 *   points into one, so the undecided poles can remove at most Σ |touched
 *   lugs| points; a position still needing more merges than that fails.
 *   At the end no poles are undecided, so the count must be exact: the
 *   same test with zero available merges is the acceptance test;
 * - poles: a pole's closed contacts in one position all join one point, so
 *   a layout point still split into k points needs at least ⌈(k − 1)/w⌉
 *   undecided poles of its own (w: the most contacts one of them closes).
 * Nets are numbered in order of first use (restricted growth strings), so
 * each partition and each set of jumpers is tried once. The poles of one
 * switch are interchangeable: sort any plan's poles of a switch by their
 * lug values (jumper nets all read as one value, none lowest), renumber its
 * jumpers by first use, and it is still a plan that works; so only plans
 * whose poles are in that order are searched. A contact lug holding its
 * own common's net joins nothing and is not tried.
 */
import type { Network } from '../wiring/index.js';
import { FIXED_ITEMS, GROUND_ITEM, HOT_ITEM, minusItem, plusItem } from './element-terminals.js';
import { type SwitchKit, enumerateKitPoles, enumerateKitPositions } from './switch-kit.js';
import { enumerateTargetPartitions } from './target-partitions.js';

/** What a position should do. */
export type PositionWish =
  | { readonly kind: 'wiring'; readonly network: Network; readonly expression: string }
  | { readonly kind: 'off' }
  | { readonly kind: 'free' };

/** A found plan: which net each item and each lug is on. */
export interface SwitchPlan {
  readonly kit: SwitchKit;
  /** Fixed net of each item (0 = ground's net, 1 = hot's). */
  readonly itemNets: readonly number[];
  /** Number of fixed nets (those holding items); jumper nets follow them. */
  readonly fixedNetCount: number;
  /** Net on each lug, −1 for none, in kit-lug order: pole by pole, the common then contacts 1…K. */
  readonly lugNets: readonly number[];
  /** Nets after the fixed ones that join lugs only. */
  readonly jumperNetCount: number;
}

export interface SwitchPlanOptions {
  /** Search steps (a net tried on an item or a lug) before giving up unproven. Default 3 000 000. */
  readonly stepBudget: number;
  /**
   * May an unused element be shorted (both leads on one point)? Default true. Set false when coils
   * are magnetically coupled: a shorted coil then loads its neighbour, so unused elements must be open.
   */
  readonly allowShorted: boolean;
}

export const DEFAULT_SWITCH_PLAN_OPTIONS: Readonly<SwitchPlanOptions> = Object.freeze({ stepBudget: 3_000_000, allowShorted: true });

export interface SwitchPlanResult {
  /** found: a plan; impossible: proven none exists; unknown: the budget ran out first. */
  readonly status: 'found' | 'impossible' | 'unknown';
  readonly plan: SwitchPlan | null;
  readonly steps: number;
  /**
   * When impossible before any search: position `inner` (0-based) closes only
   * contacts that position `outer` also closes, so `outer` keeps every joint
   * `inner` makes, and no layout of the two wirings allows that.
   */
  readonly containment: { readonly inner: number; readonly outer: number } | null;
}

/** Does every pole close in `inner` only lugs it also closes in `outer`? */
function closesWithin(inner: readonly (readonly number[])[], outer: readonly (readonly number[])[]): boolean {
  return inner.every((lugs, q) => lugs.every((lug) => (outer[q] ?? []).includes(lug)));
}

/**
 * Can a position with partitions `inner` have its joints kept by one with
 * partitions `outer`? On the items both use, some inner partition must
 * refine some outer one (a necessary condition: points only merge).
 */
function refinesSomehow(inner: CompiledPosition, outer: CompiledPosition): boolean {
  const shared = inner.usedItems.filter((item) => outer.usedItems.includes(item));
  for (const a of inner.partitions) {
    for (const b of outer.partitions) {
      const map = new Map<number, number>();
      let fits = true;
      for (const item of shared) {
        const from = a[item] as number;
        const to = b[item] as number;
        const known = map.get(from);
        if (known === undefined) map.set(from, to);
        else if (known !== to) {
          fits = false;
          break;
        }
      }
      if (fits) return true;
    }
  }
  return false;
}

/** The lugs of each pole: first index of its common in the kit-lug order, and its contact count. */
export interface KitLugLayout {
  readonly poleBase: readonly number[];
  readonly contactCounts: readonly number[];
  readonly lugCount: number;
}

export function kitLugLayout(kit: SwitchKit): KitLugLayout {
  const poles = enumerateKitPoles(kit);
  const poleBase: number[] = [];
  const contactCounts: number[] = [];
  let next = 0;
  for (const pole of poles) {
    poleBase.push(next);
    const count = kit.switches[pole.switchIndex]?.contactLugs ?? 0;
    contactCounts.push(count);
    next += 1 + count;
  }
  return { poleBase, contactCounts, lugCount: next };
}

interface CompiledPosition {
  /** Kit position, 0-based. */
  readonly index: number;
  /** Elements whose leads must be open. */
  readonly open: readonly number[];
  /** Items of used elements plus hot and ground. */
  readonly usedItems: readonly number[];
  readonly partitions: readonly Int32Array[];
  /** Per pole, the contact lugs (0-based) touched. */
  readonly touched: readonly (readonly number[])[];
  /** available[q]: merges poles q… can still make. */
  readonly available: readonly number[];
  /** polesLeft[q]: poles q… that close some contact here; widest[q]: the most contacts one of them closes. */
  readonly polesLeft: readonly number[];
  readonly widest: readonly number[];
}

class Stop extends Error {}

/** Search for a plan; wishes beyond the kit's positions are an error of the caller. */
export function solveSwitchPlan(
  kit: SwitchKit,
  elementCount: number,
  wishes: readonly PositionWish[],
  options: Partial<SwitchPlanOptions> = {},
): SwitchPlanResult {
  const settings = { ...DEFAULT_SWITCH_PLAN_OPTIONS, ...options };
  const kitPositions = enumerateKitPositions(kit);
  if (wishes.length > kitPositions.length) throw new RangeError(`solveSwitchPlan: ${wishes.length} wishes for ${kitPositions.length} positions`);
  const poles = enumerateKitPoles(kit);
  const layout = kitLugLayout(kit);
  const items = FIXED_ITEMS + 2 * elementCount;
  const allElements = Array.from({ length: elementCount }, (_, e) => e);

  const compiled: CompiledPosition[] = [];
  wishes.forEach((wish, index) => {
    if (wish.kind === 'free') return;
    const position = kitPositions[index];
    if (position === undefined) return;
    const touched = poles.map((pole) => kit.switches[pole.switchIndex]?.positions[position.switchPositions[pole.switchIndex] ?? 0] ?? []);
    const available = new Array<number>(poles.length + 1).fill(0);
    const polesLeft = new Array<number>(poles.length + 1).fill(0);
    const widest = new Array<number>(poles.length + 1).fill(0);
    for (let q = poles.length - 1; q >= 0; q -= 1) {
      const closes = (touched[q] as readonly number[]).length;
      available[q] = (available[q + 1] as number) + closes;
      polesLeft[q] = (polesLeft[q + 1] as number) + (closes > 0 ? 1 : 0);
      widest[q] = Math.max(widest[q + 1] as number, closes);
    }
    if (wish.kind === 'off') {
      compiled.push({ index, open: allElements, usedItems: [], partitions: [], touched, available, polesLeft, widest });
      return;
    }
    const target = enumerateTargetPartitions(wish.network, elementCount);
    const used = new Set(target.used);
    compiled.push({
      index,
      open: allElements.filter((e) => !used.has(e)),
      usedItems: [GROUND_ITEM, HOT_ITEM, ...target.used.flatMap((e) => [plusItem(e), minusItem(e)])],
      partitions: target.partitions,
      touched,
      available,
      polesLeft,
      widest,
    });
  });

  for (const inner of compiled) {
    for (const outer of compiled) {
      if (inner === outer || inner.partitions.length === 0 || outer.partitions.length === 0) continue;
      if (closesWithin(inner.touched, outer.touched) && !refinesSomehow(inner, outer)) {
        return { status: 'impossible', plan: null, steps: 0, containment: { inner: inner.index, outer: outer.index } };
      }
    }
  }

  // Contact lugs that no position touches can hold nothing useful.
  const usefulContact = layout.contactCounts.map((count, q) => {
    const useful = new Array<boolean>(count).fill(false);
    for (const position of kitPositions) {
      const pole = poles[q];
      if (pole === undefined) continue;
      for (const lug of kit.switches[pole.switchIndex]?.positions[position.switchPositions[pole.switchIndex] ?? 0] ?? []) useful[lug] = true;
    }
    return useful;
  });

  const maxJumpers = Math.floor(layout.lugCount / 2);
  const itemNets = new Int32Array(items).fill(-1);
  const lugNets = new Int32Array(layout.lugCount).fill(-1);
  let fixedNets = 0;
  let jumpers = 0;
  let steps = 0;
  const netCapacity = items + maxJumpers;
  const parent = new Int32Array(netCapacity);
  const itemsOnPoint = new Int32Array(netCapacity);
  const pointNode = new Int32Array(netCapacity);
  const nodeSeen = new Int32Array(items);
  const pointsOnNode = new Int32Array(items);
  const find = (x: number): number => {
    let root = x;
    while (parent[root] !== root) root = parent[root] as number;
    while (parent[x] !== root) {
      const up = parent[x] as number;
      parent[x] = root;
      x = up;
    }
    return root;
  };
  const step = (): void => {
    steps += 1;
    if (steps > settings.stepBudget) throw new Stop();
  };

  /** Can this position still be met, with poles `fromPole`… undecided (poles.length: all decided)? */
  const positionHolds = (position: CompiledPosition, fromPole: number, decidedPoles: number): boolean => {
    const nets = fixedNets + jumpers;
    for (let n = 0; n < nets; n += 1) {
      parent[n] = n;
      itemsOnPoint[n] = 0;
    }
    for (let q = 0; q < decidedPoles; q += 1) {
      const base = layout.poleBase[q] as number;
      const common = lugNets[base] as number;
      if (common < 0) continue;
      for (const lug of position.touched[q] as readonly number[]) {
        const net = lugNets[base + 1 + lug] as number;
        if (net < 0) continue;
        const a = find(common);
        const b = find(net);
        if (a !== b) parent[a] = b;
      }
    }
    for (let item = 0; item < items; item += 1) {
      const net = itemNets[item] as number;
      if (net >= 0) {
        const point = find(net);
        itemsOnPoint[point] = (itemsOnPoint[point] as number) + 1;
      }
    }
    const final = fromPole === poles.length;
    const isolated = (net: number): boolean => net < 0 || (itemsOnPoint[find(net)] as number) === 1;
    if (position.partitions.length === 0) {
      if (!final) return true;
      for (const e of position.open) {
        const a = itemNets[plusItem(e)] as number;
        const b = itemNets[minusItem(e)] as number;
        if (!isolated(a) && !isolated(b) && (find(a) !== find(b) || !settings.allowShorted)) return false;
      }
      return true;
    }
    const available = position.available[fromPole] as number;
    for (const partition of position.partitions) {
      for (let n = 0; n < nets; n += 1) pointNode[n] = -1;
      nodeSeen.fill(0);
      let points = 0;
      let nodes = 0;
      let fits = true;
      for (const item of position.usedItems) {
        const net = itemNets[item] as number;
        if (net < 0) continue;
        const point = find(net);
        const node = partition[item] as number;
        const known = pointNode[point] as number;
        if (known < 0) {
          pointNode[point] = node;
          points += 1;
        } else if (known !== node) {
          fits = false;
          break;
        }
        if (nodeSeen[node] === 0) {
          nodeSeen[node] = 1;
          nodes += 1;
        }
      }
      if (!fits || points - nodes > available) continue;
      if (points > nodes) {
        // Each pole's contacts in one position stay inside one point, so a layout point still
        // split into k parts needs ⌈(k − 1)/widest⌉ poles of its own.
        const wide = position.widest[fromPole] as number;
        let polesNeeded = 0;
        pointsOnNode.fill(0);
        for (let n = 0; n < nets; n += 1) {
          const node = pointNode[n] as number;
          if (node >= 0 && parent[n] === n) pointsOnNode[node] = (pointsOnNode[node] as number) + 1;
        }
        for (let node = 0; node < items; node += 1) {
          const split = pointsOnNode[node] as number;
          if (split > 1) polesNeeded += Math.ceil((split - 1) / wide);
        }
        if (polesNeeded > (position.polesLeft[fromPole] as number)) continue;
      }
      // An unused element must end open (a lead alone) or shorted (both leads on one point).
      for (const e of position.open) {
        const a = itemNets[plusItem(e)] as number;
        const b = itemNets[minusItem(e)] as number;
        if (isolated(a) || isolated(b)) continue;
        if (!settings.allowShorted) {
          fits = false;
          break;
        }
        const pa = find(a);
        const pb = find(b);
        if (pa === pb) continue;
        const na = pointNode[pa] as number;
        const nb = pointNode[pb] as number;
        if (final || (na >= 0 && nb >= 0 && na !== nb)) {
          fits = false;
          break;
        }
      }
      if (fits) return true;
    }
    return false;
  };

  const allHold = (fromPole: number, decidedPoles: number): boolean => {
    for (const position of compiled) if (!positionHolds(position, fromPole, decidedPoles)) return false;
    return true;
  };
  // The positions in which pole q closes contact lug k: only they change when that lug gets a net.
  const touching = layout.contactCounts.map((count, q) =>
    Array.from({ length: count }, (_, lug) => compiled.filter((position) => (position.touched[q] ?? []).includes(lug))),
  );
  const touchedHold = (q: number, lug: number): boolean => {
    for (const position of touching[q]?.[lug] ?? []) if (!positionHolds(position, q, q + 1)) return false;
    return true;
  };

  let found: SwitchPlan | null = null;

  // The previous pole of the same switch (poles of one switch are interchangeable), or −1.
  const twinOf = poles.map((pole, q) => (q > 0 && poles[q - 1]?.switchIndex === pole.switchIndex ? q - 1 : -1));
  /** A lug value's rank for ordering poles: none lowest, then fixed nets, jumpers all alike. */
  const rank = (net: number): number => (net < 0 ? -1 : net < fixedNets ? net : fixedNets);
  /** With lug `lug` of pole q set to `net`, is pole q still ≥ its twin, comparing lug by lug? */
  const inOrder = (twin: number, q: number, lug: number, net: number): boolean => {
    const twinBase = layout.poleBase[twin] as number;
    const base = layout.poleBase[q] as number;
    for (let k = 0; k < lug; k += 1) {
      const a = rank(lugNets[twinBase + k] as number);
      const b = rank(lugNets[base + k] as number);
      if (b !== a) return b > a;
    }
    return rank(net) >= rank(lugNets[twinBase + lug] as number);
  };

  /** Lug `lug` of pole `q` (0 = common). */
  const searchLugs = (q: number, lug: number): boolean => {
    if (q === poles.length) {
      if (!allHold(poles.length, poles.length)) return false;
      found = {
        kit,
        itemNets: Array.from(itemNets),
        fixedNetCount: fixedNets,
        lugNets: Array.from(lugNets),
        jumperNetCount: jumpers,
      };
      return true;
    }
    const base = layout.poleBase[q] as number;
    const contacts = layout.contactCounts[q] as number;
    if (lug > contacts) return allHold(q + 1, q + 1) && searchLugs(q + 1, 0);
    if (lug > 0 && ((lugNets[base] as number) < 0 || !(usefulContact[q]?.[lug - 1] ?? false))) {
      lugNets[base + lug] = -1;
      return searchLugs(q, lug + 1);
    }
    // Values: fixed nets, existing jumpers, one new jumper (restricted growth), none.
    const choices = fixedNets + jumpers + (jumpers < maxJumpers ? 1 : 0);
    const twin = twinOf[q] as number;
    for (let value = 0; value <= choices; value += 1) {
      const net = value === 0 ? -1 : value - 1;
      if (lug > 0 && net >= 0 && net === lugNets[base]) continue;
      if (twin >= 0 && !inOrder(twin, q, lug, net)) continue;
      step();
      const isNew = net === fixedNets + jumpers;
      if (isNew) jumpers += 1;
      lugNets[base + lug] = net;
      // A common alone joins nothing, nor does an empty lug: only a contact lug with a net changes the points.
      if ((lug === 0 || net < 0 || touchedHold(q, lug - 1)) && searchLugs(q, lug + 1)) return true;
      lugNets[base + lug] = -1;
      if (isNew) jumpers -= 1;
    }
    return false;
  };

  // Items in search order: ground, hot, then every element's minus lead, then the plus leads, so
  // that the first plans tried put minus leads towards ground (coils in phase, not all reversed).
  const order = [GROUND_ITEM, HOT_ITEM, ...allElements.map(minusItem), ...allElements.map(plusItem)];
  /** The `k`-th item in search order joins an existing fixed net or starts the next one. */
  const searchItems = (k: number): boolean => {
    if (k === items) return searchLugs(0, 0);
    const item = order[k] as number;
    for (let net = 0; net <= fixedNets; net += 1) {
      if (item === HOT_ITEM && net === itemNets[GROUND_ITEM]) continue; // hot fixed to ground would silence every position
      step();
      const isNew = net === fixedNets;
      if (isNew) fixedNets += 1;
      itemNets[item] = net;
      if (allHold(0, 0) && searchItems(k + 1)) return true;
      itemNets[item] = -1;
      if (isNew) fixedNets -= 1;
    }
    return false;
  };

  try {
    const ok = searchItems(0);
    return { status: ok ? 'found' : 'impossible', plan: ok ? found : null, steps, containment: null };
  } catch (error) {
    if (error instanceof Stop) return { status: 'unknown', plan: null, steps, containment: null };
    throw error;
  }
}

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
 * - edges: a touched contact whose lug or common is undecided is an open
 *   edge that can still merge its common's point with one other point; all
 *   open edges of a pole lie in its common's component, so a layout node
 *   still split into k points needs k − 1 edges from its own poles and free
 *   ones (each free pole serving one node). With no open edge left the
 *   test demands an exact match: it is the acceptance test;
 * - containment: a position whose contacts another also closes keeps fewer
 *   joints; arc consistency over the positions' possible layouts, forced
 *   shorts against what containers keep apart, joints implied by contained
 *   positions (refreshDomains, forcedShortsFit);
 * - learning: a failed subtree's conflict set names what its failure
 *   depends on; states that agree there are not searched again (memoKey).
 * Items are decided first, then the lugs: every common, then contact lug 1
 * of every pole, then lug 2, … so each position settles early.
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
 * Can a layout `fine` of a position be kept by a layout `coarse` of a position that closes every
 * contact it closes (points only merge)? On the items both use, `fine` must refine `coarse`. And an
 * element only the contained position uses sits, in the container, between the points its leads'
 * nodes join: if both nodes hold items the container uses, and the container keeps those apart,
 * the element is there neither open (each lead shares its point) nor shorted.
 */
function keepsLayout(fine: Int32Array, coarse: Int32Array, shared: readonly number[], onlyInner: readonly number[]): boolean {
  for (const i of shared) for (const j of shared) if (fine[i] === fine[j] && coarse[i] !== coarse[j]) return false;
  for (const element of onlyInner) {
    const plusNode = fine[plusItem(element)] as number;
    const minusNode = fine[minusItem(element)] as number;
    const onPlus = shared.find((item) => fine[item] === plusNode);
    const onMinus = shared.find((item) => fine[item] === minusNode);
    if (onPlus !== undefined && onMinus !== undefined && coarse[onPlus] !== coarse[onMinus]) return false;
  }
  return true;
}

/** Shared used items of two positions, and the elements only the first uses. */
function containmentItems(inner: CompiledPosition, outer: CompiledPosition): { shared: number[]; onlyInner: number[] } {
  return {
    shared: inner.usedItems.filter((item) => outer.usedItems.includes(item)),
    onlyInner: inner.usedElements.filter((element) => !outer.usedElements.includes(element)),
  };
}

/** Can some layout of `inner` be kept by some layout of `outer`? */
function refinesSomehow(inner: CompiledPosition, outer: CompiledPosition): boolean {
  const { shared, onlyInner } = containmentItems(inner, outer);
  return inner.partitions.some((fine) => outer.partitions.some((coarse) => keepsLayout(fine, coarse, shared, onlyInner)));
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
  readonly usedElements: readonly number[];
  readonly partitions: readonly Int32Array[];
  /** Per pole, the contact lugs (0-based) touched. */
  readonly touched: readonly (readonly number[])[];
  /**
   * Positions with a wiring that close every contact this one closes (itself included), each with the pairs of its
   * used items that no layout of its wiring puts on one point (neverTogether[i·items + j] = 1).
   */
  containers: { readonly index: number; readonly neverTogether: Uint8Array }[];
  /** Positions with a wiring whose contacts this one also closes: every joint they make, this one makes too. */
  contained: CompiledPosition[];
  /** The layout partitions still possible with the items decided so far (see refreshDomains). */
  domain: Int32Array[];
  /**
   * Item pairs (flat: i, j, i, j, …) that every layout of a contained position still possible with
   * the items' fixed nets joins (refreshed as the items are decided).
   */
  implied: number[];
}

class Stop extends Error {}

/** A lug not decided yet (the search's own marker; a finished plan has none). */
const UNDECIDED = -2;
/** A lug left empty. */
const NONE = -1;

/**
 * The same plan without jumpers that join nothing: a jumper net on one contact lug only (the lug
 * is left empty instead; it changes no position), the rest renumbered by first use.
 */
function tidyJumpers(kit: SwitchKit, itemNets: readonly number[], fixedNets: number, lugNets: readonly number[], poleBase: readonly number[]): SwitchPlan {
  const uses = new Map<number, number>();
  for (const net of lugNets) if (net >= fixedNets) uses.set(net, (uses.get(net) ?? 0) + 1);
  const commons = new Set(poleBase.map((base) => lugNets[base] as number));
  const renamed = new Map<number, number>();
  const tidy = lugNets.map((net) => {
    if (net < fixedNets) return net;
    if ((uses.get(net) ?? 0) < 2 && !commons.has(net)) return NONE;
    if (!renamed.has(net)) renamed.set(net, fixedNets + renamed.size);
    return renamed.get(net) as number;
  });
  return { kit, itemNets, fixedNetCount: fixedNets, lugNets: tidy, jumperNetCount: renamed.size };
}

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
    if (wish.kind === 'off') {
      compiled.push({ index, open: allElements, usedItems: [], usedElements: [], partitions: [], touched, containers: [], contained: [], domain: [], implied: [] });
      return;
    }
    const target = enumerateTargetPartitions(wish.network, elementCount);
    const used = new Set(target.used);
    compiled.push({
      index,
      open: allElements.filter((e) => !used.has(e)),
      usedItems: [GROUND_ITEM, HOT_ITEM, ...target.used.flatMap((e) => [plusItem(e), minusItem(e)])],
      usedElements: target.used,
      partitions: target.partitions,
      touched,
      containers: [],
      contained: [],
      domain: [...target.partitions],
      implied: [],
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

  // A position contained in another keeps fewer joints: its points refine the container's, so an
  // element it must short (both leads on points with other items) cannot join what the container
  // keeps apart. A position with a wiring is its own first container.
  for (const inner of compiled) {
    for (const outer of compiled) {
      if (outer.partitions.length === 0 || !closesWithin(inner.touched, outer.touched)) continue;
      const neverTogether = new Uint8Array(items * items);
      for (const i of outer.usedItems) {
        for (const j of outer.usedItems) {
          if (outer.partitions.every((partition) => partition[i] !== partition[j])) neverTogether[i * items + j] = 1;
        }
      }
      inner.containers.push({ index: outer.index, neverTogether });
    }
  }
  for (const inner of compiled) {
    if (inner.partitions.length === 0) continue;
    for (const outer of compiled) if (inner !== outer && closesWithin(inner.touched, outer.touched)) outer.contained.push(inner);
  }

  // Contact lugs that no position with a wish touches can hold nothing useful (a lug touched only
  // in free positions changes nothing that is asked for).
  const usefulContact = layout.contactCounts.map((count, q) => {
    const useful = new Array<boolean>(count).fill(false);
    for (const position of compiled) for (const lug of position.touched[q] ?? []) useful[lug] = true;
    return useful;
  });

  // Every jumper net starts on a lug, so there are never more jumpers than lugs.
  const maxJumpers = layout.lugCount;
  const itemNets = new Int32Array(items).fill(-1);
  const lugNets = new Int32Array(layout.lugCount).fill(UNDECIDED);
  let fixedNets = 0;
  let jumpers = 0;
  let steps = 0;
  const netCapacity = items + maxJumpers;
  const parent = new Int32Array(netCapacity);
  const itemsOnPoint = new Int32Array(netCapacity);
  const pointNode = new Int32Array(netCapacity);
  const nodeSplit = new Int32Array(items);
  const dedicated = new Int32Array(items);
  const poleOpen = new Int32Array(poles.length);
  const shorted = new Int32Array(netCapacity);
  const findShorted = (x: number): number => {
    while (shorted[x] !== x) x = shorted[x] as number;
    return x;
  };
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

  /**
   * Can this position still be met? Decided contacts are applied; a touched
   * contact whose lug or common is undecided is an open edge: it may still
   * merge its common's point with one other point.
   */
  const positionHolds = (position: CompiledPosition): boolean => {
    const nets = fixedNets + jumpers;
    for (let n = 0; n < nets; n += 1) {
      parent[n] = n;
      itemsOnPoint[n] = 0;
    }
    let openEdges = 0;
    for (let q = 0; q < poles.length; q += 1) {
      poleOpen[q] = 0;
      const base = layout.poleBase[q] as number;
      const common = lugNets[base] as number;
      if (common === NONE) continue;
      let open = 0;
      for (const lug of position.touched[q] as readonly number[]) {
        const net = lugNets[base + 1 + lug] as number;
        if (net === NONE) continue;
        if (net === UNDECIDED || common === UNDECIDED) {
          open += 1;
          continue;
        }
        const a = find(common);
        const b = find(net);
        if (a !== b) parent[a] = b;
      }
      poleOpen[q] = open;
      openEdges += open;
    }
    // Joints a contained position must make are made here too (its contacts are closed here).
    for (let k = 0; k < position.implied.length; k += 2) {
      const a = itemNets[position.implied[k] as number] as number;
      const b = itemNets[position.implied[k + 1] as number] as number;
      if (a < 0 || b < 0) continue;
      const ra = find(a);
      const rb = find(b);
      if (ra !== rb) parent[ra] = rb;
    }
    for (let item = 0; item < items; item += 1) {
      const net = itemNets[item] as number;
      if (net >= 0) {
        const point = find(net);
        itemsOnPoint[point] = (itemsOnPoint[point] as number) + 1;
      }
    }
    const final = openEdges === 0;
    const isolated = (net: number): boolean => net < 0 || (itemsOnPoint[find(net)] as number) === 1;
    if (position.containers.length > 0 && position.open.length > 0 && !forcedShortsFit(position, nets, isolated)) return false;
    if (position.partitions.length === 0) {
      if (!final) return true;
      for (const e of position.open) {
        const a = itemNets[plusItem(e)] as number;
        const b = itemNets[minusItem(e)] as number;
        if (!isolated(a) && !isolated(b) && (find(a) !== find(b) || !settings.allowShorted)) return false;
      }
      return true;
    }
    for (const partition of position.domain) {
      for (let n = 0; n < nets; n += 1) pointNode[n] = -1;
      nodeSplit.fill(0);
      let fits = true;
      for (const item of position.usedItems) {
        const net = itemNets[item] as number;
        if (net < 0) continue;
        const point = find(net);
        const node = partition[item] as number;
        const known = pointNode[point] as number;
        if (known < 0) {
          pointNode[point] = node;
          nodeSplit[node] = (nodeSplit[node] as number) + 1;
        } else if (known !== node) {
          fits = false;
          break;
        }
      }
      if (!fits) continue;
      if (!final) {
        // Every open edge of a pole lies in its common's component. A pole whose common sits on a
        // point with used leads serves that point's layout node only ("dedicated"); any other pole
        // (common undecided, or on a point without used leads) serves one node of its choice. A node
        // split into k points needs k − 1 edges in its component.
        dedicated.fill(0);
        let freeEdges = 0;
        let freePoles = 0;
        let freeWidest = 0;
        for (let q = 0; q < poles.length; q += 1) {
          const open = poleOpen[q] as number;
          if (open === 0) continue;
          const common = lugNets[layout.poleBase[q] as number] as number;
          const node = common >= 0 ? (pointNode[find(common)] as number) : -1;
          if (node >= 0) dedicated[node] = (dedicated[node] as number) + open;
          else {
            freeEdges += open;
            freePoles += 1;
            freeWidest = Math.max(freeWidest, open);
          }
        }
        let deficitSum = 0;
        let polesNeeded = 0;
        for (let node = 0; node < items && fits; node += 1) {
          const deficit = (nodeSplit[node] as number) - 1 - (dedicated[node] as number);
          if (deficit <= 0) continue;
          if (freeWidest === 0) fits = false;
          deficitSum += deficit;
          polesNeeded += Math.ceil(deficit / freeWidest);
        }
        if (!fits || deficitSum > freeEdges || polesNeeded > freePoles) continue;
      } else {
        let split = false;
        for (let node = 0; node < items; node += 1) if ((nodeSplit[node] as number) > 1) split = true;
        if (split) continue;
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

  /**
   * Points only merge, so an unused element whose leads both share their points with other items
   * can only end shorted: its two points must merge. Those merges, all together, must not join
   * two items that a containing position keeps apart.
   */
  const forcedShortsFit = (position: CompiledPosition, nets: number, isolated: (net: number) => boolean): boolean => {
    for (let n = 0; n < nets; n += 1) shorted[n] = n;
    let any = false;
    for (const e of position.open) {
      const a = itemNets[plusItem(e)] as number;
      const b = itemNets[minusItem(e)] as number;
      if (isolated(a) || isolated(b)) continue;
      const pa = findShorted(find(a));
      const pb = findShorted(find(b));
      if (pa !== pb) {
        shorted[pa] = pb;
        any = true;
      }
    }
    if (!any) return true;
    for (const container of position.containers) {
      for (let i = 0; i < items; i += 1) {
        const ni = itemNets[i] as number;
        if (ni < 0) continue;
        const ri = findShorted(find(ni));
        for (let j = i + 1; j < items; j += 1) {
          const nj = itemNets[j] as number;
          if (nj < 0 || container.neverTogether[i * items + j] === 0) continue;
          if (findShorted(find(nj)) === ri) return false;
        }
      }
    }
    return true;
  };

  /**
   * The joints a contained position must make: items its every layout still possible joins. A
   * layout is possible while it puts the items of each fixed net on one point.
   */
  const netNode = new Int32Array(items);
  /**
   * Each position's possible layouts, and the joints they imply. A layout is possible while it
   * puts the items of each fixed net on one point, and while every contained position has a
   * possible layout that refines it (on the items both use) and every container one that it
   * refines: arc consistency over the positions' layouts (A. K. Mackworth, "Consistency in
   * networks of relations", Artificial Intelligence 8, 99–118, 1977). Returns false when some
   * position has no layout left: then no lug wiring can help these fixed nets. The implied joints
   * of a position: pairs of items that every possible layout of a position it contains joins.
   */
  const shared = new Map<string, { shared: number[]; onlyInner: number[] }>();
  for (const outer of compiled) {
    for (const inner of outer.contained) shared.set(`${inner.index}/${outer.index}`, containmentItems(inner, outer));
  }
  const refreshDomains = (): boolean => {
    for (const position of compiled) {
      if (position.partitions.length === 0) continue;
      position.domain = position.partitions.filter((partition) => {
        netNode.fill(-1);
        for (const item of position.usedItems) {
          const net = itemNets[item] as number;
          if (net < 0) continue;
          const node = partition[item] as number;
          if ((netNode[net] as number) < 0) netNode[net] = node;
          else if (netNode[net] !== node) return false;
        }
        return true;
      });
    }
    for (let changed = true; changed; ) {
      changed = false;
      for (const outer of compiled) {
        if (outer.partitions.length === 0) continue; // off: no layout to refine
        for (const inner of outer.contained) {
          const both = shared.get(`${inner.index}/${outer.index}`) as { shared: number[]; onlyInner: number[] };
          const innerKept = inner.domain.filter((fine) => outer.domain.some((coarse) => keepsLayout(fine, coarse, both.shared, both.onlyInner)));
          const outerKept = outer.domain.filter((coarse) => innerKept.some((fine) => keepsLayout(fine, coarse, both.shared, both.onlyInner)));
          if (innerKept.length !== inner.domain.length || outerKept.length !== outer.domain.length) changed = true;
          inner.domain = innerKept;
          outer.domain = outerKept;
        }
      }
    }
    for (const outer of compiled) {
      outer.implied.length = 0;
      for (const inner of outer.contained) {
        for (const i of inner.usedItems) {
          if ((itemNets[i] as number) < 0) continue;
          for (const j of inner.usedItems) {
            if (i < j && (itemNets[j] as number) >= 0 && inner.domain.every((partition) => partition[i] === partition[j])) outer.implied.push(i, j);
          }
        }
      }
    }
    return compiled.every((position) => position.partitions.length === 0 || position.domain.length > 0);
  };


  // Conflict sets: the positions whose test cut some branch of the subtree being searched (bit i for
  // the i-th compiled position; the last bit stands for every position from there on), and the
  // poles whose order against their twin cut one. Thirty bits keep the masks within bitwise integers.
  const CONFLICT_BITS = 30;
  const conflictBit = compiled.map((_, i) => 1 << Math.min(i, CONFLICT_BITS - 1));
  const bitOf = new Map(compiled.map((position, i) => [position, conflictBit[i] as number]));
  let conflict = 0;
  let orderConflict = 0;
  const holdAll = (positions: readonly CompiledPosition[]): boolean => {
    for (const position of positions) {
      if (!positionHolds(position)) {
        conflict |= bitOf.get(position) as number;
        return false;
      }
    }
    return true;
  };
  const allHold = (): boolean => holdAll(compiled);
  // The positions in which pole q closes some contact (they change when its common is decided),
  // and those in which it closes contact lug k (they change when that lug is decided).
  const poleTouching = poles.map((_, q) => compiled.filter((position) => (position.touched[q] ?? []).length > 0));
  const touching = layout.contactCounts.map((count, q) =>
    Array.from({ length: count }, (_, lug) => compiled.filter((position) => (position.touched[q] ?? []).includes(lug))),
  );

  // Lugs in search order: every common first, then contact lug 1 of every pole, then lug 2, … so
  // that a position is settled as soon as the lugs it touches are (a lever's position 1 after the
  // commons and the first contacts), and the bounds above bite early.
  const lugOrder: { readonly q: number; readonly lug: number }[] = poles.map((_, q) => ({ q, lug: 0 }));
  const mostContacts = layout.contactCounts.reduce((most, count) => Math.max(most, count), 0);
  for (let k = 1; k <= mostContacts; k += 1) {
    layout.contactCounts.forEach((count, q) => {
      if (count >= k) lugOrder.push({ q, lug: k });
    });
  }

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
  // Lugs that decide each position: the commons of the poles that close a contact in it, and those contacts.
  const positionLugs = compiled.map((position) =>
    poles.flatMap((_, q) => {
      const touched = position.touched[q] ?? [];
      if (touched.length === 0) return [];
      const base = layout.poleBase[q] as number;
      return [base, ...touched.map((lug) => base + 1 + lug)];
    }),
  );
  const relevant = new Uint8Array(layout.lugCount);
  const jumperName = new Int32Array(layout.lugCount + items + 1);
  /**
   * Failed subtrees (nogoods, cleared for each partition of the items), by what their failure
   * depends on. Every branch of a failed subtree was cut by the test of some position (its conflict
   * set) or by the order of some pole against its twin. A position's test reads only the items and
   * its own lugs (the commons of the poles that close a contact in it, and those contacts); so any
   * other state with the same values on the conflict positions' lugs (jumper nets named by first
   * appearance: a jumper on none of those lugs is, to them, an empty net like a new one) and the
   * same order state of those poles against their twins (already above it, or tied with the rank
   * of the twin's lug where the tie is decided next) fails in the same way: the same branches are
   * cut by the same tests. This is conflict-directed learning (R. Dechter, Artificial Intelligence
   * 41, 273–312, 1990); it keeps the search complete.
   */
  const nogoods = new Map<number, Map<string, Set<string>>>();
  let nogoodCount = 0;
  const memoKey = (t: number, positionsMask: number, polesMask: number): string => {
    relevant.fill(0);
    positionLugs.forEach((lugs, i) => {
      if ((positionsMask & (conflictBit[i] as number)) !== 0) for (const lug of lugs) relevant[lug] = 1;
    });
    jumperName.fill(-1);
    let named = 0;
    let key = '';
    for (let lug = 0; lug < layout.lugCount; lug += 1) {
      if (relevant[lug] === 0) continue;
      const net = lugNets[lug] as number;
      if (net >= fixedNets) {
        if ((jumperName[net] as number) < 0) jumperName[net] = named++;
        key += `,j${jumperName[net] as number}`;
      } else key += `,${net}`;
    }
    for (let q = 0; q < poles.length; q += 1) {
      const twin = twinOf[q] as number;
      if (twin < 0 || (polesMask & (1 << Math.min(q, CONFLICT_BITS - 1))) === 0) continue;
      const twinBase = layout.poleBase[twin] as number;
      const base = layout.poleBase[q] as number;
      const lugs = 1 + (layout.contactCounts[q] as number);
      let state = '=';
      for (let k = 0; k < lugs; k += 1) {
        const mine = lugNets[base + k] as number;
        const theirs = lugNets[twinBase + k] as number;
        if (mine === UNDECIDED) {
          state = theirs === UNDECIDED ? '=' : `=${rank(theirs)}`;
          break;
        }
        if (rank(mine) !== rank(theirs)) {
          state = '>';
          break;
        }
      }
      key += `|${q}${state}`;
    }
    return key;
  };
  /** Nogoods kept before the memo is emptied (our choice: bounds memory to tens of megabytes). */
  const MEMO_CAPACITY = 200_000;
  /** The `t`-th lug in search order. */
  const searchLugs = (t: number): boolean => {
    if (t <= poles.length || t >= lugOrder.length) return searchLugsFrom(t);
    const atT = nogoods.get(t);
    if (atT !== undefined) {
      for (const [masks, keys] of atT) {
        const [positionsMask, polesMask] = masks.split('/').map(Number) as [number, number];
        if (keys.has(memoKey(t, positionsMask, polesMask))) {
          conflict = conflict | positionsMask;
          orderConflict = orderConflict | polesMask;
          return false;
        }
      }
    }
    const outerConflict = conflict;
    const outerOrder = orderConflict;
    conflict = 0;
    orderConflict = 0;
    const ok = searchLugsFrom(t);
    const innerConflict = conflict;
    const innerOrder = orderConflict;
    conflict = outerConflict | innerConflict;
    orderConflict = outerOrder | innerOrder;
    if (!ok) {
      if (nogoodCount >= MEMO_CAPACITY) {
        nogoods.clear();
        nogoodCount = 0;
      }
      const masks = `${innerConflict}/${innerOrder}`;
      let atTime = nogoods.get(t);
      if (atTime === undefined) nogoods.set(t, (atTime = new Map()));
      let keys = atTime.get(masks);
      if (keys === undefined) atTime.set(masks, (keys = new Set()));
      keys.add(memoKey(t, innerConflict, innerOrder));
      nogoodCount += 1;
    }
    return ok;
  };
  const searchLugsFrom = (t: number): boolean => {
    if (t === lugOrder.length) {
      if (!allHold()) return false;
      found = tidyJumpers(kit, Array.from(itemNets), fixedNets, Array.from(lugNets), layout.poleBase);
      return true;
    }
    const { q, lug } = lugOrder[t] as { q: number; lug: number };
    const base = layout.poleBase[q] as number;
    if (lug > 0 && ((lugNets[base] as number) === NONE || !(usefulContact[q]?.[lug - 1] ?? false))) {
      lugNets[base + lug] = NONE;
      if (searchLugs(t + 1)) return true;
      lugNets[base + lug] = UNDECIDED;
      return false;
    }
    // Values: fixed nets, existing jumpers, one new jumper (restricted growth), none.
    const choices = fixedNets + jumpers + 1;
    const twin = twinOf[q] as number;
    const affected = lug === 0 ? (poleTouching[q] ?? []) : (touching[q]?.[lug - 1] ?? []);
    for (let value = 0; value <= choices; value += 1) {
      const net = value === 0 ? NONE : value - 1;
      if (lug > 0 && net >= 0 && net === lugNets[base]) continue;
      if (twin >= 0 && !inOrder(twin, q, lug, net)) {
        orderConflict |= 1 << Math.min(q, CONFLICT_BITS - 1);
        continue;
      }
      step();
      const isNew = net === fixedNets + jumpers;
      if (isNew) jumpers += 1;
      lugNets[base + lug] = net;
      if (holdAll(affected) && searchLugs(t + 1)) return true;
      lugNets[base + lug] = UNDECIDED;
      if (isNew) jumpers -= 1;
    }
    return false;
  };

  // Items in search order: ground, hot, then every element's minus lead, then the plus leads, so
  // that the first plans tried put minus leads towards ground (coils in phase, not all reversed).
  const order = [GROUND_ITEM, HOT_ITEM, ...allElements.map(minusItem), ...allElements.map(plusItem)];
  /** The `k`-th item in search order joins an existing fixed net or starts the next one. */
  const searchItems = (k: number): boolean => {
    if (k === items) {
      nogoods.clear();
      nogoodCount = 0;
      if (!refreshDomains()) return false;
      return searchLugs(0);
    }
    const item = order[k] as number;
    for (let net = 0; net <= fixedNets; net += 1) {
      if (item === HOT_ITEM && net === itemNets[GROUND_ITEM]) continue; // hot fixed to ground would silence every position
      step();
      const isNew = net === fixedNets;
      if (isNew) fixedNets += 1;
      itemNets[item] = net;
      if (refreshDomains() && allHold() && searchItems(k + 1)) return true;
      itemNets[item] = -1;
      if (isNew) fixedNets -= 1;
    }
    return false;
  };

  // The layouts' consistency with no item decided yet: a refusal here costs no search step.
  if (!refreshDomains()) return { status: 'impossible', plan: null, steps: 0, containment: null };
  try {
    const ok = searchItems(0);
    return { status: ok ? 'found' : 'impossible', plan: ok ? found : null, steps, containment: null };
  } catch (error) {
    if (error instanceof Stop) return { status: 'unknown', plan: null, steps, containment: null };
    throw error;
  }
}

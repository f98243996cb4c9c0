/**
 * The things a switch plan connects: the hot point (volume pot input), the
 * ground bus, and the two leads of every wiring element (a coil on its own
 * leads, or a two-lead pickup whose coils the maker joined inside).
 *
 * Items are numbered 0 = ground, 1 = hot, then two per element:
 * 2 + 2e is the lead that goes towards hot when the element is in phase
 * (its "plus" lead), 3 + 2e the other. For a coil the plus lead is its
 * finish when winding × magnet = +1 and its start otherwise
 * (circuit/coil-signs.ts: c = p·w·m, c = +1 puts the finish towards hot).
 */
import type { Coil, Guitar } from '../guitar/index.js';
import { type CircuitGraph, type GraphCoil, type Lead, connectionSign } from '../circuit/index.js';

export const GROUND_ITEM = 0;
export const HOT_ITEM = 1;
/** Items before the first element lead. */
export const FIXED_ITEMS = 2;

export function plusItem(element: number): number {
  return FIXED_ITEMS + 2 * element;
}

export function minusItem(element: number): number {
  return FIXED_ITEMS + 2 * element + 1;
}

export function itemCount(guitar: Pick<Guitar, 'elements'>): number {
  return FIXED_ITEMS + 2 * guitar.elements.length;
}

/** A lead of one coil: the coil and which end. */
export interface CoilLead {
  readonly coil: Coil;
  readonly lead: Lead;
}

/** The coil lead behind an item (for a two-lead pickup: the outer lead of its first or last coil). */
export function coilLeadOf(guitar: Guitar, item: number): CoilLead | null {
  if (item < FIXED_ITEMS) return null;
  const element = guitar.elements[(item - FIXED_ITEMS) >> 1];
  if (element === undefined) return null;
  const plus = (item - FIXED_ITEMS) % 2 === 0;
  const coils = element.coilIndices.map((index) => guitar.coils[index] as Coil);
  const coil = (plus ? coils[0] : coils[coils.length - 1]) as Coil;
  const finishTowardsHot = connectionSign(1, coil.winding, coil.magnet) === 1;
  // In phase, the plus lead of the element is the coil's lead towards hot.
  const lead: Lead = plus === finishTowardsHot ? 'finish' : 'start';
  return { coil, lead };
}

/** How an item reads on a build sheet: "hot", "ground", "neck finish", "bridge (two-lead) lead from bridge_screw start". */
export function describeItem(guitar: Guitar, item: number): string {
  if (item === GROUND_ITEM) return 'ground';
  if (item === HOT_ITEM) return 'hot';
  const element = guitar.elements[(item - FIXED_ITEMS) >> 1];
  const lead = coilLeadOf(guitar, item);
  if (element === undefined || lead === null) return `item ${item}`;
  if (element.kind === 'two-lead pickup') return `${element.id} lead (${lead.coil.id} ${lead.lead})`;
  return `${lead.coil.id} ${lead.lead}`;
}

/**
 * The circuit of one position from the component of every item
 * (`componentOf[item]`, any numbering): one node per component that holds an
 * item, and inside a two-lead pickup a node for each joint the maker made.
 * A lead alone on its component is floating (null). This is the nodal
 * solver's circuit graph (circuit/circuit-graph.ts).
 */
export function circuitOfComponents(guitar: Guitar, componentOf: ArrayLike<number>): CircuitGraph {
  const count = new Map<number, number>();
  for (let item = 0; item < itemCount(guitar); item += 1) {
    const component = componentOf[item] as number;
    count.set(component, (count.get(component) ?? 0) + 1);
  }
  const nodeOfComponent = new Map<number, number>();
  const names: string[] = [];
  const nodeOf = (item: number): number | null => {
    const component = componentOf[item] as number;
    if (item >= FIXED_ITEMS && count.get(component) === 1) return null;
    const known = nodeOfComponent.get(component);
    if (known !== undefined) return known;
    nodeOfComponent.set(component, names.length);
    names.push(describeItem(guitar, item));
    return names.length - 1;
  };
  const ground = nodeOf(GROUND_ITEM) as number;
  const hot = nodeOf(HOT_ITEM) as number;
  names[ground] = 'ground';
  if (hot !== ground) names[hot] = 'hot';
  const coils: GraphCoil[] = [];
  guitar.elements.forEach((element, e) => {
    const plusNode = nodeOf(plusItem(e));
    const minusNode = nodeOf(minusItem(e));
    const inside = element.coilIndices;
    // In-phase chain from the plus lead to the minus lead: each coil's lead towards hot first (connection c = w·m).
    let from = plusNode;
    inside.forEach((coilIndex, k) => {
      const coil = guitar.coils[coilIndex] as Coil;
      let to: number | null;
      if (k === inside.length - 1) to = minusNode;
      else {
        to = names.length;
        names.push(`${element.id} inside joint ${k + 1}`);
      }
      const finishTowardsHot = connectionSign(1, coil.winding, coil.magnet) === 1;
      coils.push(finishTowardsHot ? { coil: coilIndex, start: to, finish: from } : { coil: coilIndex, start: from, finish: to });
      from = to;
    });
  });
  return { nodeCount: names.length, hot, ground, coils, nodeNames: names };
}

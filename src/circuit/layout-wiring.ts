/**
 * Where every lead of every coil goes in a wiring: the common ground of the
 * netlist and the build sheet.
 *
 * Nodes: "hot" (the network's + end, which goes to the volume pot's input
 * lug), "ground" (its − end) and junctions "j1", "j2", … between parts in
 * series. A series group lists its parts from the hot end to the ground end
 * in the order written; a parallel group's parts share its two nodes. A
 * two-lead pickup's coils are in series inside it, in declaration order, with
 * their string signals in phase. Each coil's connection follows
 * coil-signs.ts: c = p·w·m, and c = +1 puts the finish lead on the + side.
 */
import type { Coil, Guitar, WiringElement } from '../guitar/index.js';
import type { Network } from '../wiring/index.js';
import { type Sign, connectionSign, humSign, phaseSign } from './coil-signs.js';

export const HOT_NODE = 'hot';
export const GROUND_NODE = 'ground';

export type Lead = 'start' | 'finish';

export interface CoilPlacement {
  readonly coil: Coil;
  readonly element: WiringElement;
  /** p: +1 in phase, −1 written `~`. */
  readonly phase: Sign;
  /** c: +1 finish lead on the + side. */
  readonly connection: Sign;
  /** Sign of the hum EMF entering the network, p·m. */
  readonly humSign: Sign;
  /** Node on the hot side of this coil, and on the ground side. */
  readonly plusNode: string;
  readonly minusNode: string;
  /** The lead on the + side and the lead on the − side. */
  readonly plusLead: Lead;
  readonly minusLead: Lead;
  /** Inside a two-lead pickup, the joints are made by the maker. */
  readonly internal: { readonly plus: boolean; readonly minus: boolean };
}

export interface WiringLayout {
  /** Coils in the order met from the hot end. */
  readonly placements: readonly CoilPlacement[];
  /** Junction nodes made by the wiring, in order ("j1", …). */
  readonly junctions: readonly string[];
  /** Coils not used: disconnected. */
  readonly unused: readonly Coil[];
}

/** Lay out a network on a guitar (any network of its elements, canonical or not). */
export function layoutWiring(guitar: Guitar, network: Network): WiringLayout {
  const placements: CoilPlacement[] = [];
  const junctions: string[] = [];
  let internalCount = 0;
  const newJunction = (): string => {
    const name = `j${junctions.length + 1}`;
    junctions.push(name);
    return name;
  };
  const place = (node: Network, plus: string, minus: string): void => {
    if (node.kind === 'element') {
      const element = guitar.elements[node.element];
      if (element === undefined) throw new RangeError(`layoutWiring: no element ${node.element}`);
      const phase = phaseSign(node.inverted);
      const coils = element.coilIndices.map((index) => guitar.coils[index] as Coil);
      // Nodes inside a two-lead pickup are its own (made by the maker), named after the pickup.
      const inner = coils.slice(1).map(() => {
        internalCount += 1;
        return `${element.id}:inside${internalCount}`;
      });
      const nodes = [plus, ...inner, minus];
      coils.forEach((coil, k) => {
        const connection = connectionSign(phase, coil.winding, coil.magnet);
        placements.push({
          coil,
          element,
          phase,
          connection,
          humSign: humSign(phase, coil.magnet),
          plusNode: nodes[k] as string,
          minusNode: nodes[k + 1] as string,
          plusLead: connection === 1 ? 'finish' : 'start',
          minusLead: connection === 1 ? 'start' : 'finish',
          internal: { plus: k > 0, minus: k < coils.length - 1 },
        });
      });
      return;
    }
    if (node.kind === 'parallel') {
      for (const part of node.parts) place(part, plus, minus);
      return;
    }
    let from = plus;
    node.parts.forEach((part, k) => {
      const to = k === node.parts.length - 1 ? minus : newJunction();
      place(part, from, to);
      from = to;
    });
  };
  place(network, HOT_NODE, GROUND_NODE);
  const used = new Set(placements.map((placement) => placement.coil.index));
  return { placements, junctions, unused: guitar.coils.filter((coil) => !used.has(coil.index)) };
}

/** DC resistance of a network's coils between hot and ground: series adds, parallel adds conductances (Ohm's law). */
export function networkResistanceOhms(guitar: Guitar, network: Network): number {
  if (network.kind === 'element') {
    const element = guitar.elements[network.element];
    if (element === undefined) throw new RangeError(`networkResistanceOhms: no element ${network.element}`);
    return element.coilIndices.reduce((sum, index) => sum + (guitar.coils[index]?.resistanceOhms ?? 0), 0);
  }
  const parts = network.parts.map((part) => networkResistanceOhms(guitar, part));
  if (network.kind === 'series') return parts.reduce((sum, value) => sum + value, 0);
  return 1 / parts.reduce((sum, value) => sum + 1 / value, 0);
}

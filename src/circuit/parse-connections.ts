/**
 * A connection list: any connection of coil leads written out joint by joint,
 * for circuits that are not series–parallel (bridge networks) or that a
 * switch makes. Our own plain syntax:
 *
 *   neck.finish = hot, neck.start = mid.finish = bridge.start, mid.start = ground, bridge.finish = ground
 *
 * - Joints are separated by commas; the terminals of one joint by "=".
 * - A terminal is `hot` (the volume pot's input), `ground`, or a coil lead
 *   `<coil id>.start` / `<coil id>.finish` (the ends of its winding).
 * - Joints that share a terminal are one joint. A lead not written is left
 *   floating (insulated): that coil contributes nothing.
 * - Coils inside a two-lead pickup have no leads of their own to name.
 */
import { InputError } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import type { CircuitGraph, GraphCoil } from './circuit-graph.js';
import { GROUND_NODE, HOT_NODE } from './layout-wiring.js';

const LEADS = ['start', 'finish'] as const;

/** Parse a connection list for `guitar` into a graph. Throws InputError naming `path` for anything it cannot read. */
export function parseConnections(guitar: Guitar, text: string, path = 'connections'): CircuitGraph {
  const coilIds = new Map(guitar.coils.map((coil) => [coil.id, coil.index]));
  const insideTwoLead = new Set(guitar.pickups.filter((pickup) => pickup.leads === 2).flatMap((pickup) => pickup.coilIndices));
  // Terminals: 0 = hot, 1 = ground, then 2 + 2·coil + (0 start | 1 finish).
  const terminalCount = 2 + 2 * guitar.coils.length;
  const parent = Int32Array.from({ length: terminalCount }, (_, k) => k);
  const find = (k: number): number => {
    let n = k;
    while (parent[n] !== n) n = parent[n] as number;
    return n;
  };
  const used = new Uint8Array(terminalCount);
  const joints = text.split(',').map((joint) => joint.trim());
  if (joints.every((joint) => joint === '')) throw InputError.at(path, 'joints like "neck.finish = hot, neck.start = ground"', text);
  for (const joint of joints) {
    if (joint === '') throw InputError.at(path, 'a joint between each pair of commas', text);
    const terminals = joint.split('=').map((terminal) => terminal.trim());
    if (terminals.length < 2) throw InputError.at(path, `two or more terminals joined by "=" in each joint`, joint);
    const indices = terminals.map((terminal) => {
      if (terminal === HOT_NODE) return 0;
      if (terminal === GROUND_NODE) return 1;
      const dot = terminal.lastIndexOf('.');
      const id = terminal.slice(0, dot);
      const lead = terminal.slice(dot + 1);
      const coil = coilIds.get(id);
      if (dot < 0 || coil === undefined || !(LEADS as readonly string[]).includes(lead)) {
        const known = guitar.coils.map((each) => each.id).join(', ');
        throw InputError.at(path, `hot, ground or a coil lead such as "${guitar.coils[0]?.id ?? 'neck'}.start" (coils: ${known})`, terminal);
      }
      if (insideTwoLead.has(coil)) throw InputError.at(path, 'a coil on its own leads (this one is inside a two-lead pickup)', terminal);
      return 2 + 2 * coil + (lead === 'start' ? 0 : 1);
    });
    const first = indices[0] as number;
    for (const index of indices) {
      used[index] = 1;
      const a = find(first);
      const b = find(index);
      if (a !== b) parent[Math.max(a, b)] = Math.min(a, b);
    }
  }
  // Nodes: ground 0, hot 1, then each other joint in order of its lowest terminal.
  const groundRoot = find(1);
  const hotRoot = find(0);
  const nodeOfRoot = new Map<number, number>([[groundRoot, 0]]);
  const names: string[] = [GROUND_NODE];
  if (hotRoot !== groundRoot) {
    nodeOfRoot.set(hotRoot, 1);
    names.push(HOT_NODE);
  }
  const hot = nodeOfRoot.get(hotRoot) as number;
  const nodeOf = (terminal: number): number => {
    const root = find(terminal);
    const known = nodeOfRoot.get(root);
    if (known !== undefined) return known;
    nodeOfRoot.set(root, names.length);
    names.push(`n${names.length}`);
    return names.length - 1;
  };
  const coils: GraphCoil[] = [];
  guitar.coils.forEach((coil) => {
    const start = 2 + 2 * coil.index;
    const finish = start + 1;
    if (used[start] === 0 && used[finish] === 0) return;
    coils.push({ coil: coil.index, start: used[start] === 1 ? nodeOf(start) : null, finish: used[finish] === 1 ? nodeOf(finish) : null });
  });
  return { nodeCount: names.length, hot, ground: 0, coils, nodeNames: names };
}

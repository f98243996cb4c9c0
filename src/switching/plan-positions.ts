/**
 * A plan's positions: the points each kit position makes, what they connect
 * (read-position-wiring.ts) and the circuit the nodal solver takes.
 */
import type { Guitar } from '../guitar/index.js';
import type { CircuitGraph } from '../circuit/index.js';
import { circuitOfComponents, itemCount } from './element-terminals.js';
import { type PositionReading, readPositionWiring } from './read-position-wiring.js';
import { type KitPosition, enumerateKitPoles, enumerateKitPositions } from './switch-kit.js';
import { type SwitchPlan, kitLugLayout } from './solve-switch-plan.js';

/** The point (a net number standing for the group) of every item in one kit position. */
export function componentsAt(plan: SwitchPlan, position: KitPosition): Int32Array {
  const { kit } = plan;
  const poles = enumerateKitPoles(kit);
  const layout = kitLugLayout(kit);
  const nets = plan.fixedNetCount + plan.jumperNetCount;
  const parent = Int32Array.from({ length: nets }, (_, n) => n);
  const find = (x: number): number => {
    while (parent[x] !== x) x = parent[x] as number;
    return x;
  };
  poles.forEach((pole, q) => {
    const base = layout.poleBase[q] as number;
    const common = plan.lugNets[base] as number;
    if (common < 0) return;
    const touched = kit.switches[pole.switchIndex]?.positions[position.switchPositions[pole.switchIndex] ?? 0] ?? [];
    for (const lug of touched) {
      const net = plan.lugNets[base + 1 + lug] as number;
      if (net < 0) continue;
      const a = find(common);
      const b = find(net);
      if (a !== b) parent[a] = b;
    }
  });
  return Int32Array.from(plan.itemNets, (net) => find(net));
}

export interface PlanPosition {
  readonly position: KitPosition;
  readonly componentOf: Int32Array;
  readonly reading: PositionReading;
  readonly circuit: CircuitGraph;
}

/** Every kit position of a plan, read off and as a circuit. */
export function readPlanPositions(guitar: Guitar, plan: SwitchPlan): PlanPosition[] {
  if (plan.itemNets.length !== itemCount(guitar)) throw new RangeError('readPlanPositions: the plan is for another guitar');
  return enumerateKitPositions(plan.kit).map((position) => {
    const componentOf = componentsAt(plan, position);
    return { position, componentOf, reading: readPositionWiring(guitar, componentOf), circuit: circuitOfComponents(guitar, componentOf) };
  });
}

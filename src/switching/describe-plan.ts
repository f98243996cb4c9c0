/**
 * A plan in words a person can solder from: names for its nets and lugs,
 * and what each net joins. Shared by the build sheet and the drawing.
 */
import type { Guitar } from '../guitar/index.js';
import { GROUND_ITEM, HOT_ITEM, describeItem } from './element-terminals.js';
import { enumerateKitPoles, poleLetter } from './switch-kit.js';
import { type SwitchPlan, kitLugLayout } from './solve-switch-plan.js';

export interface PlanLug {
  /** Index in the kit-lug order. */
  readonly index: number;
  readonly switchIndex: number;
  readonly pole: number;
  /** 0 = common, k = contact lug k (1-based). */
  readonly lug: number;
  /** "A common", "A2"; with several switches "S2 A common". */
  readonly label: string;
  /** Net on it, −1 for none. */
  readonly net: number;
}

export interface PlanNet {
  readonly net: number;
  /** "hot", "ground", "P1" (a joint of leads), "J1" (a jumper between lugs only). */
  readonly tag: string;
  /** Items (coil leads, hot, ground) on it, as words. */
  readonly leads: readonly string[];
  readonly lugs: readonly PlanLug[];
}

export interface PlanDescription {
  readonly lugs: readonly PlanLug[];
  readonly nets: readonly PlanNet[];
  /** Leads on no net with anything else and on no lug: insulate. */
  readonly unconnected: readonly string[];
}

export function describePlan(guitar: Guitar, plan: SwitchPlan): PlanDescription {
  const layout = kitLugLayout(plan.kit);
  const poles = enumerateKitPoles(plan.kit);
  const several = plan.kit.switches.length > 1;
  const lugs: PlanLug[] = [];
  poles.forEach((pole, q) => {
    const base = layout.poleBase[q] as number;
    for (let lug = 0; lug <= (layout.contactCounts[q] as number); lug += 1) {
      const name = lug === 0 ? `${poleLetter(pole.pole)} common` : `${poleLetter(pole.pole)}${lug}`;
      lugs.push({
        index: base + lug,
        switchIndex: pole.switchIndex,
        pole: pole.pole,
        lug,
        label: several ? `S${pole.switchIndex + 1} ${name}` : name,
        net: plan.lugNets[base + lug] as number,
      });
    }
  });
  const nets: PlanNet[] = [];
  const unconnected: string[] = [];
  let points = 0;
  let jumpers = 0;
  const total = plan.fixedNetCount + plan.jumperNetCount;
  for (let net = 0; net < total; net += 1) {
    const items = plan.itemNets.flatMap((itemNet, item) => (itemNet === net ? [item] : []));
    const onLugs = lugs.filter((lug) => lug.net === net);
    if (items.length + onLugs.length < 2) {
      for (const item of items) if (item !== HOT_ITEM && item !== GROUND_ITEM) unconnected.push(describeItem(guitar, item));
      continue;
    }
    let tag: string;
    if (items.includes(HOT_ITEM)) tag = 'hot';
    else if (items.includes(GROUND_ITEM)) tag = 'ground';
    else if (items.length > 0) tag = `P${++points}`;
    else tag = `J${++jumpers}`;
    nets.push({ net, tag, leads: items.map((item) => describeItem(guitar, item)), lugs: onLugs });
  }
  return { lugs, nets, unconnected };
}

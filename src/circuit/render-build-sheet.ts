/**
 * A wiring in words a person can solder from: which lead of each coil goes
 * to which point, which leads join, what goes to hot and to ground, what to
 * measure before closing up, and the cautions of the trade (common
 * practice: iron and burns, fumes and washing hands, meter checks, covers tied to
 * a lead, never opening an amplifier).
 */
import type { Guitar } from '../guitar/index.js';
import { formatEngineering } from '../units/index.js';
import type { Network, Wiring } from '../wiring/index.js';
import { graphOfNetwork } from './circuit-graph.js';
import { prepareCircuit } from './prepare-circuit.js';
import { solveCoilsImpedance } from './solve-nodal.js';
import { type CoilPlacement, GROUND_NODE, HOT_NODE, type Lead, layoutWiring, networkResistanceOhms } from './layout-wiring.js';
import { appendAll } from '../math/index.js';

const POINT_WORDS: Readonly<Record<string, string>> = Object.freeze({
  [HOT_NODE]: 'hot',
  [GROUND_NODE]: 'ground',
});

function point(name: string): string {
  return POINT_WORDS[name] ?? name;
}

/** "neck start", or for a coil inside a two-lead pickup, the pickup's lead that carries it. */
function leadName(placement: CoilPlacement, lead: Lead): string {
  if (placement.element.kind === 'two-lead pickup') {
    return `${placement.element.id}'s lead from ${placement.coil.id} ${lead}`;
  }
  return `${placement.coil.id} ${lead}`;
}

/** Leads reaching each point made outside the pickups, in placement order. */
function leadsByPoint(placements: readonly CoilPlacement[]): Map<string, string[]> {
  const points = new Map<string, string[]>();
  const add = (node: string, text: string): void => {
    const list = points.get(node) ?? [];
    list.push(text);
    points.set(node, list);
  };
  for (const placement of placements) {
    if (!placement.internal.plus) add(placement.plusNode, leadName(placement, placement.plusLead));
    if (!placement.internal.minus) add(placement.minusNode, leadName(placement, placement.minusLead));
  }
  return points;
}

/** Parallel of resistances (Ohm's law): 1/R = Σ 1/R_k. */
function parallelOhms(...values: number[]): number {
  return 1 / values.reduce((sum, value) => sum + 1 / value, 0);
}

/** The workshop cautions every build sheet starts with (amplifier, iron, fumes), as indented lines. */
export const WORKSHOP_CAUTIONS: readonly string[] = Object.freeze([
  '  - Unplug the guitar from the amplifier before you open it. Never open an amplifier: its',
  '    capacitors can hold a lethal charge long after it is unplugged; leave that to a technician.',
  '  - Keep the soldering iron in its stand when you are not using it and keep flammables off the',
  '    bench; burns are the most common injury. Wear eye protection.',
  '  - Work with ventilation or a fume extractor, keep food and drink off the bench, and wash your',
  '    hands after handling solder.',
]);
/** Test frequency of the inductance reading (common practice: LCR meters test at 100 Hz, 120 Hz or 1 kHz; the lowest keeps the self-capacitance out of the reading). */
const METER_TEST_HZ = 120;

/**
 * What an inductance meter in series mode reads across the coils alone:
 * L = Im(Z)/ω of their impedance between hot and ground (nodal analysis,
 * coupled coils included: a humbucker in series reads L1 + L2 + 2M).
 */
function meterInductanceH(guitar: Guitar, network: Network): number {
  const impedance = solveCoilsImpedance(prepareCircuit(guitar, Float64Array.of(METER_TEST_HZ)), graphOfNetwork(guitar, network));
  return (impedance[1] as number) / (2 * Math.PI * METER_TEST_HZ);
}

/** The build sheet of a wiring of `guitar`, as plain text. */
export function renderBuildSheet(
  guitar: Guitar,
  wiring: Pick<Wiring, 'network' | 'expression' | 'description'> & { readonly id?: string },
): string {
  const network: Network = wiring.network;
  const layout = layoutWiring(guitar, network);
  const lines: string[] = [];
  const title = wiring.id ? `${wiring.id}  ${wiring.expression}` : wiring.expression;
  lines.push(`Build sheet: ${title}`, wiring.description, `Guitar: ${guitar.name}`, '');

  lines.push('Read this first');
  appendAll(lines, WORKSHOP_CAUTIONS);
  lines.push(
    '  - This sheet comes from a model of your guitar file. Check every lead against your pickups,',
    '    and make the final choice by ear on the real instrument.',
    '',
    'Leads and points',
    '  start / finish: where each coil\'s winding begins and ends. The winding in the guitar file',
    '    (cw or ccw, seen from the top) is the sense going from start to finish. Lead colours differ',
    '    between makers: identify start and finish first (maker\'s chart, or a meter and a steel tool).',
    '  hot:    the volume pot\'s input lug (the end of its track that is not grounded).',
    '  ground: the ground bus (usually the back of the volume pot).',
  );
  if (layout.junctions.length > 0) {
    const noun = layout.junctions.length === 1 ? 'a joint' : 'joints';
    lines.push(`  ${layout.junctions.join(', ')}: ${noun} between coils only; solder, cover with heat-shrink, connect nothing else.`);
  }
  lines.push('', 'Each coil');
  const seenPickups = new Set<string>();
  for (const placement of layout.placements) {
    const { coil, element } = placement;
    const phase = placement.phase === 1 ? 'in phase' : 'out of phase';
    if (element.kind === 'two-lead pickup') {
      if (seenPickups.has(element.id)) continue;
      seenPickups.add(element.id);
      const inside = layout.placements.filter((other) => other.element.id === element.id);
      const first = inside[0] as CoilPlacement;
      const last = inside[inside.length - 1] as CoilPlacement;
      lines.push(
        `  ${element.id} (two-lead pickup: ${inside.map((other) => other.coil.id).join(' and ')} joined inside; ${phase}):`,
        `    the lead from ${first.coil.id} ${first.plusLead} -> ${point(first.plusNode)}`,
        `    the lead from ${last.coil.id} ${last.minusLead} -> ${point(last.minusNode)}`,
        `    (${placement.phase === 1 ? 'out of phase' : 'in phase'} would be the same two leads swapped)`,
      );
      continue;
    }
    lines.push(
      `  ${coil.id} (winding ${coil.winding}, ${coil.magnet} pole up; ${phase}):`,
      `    ${placement.plusLead.padEnd(6)} -> ${point(placement.plusNode)}`,
      `    ${placement.minusLead.padEnd(6)} -> ${point(placement.minusNode)}`,
    );
  }

  lines.push('', 'What joins where');
  const byPoint = leadsByPoint(layout.placements);
  for (const name of [HOT_NODE, ...layout.junctions, GROUND_NODE]) {
    const leads = byPoint.get(name) ?? [];
    const suffix = name === HOT_NODE ? ' (then to the volume pot\'s input lug)' : name === GROUND_NODE ? ' (to the ground bus)' : '';
    lines.push(`  ${point(name).padEnd(6)}: ${leads.join(' + ')}${suffix}`);
  }
  if (layout.unused.length > 0) {
    lines.push('', 'Not used');
    for (const coil of layout.unused) {
      lines.push(`  ${coil.id}: leave both leads unconnected and insulate each end on its own (heat-shrink).`);
    }
  }

  lines.push('', 'Check with a meter before closing up');
  const coilsOhms = networkResistanceOhms(guitar, network);
  const volumeOhms = guitar.controls.volume.potOhms;
  lines.push(
    `  - Coils alone, hot to ground (before connecting the pots): about ${formatEngineering(coilsOhms, 'Ω')}`,
    '    (the DC resistances as wired; a reading near 0 is a short, an open reading a broken joint).',
    `  - Everything connected, volume on 10, jack tip to sleeve: about ${formatEngineering(parallelOhms(coilsOhms, volumeOhms), 'Ω')}`,
    '    (the coils in parallel with the volume pot).',
    `  - Coils alone, hot to ground, inductance meter (series mode, ${METER_TEST_HZ} Hz): about ${formatEngineering(meterInductanceH(guitar, network), 'H')}`,
    '    (the coils\' inductances as wired, with the coupling between coils that share a pickup).',
    '  - Every joint: continuity to the leads it should join, and none to ground unless it is ground.',
    '  - Tap each pole piece gently with a steel tool with the guitar plugged in at low volume: every',
    '    coil in the wiring should sound.',
  );

  const cautions: string[] = [];
  for (const placement of layout.placements) {
    if (placement.element.kind === 'two-lead pickup') continue;
    const offGround = (
      [
        [placement.plusLead, placement.plusNode],
        [placement.minusLead, placement.minusNode],
      ] as const
    ).filter(([, node]) => node !== GROUND_NODE);
    const where = offGround.map(([lead, node]) => `its ${lead} lead goes to ${point(node)}`).join(' and ');
    cautions.push(
      `  - ${placement.coil.id}: ${where}. If its cover or baseplate is tied to ${offGround.length > 1 ? 'either lead' : `the ${offGround[0]?.[0] ?? ''} lead`},`,
      '    separate them and ground the cover on its own, or the cover will carry the signal (hum, and',
      '    a short if it touches anything grounded).',
    );
  }
  for (const id of seenPickups) {
    cautions.push(`  - ${id}: if its cover is tied to the lead that now goes to hot or a joint, separate it and ground the cover on its own.`);
  }
  lines.push('', 'Covers tied to a lead');
  appendAll(lines, cautions);
  lines.push('');
  return lines.join('\n');
}

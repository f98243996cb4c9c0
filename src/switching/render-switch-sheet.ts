/**
 * The build sheet of a switch plan, as plain text: the cautions of the
 * trade, every lug and what goes on it, what each joint joins, a table of
 * what each position connects, and the meter readings to expect in each
 * position before closing up.
 */
import type { Guitar } from '../guitar/index.js';
import { WORKSHOP_CAUTIONS, networkResistanceOhms } from '../circuit/index.js';
import { formatEngineering } from '../units/index.js';
import { printNetwork } from '../wiring/index.js';
import { describePlan } from './describe-plan.js';
import type { PlanPosition } from './plan-positions.js';
import type { PositionReading } from './read-position-wiring.js';
import { type SwitchKit, countKitPositions, describeKitPosition } from './switch-kit.js';
import type { PositionWish, SwitchPlan } from './solve-switch-plan.js';
import type { PositionVerification } from './verify-switch-plan.js';
import { appendAll, maxOf } from '../math/index.js';

/** Parallel of resistances (Ohm's law): 1/R = Σ 1/R_k. */
function parallelOhms(a: number, b: number): number {
  return 1 / (1 / a + 1 / b);
}

export function describeReading(guitar: Guitar, reading: PositionReading): string {
  if (reading.kind === 'wiring') return printNetwork(reading.network, guitar.elements.map((element) => element.id));
  if (reading.kind === 'off') return 'off (no coil connected)';
  return `not a clean wiring: ${reading.reason}`;
}

export function describeWish(wish: PositionWish | undefined): string {
  if (wish === undefined || wish.kind === 'free') return '(free)';
  return wish.kind === 'off' ? 'off' : wish.expression;
}

/** Coils alone, hot to ground, in this position: the DC resistance, or words. */
export function expectedReading(guitar: Guitar, reading: PositionReading): { coilsOnly: string; atJack: string } {
  const volumeOhms = guitar.controls.volume.potOhms;
  if (reading.kind === 'wiring') {
    const coils = networkResistanceOhms(guitar, reading.network);
    return { coilsOnly: `about ${formatEngineering(coils, 'Ω')}`, atJack: `about ${formatEngineering(parallelOhms(coils, volumeOhms), 'Ω')}` };
  }
  if (reading.kind === 'off') return { coilsOnly: 'open (no reading)', atJack: `about ${formatEngineering(volumeOhms, 'Ω')} (the volume pot alone)` };
  return { coilsOnly: 'see the table', atJack: 'see the table' };
}

export function describeKit(kit: SwitchKit): string {
  return `${kit.switches.map((definition) => definition.name).join(' and ')} (${countKitPositions(kit)} positions)`;
}

export function renderSwitchSheet(
  guitar: Guitar,
  plan: SwitchPlan,
  positions: readonly PlanPosition[],
  wishes: readonly PositionWish[],
  verification: readonly PositionVerification[],
): string {
  const description = describePlan(guitar, plan);
  const lines: string[] = [];
  lines.push(`Switch plan: ${guitar.name}`, `Kit: ${describeKit(plan.kit)}`, '');
  lines.push('Read this first');
  appendAll(lines, WORKSHOP_CAUTIONS);
  lines.push(
    '  - Switch lug layouts differ between makers: which lug is the common and which lugs each',
    '    position closes. Match the drawing to the switch in hand (check with a meter, switch in',
    '    each position) before you solder.',
    '  - Check each position with a meter before closing up (expected readings below).',
    '  - Try new sounds at a low volume first; loud levels damage hearing.',
    '  - This plan comes from a model of your guitar file. Make the final choice by ear on the real',
    '    instrument.',
    '',
    'Leads',
    '  start / finish: where each coil\'s winding begins and ends (winding cw or ccw seen from the top,',
    '    going from start to finish). Lead colours differ between makers: identify them first.',
    '  hot: the volume pot\'s input lug. ground: the ground bus (usually the back of the volume pot).',
    '',
    'Lugs (C = the common lug of a pole; 1, 2, … its contact lugs)',
  );
  const tagOf = new Map(description.nets.map((net) => [net.net, net.tag]));
  for (const lug of description.lugs) {
    const tag = lug.net >= 0 ? tagOf.get(lug.net) : undefined;
    lines.push(`  ${lug.label.padEnd(12)} ${tag === undefined ? '(nothing)' : tag}`);
  }
  lines.push('', 'Joints (solder each group together; a wire from one lug to another is a jumper)');
  for (const net of description.nets) {
    const members = [...net.leads, ...net.lugs.map((lug) => `lug ${lug.label}`)];
    const suffix = net.tag === 'hot' ? ' (and on to the volume pot\'s input lug)' : net.tag === 'ground' ? ' (to the ground bus)' : '';
    lines.push(`  ${net.tag.padEnd(7)} ${members.join(' + ')}${suffix}`);
  }
  if (description.unconnected.length > 0) {
    lines.push('', 'Not connected (insulate each end on its own with heat-shrink)');
    for (const lead of description.unconnected) lines.push(`  ${lead}`);
  }
  const passed = new Map(verification.map((check) => [check.index, check]));
  const table: string[][] = [['position', 'wanted', 'connects', 'coils alone, hot to ground', 'at the jack, volume 10']];
  positions.forEach((position, index) => {
    const reading = expectedReading(guitar, position.reading);
    const inverted = passed.get(index)?.inverted ? ' (all reversed: same sound)' : '';
    table.push([
      describeKitPosition(plan.kit, position.position),
      describeWish(wishes[index]),
      describeReading(guitar, position.reading) + inverted,
      reading.coilsOnly,
      reading.atJack,
    ]);
  });
  const widths = (table[0] as string[]).map((_, column) => maxOf(table.map((row) => (row[column] ?? '').length)));
  lines.push('', 'Positions');
  for (const row of table) lines.push(`  ${row.map((cell, column) => cell.padEnd(widths[column] ?? 0)).join('  ').trimEnd()}`);
  lines.push(
    '',
    'Check each position with a meter before closing up',
    '  - "coils alone": meter from the hot joint to ground with the volume pot\'s input lug unsoldered.',
    '  - "at the jack": everything connected, volume on 10, tip to sleeve (the coils in parallel with',
    '    the volume pot). A reading near 0 is a short; an open reading where a coil should be is a',
    '    broken joint or a lug the switch does not close in that position.',
    '  - Tap each pole piece gently with a steel tool, plugged in at low volume: every coil the',
    '    position connects should sound, and no other.',
  );
  if (verification.length > 0) {
    const worstDb = maxOf(verification.map((check) => check.maxDb));
    const worstDeg = maxOf(verification.map((check) => check.maxDeg));
    const ok = verification.every((check) => check.passed);
    lines.push(
      '',
      `Simulation: every position solved as a circuit of lugs, contacts and coil leads (nodal analysis) ${ok ? 'matches' : 'DOES NOT match'} the wanted wiring` +
        ` (largest difference ${worstDb < 1e-6 ? 'below 0.000001' : worstDb.toFixed(6)} dB, ${worstDeg < 1e-6 ? 'below 0.000001' : worstDeg.toFixed(6)}°; unused coils give nothing).`,
    );
  }
  lines.push('');
  return lines.join('\n');
}

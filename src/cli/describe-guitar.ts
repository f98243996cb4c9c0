/** A short human summary of a validated guitar, used by `check` and reports. */
import { type Coil, CONSTRUCTION_DEFAULTS, type Guitar, type Pot } from '../guitar/index.js';
import { formatPosition } from '../report/index.js';
import { formatEngineering } from '../units/index.js';

const MM_PER_M = 1000;
/** Derived turns are shown to the nearest hundred: N ∝ √L is only as good as "one construction". */
const TURNS_SHOWN_STEP = 100;


function formatPot(pot: Pot): string {
  const taper = pot.taper === 'audio' ? `audio (${Math.round(pot.audioMidpoint * 100)} % at 5)` : 'linear';
  return `${formatEngineering(pot.potOhms, 'Ω')} ${taper}, set to ${pot.setting}`;
}

/** Turns, sensitivity and losses of a coil, saying where each came from (docs/physics.md §1.6). */
function describeTurnsAndLosses(coil: Coil): string {
  const nominal = CONSTRUCTION_DEFAULTS[coil.construction];
  const turns =
    coil.turnsSource === 'file'
      ? `${Math.round(coil.turns)} turns`
      : `≈ ${Math.round(coil.turns / TURNS_SHOWN_STEP) * TURNS_SHOWN_STEP} turns (derived from the inductance: N ∝ √L for coils of one construction, ${nominal.nominalTurns} turns at ${formatEngineering(nominal.nominalInductanceH, 'H')})`;
  const sensitivity = coil.sensitivityGiven ? `sensitivity ${coil.sensitivity} (from the file)` : `sensitivity ${coil.sensitivity.toFixed(2)} (turns / ${nominal.nominalTurns})`;
  const losses = [
    coil.eddyShare > 0 ? `eddy branch ${Math.round(coil.eddyShare * 100)} % of L with ${formatEngineering(coil.eddyResistanceOhms, 'Ω')}` : 'no eddy branch',
    coil.lossResistanceOhms === null ? 'no loss resistance' : `loss resistance ${formatEngineering(coil.lossResistanceOhms, 'Ω')}`,
  ];
  return `${coil.construction}; ${turns}; ${sensitivity}; ${losses.join(', ')}`;
}

/** Lines describing the guitar, without trailing newline. */
export function describeGuitar(guitar: Guitar): string[] {
  const lines: string[] = [];
  lines.push(guitar.name);
  lines.push(
    `  scale ${formatEngineering(guitar.scaleM * MM_PER_M)} mm; ${guitar.strings.length} strings tuned ${guitar.strings.map((s) => s.name).join(' ')}`,
  );
  lines.push('  coils:');
  for (const coil of guitar.coils) {
    const housing = coil.pickup ? ` [pickup ${coil.pickup}]` : '';
    lines.push(
      `    ${coil.id}${housing}: ${formatPosition(coil)} from the bridge, ${formatEngineering(coil.resistanceOhms, 'Ω')}, ` +
        `${formatEngineering(coil.inductanceH, 'H')}, ${formatEngineering(coil.capacitanceF, 'F')}, ` +
        `winding ${coil.winding}, ${coil.magnet} pole up`,
    );
    lines.push(`      ${describeTurnsAndLosses(coil)}`);
  }
  const twoLead = guitar.pickups.filter((pickup) => pickup.leads === 2);
  for (const pickup of twoLead) {
    const names = pickup.coilIndices.map((index) => guitar.coils[index]?.id ?? '?');
    lines.push(`  two-lead pickup ${pickup.name}: ${names.join(' and ')} joined in series inside, wired as one element`);
  }
  for (const pickup of guitar.pickups) {
    if (pickup.coilIndices.length < 2) continue;
    const names = pickup.coilIndices.map((index) => guitar.coils[index]?.id ?? '?');
    lines.push(
      pickup.coupling === 0
        ? `  pickup ${pickup.name}: ${names.join(' and ')} not magnetically coupled (coupling 0)`
        : `  pickup ${pickup.name}: ${names.join(' and ')} magnetically coupled, k = ${pickup.coupling}`,
    );
  }
  const { volume, tone, trebleBleed } = guitar.controls;
  lines.push(`  volume: ${formatPot(volume)}`);
  lines.push(tone ? `  tone: ${formatPot(tone)}, capacitor ${formatEngineering(tone.capacitorF, 'F')}` : '  tone: none');
  if (trebleBleed) {
    const resistor = trebleBleed.resistorOhms
      ? ` with ${formatEngineering(trebleBleed.resistorOhms, 'Ω')} in ${trebleBleed.arrangement}`
      : '';
    lines.push(`  treble bleed: ${formatEngineering(trebleBleed.capacitorF, 'F')}${resistor}`);
  }
  const cable = guitar.cable.lengthM
    ? `${formatEngineering(guitar.cable.lengthM)} m × ${formatEngineering(guitar.cable.capacitancePerMetreF ?? 0, 'F')}/m = ${formatEngineering(guitar.cable.capacitanceF, 'F')}`
    : formatEngineering(guitar.cable.capacitanceF, 'F');
  lines.push(`  cable: ${cable}; amplifier input ${formatEngineering(guitar.amp.resistanceOhms, 'Ω')} with ${formatEngineering(guitar.amp.capacitanceF, 'F')}`);
  return lines;
}

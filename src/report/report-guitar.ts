/** The guitar as the listening page and reports describe it: values as people read them, controls in words. */
import type { CircuitLoad } from '../circuit/index.js';
import type { Coil, Guitar } from '../guitar/index.js';
import { formatEngineering } from '../units/index.js';
import type { ReportGuitar } from './listening-report.js';

const MILLIMETRES_PER_METRE = 1000;

/** "160 mm", or "48→38 mm (bass→treble)" for a slanted coil. */
export function formatPosition(coil: Pick<Coil, 'positionBassM' | 'positionTrebleM'>): string {
  const bass = coil.positionBassM * MILLIMETRES_PER_METRE;
  const treble = coil.positionTrebleM * MILLIMETRES_PER_METRE;
  return bass === treble
    ? `${formatEngineering(bass)} mm`
    : `${formatEngineering(bass)}→${formatEngineering(treble)} mm (bass→treble)`;
}

/** The controls as actually used (after any what-if settings), one line each. */
export function describeControls(load: CircuitLoad): string[] {
  const { volume, tone, trebleBleed } = load;
  const lines = [`volume ${formatEngineering(volume.potOhms, 'Ω')} ${volume.taper} taper, set to ${volume.setting}`];
  lines.push(
    tone
      ? `tone ${formatEngineering(tone.potOhms, 'Ω')} ${tone.taper} taper with ${formatEngineering(tone.capacitorF, 'F')}, set to ${tone.setting}`
      : 'no tone control',
  );
  if (trebleBleed) {
    const resistor = trebleBleed.resistorOhms ? ` with ${formatEngineering(trebleBleed.resistorOhms, 'Ω')} in ${trebleBleed.arrangement}` : '';
    lines.push(`treble bleed ${formatEngineering(trebleBleed.capacitorF, 'F')}${resistor} across the volume pot`);
  }
  return lines;
}

export function reportGuitar(guitar: Guitar, slug: string, load: CircuitLoad): ReportGuitar {
  return {
    name: guitar.name,
    slug,
    notes: guitar.notes ?? null,
    scaleM: guitar.scaleM,
    tuning: guitar.strings.map((string) => string.name),
    coils: guitar.coils.map((coil) => ({
      id: coil.id,
      pickup: coil.pickup ?? null,
      position: formatPosition(coil),
      resistanceOhms: coil.resistanceOhms,
      inductanceH: coil.inductanceH,
      capacitanceF: coil.capacitanceF,
      winding: coil.winding,
      magnet: coil.magnet,
    })),
    controls: describeControls(load),
    cableCapacitanceF: load.cableCapacitanceF,
    ampResistanceOhms: load.ampResistanceOhms,
    ampCapacitanceF: load.ampCapacitanceF,
  };
}

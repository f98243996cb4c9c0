/**
 * Random guitar files for property tests: every field drawn anywhere inside
 * (and now and then at the edge of) the range the guitar file accepts, with
 * values as engineers write them. Seeded, so a failure names its seed.
 * Invented data, not a real instrument.
 */
import { createRandom, type Random } from '../../src/math/index.js';

const pick = <T>(random: Random, items: readonly T[]): T => items[Math.floor(random() * items.length)] as T;
/** Log-uniform between low and high. */
const logUniform = (random: Random, low: number, high: number): number => low * (high / low) ** random();
/** A length in millimetres text, at least 0.1 mm (a coil centre on the saddle itself is refused). */
const millimetres = (metres: number): string => `${Math.max(0.1, metres * 1000).toFixed(1)}mm`;
const maybe = (random: Random, chance: number): boolean => random() < chance;

export interface RandomGuitarOptions {
  /** Most coils drawn (default 3: keeps audio analysis quick). */
  readonly maxCoils?: number;
}

/** A random guitar file (a JSON-able object) from `seed`. */
export function randomGuitarFile(seed: number, options: RandomGuitarOptions = {}): Record<string, unknown> {
  const random = createRandom(seed);
  const maxCoils = options.maxCoils ?? 3;
  const scaleM = logUniform(random, 0.3, 1.2);
  const coilCount = 1 + Math.floor(random() * maxCoils);
  const coils = Array.from({ length: coilCount }, (_, index) => {
    const coil: Record<string, unknown> = {
      id: `coil_${index + 1}`,
      position: maybe(random, 0.2)
        ? { bass: millimetres(random() * scaleM), treble: millimetres(random() * scaleM) }
        : millimetres(random() * scaleM),
      resistance: `${logUniform(random, 1, 100e3).toPrecision(3)}`,
      inductance: `${logUniform(random, 0.01, 100).toPrecision(3)}H`,
    };
    if (maybe(random, 0.7)) coil.capacitance = `${logUniform(random, 1, 10_000).toPrecision(3)}p`;
    if (maybe(random, 0.5)) coil.aperture = `${logUniform(random, 1, 100).toPrecision(3)}mm`;
    if (maybe(random, 0.7)) coil.winding = pick(random, ['cw', 'ccw']);
    if (maybe(random, 0.7)) coil.magnet = pick(random, ['north', 'south']);
    if (maybe(random, 0.3)) coil.sensitivity = Number(logUniform(random, 1e-3, 100).toPrecision(3));
    if (maybe(random, 0.3)) coil.humSensitivity = maybe(random, 0.2) ? 1e-3 : Number(logUniform(random, 1e-3, 100).toPrecision(3));
    return coil;
  });
  const knob = (): number => (maybe(random, 0.15) ? pick(random, [0, 10]) : Number((random() * 10).toFixed(1)));
  const volume: Record<string, unknown> = { pot: `${logUniform(random, 1, 10_000).toPrecision(3)}k`, setting: knob() };
  if (maybe(random, 0.5)) volume.taper = pick(random, ['audio', 'linear']);
  if (maybe(random, 0.3)) volume.audioMidpoint = Number((0.01 + random() * 0.48).toFixed(3));
  const controls: Record<string, unknown> = { volume };
  if (maybe(random, 0.15)) controls.tone = null;
  else if (maybe(random, 0.8)) controls.tone = { pot: `${logUniform(random, 1, 10_000).toPrecision(3)}k`, capacitor: `${logUniform(random, 0.1, 10_000).toPrecision(3)}n`, setting: knob() };
  if (maybe(random, 0.2)) {
    const bleed: Record<string, unknown> = { capacitor: `${logUniform(random, 10, 100_000).toPrecision(3)}p` };
    if (maybe(random, 0.5)) bleed.resistor = `${logUniform(random, 1, 10_000).toPrecision(3)}k`;
    if (bleed.resistor !== undefined && maybe(random, 0.5)) bleed.arrangement = pick(random, ['parallel', 'series']);
    controls.trebleBleed = bleed;
  }
  const cable = maybe(random, 0.5)
    ? { capacitance: `${logUniform(random, 1, 20_000).toPrecision(3)}p` }
    : { length: `${logUniform(random, 0.1, 100).toPrecision(3)}m`, capacitancePerMetre: `${logUniform(random, 10, 1000).toPrecision(3)}p` };
  return {
    name: `Random guitar ${seed} (invented)`,
    scale: `${(scaleM * 1000).toFixed(1)}mm`,
    coils,
    controls,
    cable,
    amp: { resistance: `${logUniform(random, 1, 100_000).toPrecision(3)}k`, capacitance: `${logUniform(random, 1, 10_000).toPrecision(3)}p` },
  };
}

/**
 * Random valid guitar files across the whole accepted range of every field
 * (src/guitar/guitar-spec.ts): values log-uniform between each field's limits,
 * with the limits themselves drawn now and then, 1 to 5 wiring elements made
 * of single coils, four-conductor humbuckers and two-lead humbuckers.
 */
import type { Random } from './seeded-random.js';

type Json = Record<string, unknown>;

/** Nearest a coil may sit to the bridge here, metres (positions must be above 0). */
const MIN_POSITION_M = 1e-4;
/** Chance of drawing a limit itself rather than a value between the limits. */
const EDGE_CHANCE = 0.1;

function draw(random: Random, low: number, high: number): number {
  const roll = random.next();
  return roll < EDGE_CHANCE / 2 ? low : roll < EDGE_CHANCE ? high : low > 0 ? random.logBetween(low, high) : random.between(low, high);
}

/** Half written as engineers write them, half as plain SI numbers. */
function written(random: Random, value: number, unit: string): string | number {
  return random.next() < 0.5 ? value : `${value.toPrecision(6)}${unit}`;
}

function quantity(random: Random, low: number, high: number, unit: string): string | number {
  return written(random, draw(random, low, high), unit);
}

function knob(random: Random): number {
  const roll = random.next();
  return roll < EDGE_CHANCE / 2 ? 0 : roll < EDGE_CHANCE ? 10 : Math.round(random.between(0, 10) * 100) / 100;
}

function pot(random: Random): Json {
  return {
    pot: quantity(random, 1e3, 10e6, ''),
    setting: knob(random),
    taper: random.pick(['audio', 'linear']),
    audioMidpoint: random.pick([0.01, 0.49, random.between(0.01, 0.49)]),
  };
}

/** Largest total cable capacitance a guitar file accepts, farads (src/guitar/guitar-spec.ts). */
const MAX_CABLE_F = 20e-9;

function cableByLength(random: Random): Json {
  // toPrecision(6) may round up: keep a margin under the total's bound.
  const lengthM = Number(draw(random, 0.1, 100).toPrecision(6));
  const perMetre = draw(random, 10e-12, Math.min(1e-9, (MAX_CABLE_F * 0.999) / lengthM));
  return { length: written(random, lengthM, 'm'), capacitancePerMetre: written(random, perMetre, 'F') };
}

export interface RandomGuitar {
  readonly document: Json;
  readonly elements: number;
}

/** A valid guitar document with `elements` wiring elements (1–5). */
export function randomGuitar(random: Random, elements: number): RandomGuitar {
  const scaleM = random.pick([0.3, 1.2, random.between(0.3, 1.2)]);
  const coils: Json[] = [];
  const pickups: Json = {};
  let coilNumber = 0;
  const coil = (extra: Json): Json => {
    coilNumber += 1;
    const slanted = random.next() < 0.2;
    const place = (): number => random.pick([MIN_POSITION_M, scaleM * 0.999, random.between(MIN_POSITION_M, scaleM * 0.999)]);
    return {
      id: `coil_${coilNumber}`,
      position: slanted ? { bass: place(), treble: place() } : place(),
      resistance: quantity(random, 1, 100e3, ''),
      inductance: quantity(random, 0.01, 100, 'H'),
      capacitance: quantity(random, 1e-12, 10e-9, 'F'),
      aperture: quantity(random, 1e-3, 0.1, 'm'),
      winding: random.pick(['cw', 'ccw']),
      magnet: random.pick(['north', 'south']),
      sensitivity: random.pick([100, random.logBetween(1e-3, 100)]),
      humSensitivity: random.pick([1e-3, 100, random.logBetween(1e-3, 100)]),
      ...extra,
    };
  };
  let made = 0;
  let pickupNumber = 0;
  while (made < elements) {
    const roll = random.next();
    if (roll < 0.15) {
      // a two-lead humbucker: two or three coils, one element
      pickupNumber += 1;
      const name = `pickup_${pickupNumber}`;
      const count = random.next() < 0.8 ? 2 : 3;
      for (let i = 0; i < count; i += 1) coils.push(coil({ pickup: name }));
      pickups[name] = { leads: 2 };
      made += 1;
    } else if (roll < 0.3 && elements - made >= 2) {
      // a four-conductor humbucker: two coils, two elements
      pickupNumber += 1;
      const name = `pickup_${pickupNumber}`;
      coils.push(coil({ pickup: name }), coil({ pickup: name }));
      made += 2;
    } else {
      coils.push(coil({}));
      made += 1;
    }
  }
  const strings = 1 + random.below(12);
  const cable =
    random.next() < 0.5
      ? { capacitance: quantity(random, 1e-12, 20e-9, 'F') }
      : cableByLength(random);
  const bleedRoll = random.next();
  const trebleBleed =
    bleedRoll < 0.6
      ? null
      : bleedRoll < 0.8
        ? { capacitor: quantity(random, 10e-12, 100e-9, 'F'), resistor: quantity(random, 1e3, 10e6, ''), arrangement: 'parallel' }
        : { capacitor: quantity(random, 10e-12, 100e-9, 'F'), resistor: quantity(random, 1e3, 10e6, ''), arrangement: 'series' };
  return {
    elements,
    document: {
      name: `Random guitar (invented values)`,
      scale: scaleM,
      tuning: Array.from({ length: strings }, () => random.pick([20, 2000, Math.round(random.logBetween(20, 2000) * 100) / 100])),
      coils,
      ...(Object.keys(pickups).length > 0 ? { pickups } : {}),
      controls: {
        volume: pot(random),
        tone: random.next() < 0.2 ? null : { ...pot(random), capacitor: quantity(random, 100e-12, 10e-6, 'F') },
        trebleBleed,
      },
      cable,
      amp: { resistance: quantity(random, 1e3, 100e6, ''), capacitance: quantity(random, 0, 10e-9, 'F') },
    },
  };
}

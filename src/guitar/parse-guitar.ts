/**
 * Reads a guitar file: JSON syntax, then every field against the guitar
 * description (`guitar-spec.ts`), then the rules that tie fields together
 * (unique ids, coils inside the scale, pickups and their coils). Every problem
 * is reported at once, each with its path.
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import { formatCount, formatEngineering, hzToMidi, noteName, parseNoteName, parseQuantity } from '../units/index.js';
import { CONSTRUCTION_DEFAULTS, eddyResistanceFromCorner, turnsFromInductance } from './coil-construction.js';
import type {
  Amp,
  Cable,
  Coil,
  CoilConstruction,
  Controls,
  Guitar,
  OpenString,
  Pickup,
  Pot,
  ToneControl,
  TrebleBleed,
  WiringElement,
} from './guitar.js';
import { CABLE_CAPACITANCE_MAX_F, CABLE_CAPACITANCE_MIN_F, DEFAULT_CABLE_CAPACITANCE, DEFAULT_PICKUP_COUPLING, GUITAR_SPEC } from './guitar-spec.js';
import { parseJsonText } from './parse-json.js';
import { validateField } from './validate-fields.js';

/** Most wiring elements the enumeration takes: 6 elements already give 228 386 wirings. */
export const MAX_WIRING_ELEMENTS = 6;
/** Capacitance per metre used when a cable gives a length but no capacitance per metre (common practice: 100–125 pF/m is usual). */
export const DEFAULT_CABLE_CAPACITANCE_PER_METRE_F = 100e-12;

/** Wiring numbers as commands accept them (`w1`, `w12`): no coil or pickup may be named so. */
const WIRING_NUMBER_PATTERN = /^w\d+$/u;

/**
 * Series–parallel networks on k labelled elements, k = 1…8: OEIS A006351
 * (1, 2, 8, 52, 472, 5504, 78416, 1320064).
 */
const SERIES_PARALLEL_NETWORKS = [1, 2, 8, 52, 472, 5504, 78416, 1320064];

/**
 * Distinct wirings of n elements, for messages about guitars too large to
 * enumerate: Σ over k of C(n, k) · A006351(k) · 2^(k−1) (every subset of k
 * elements, each of its networks, each phase pattern up to flipping them
 * all). Gives 1, 6, 47, 572, 9997, 228386 for n = 1…6, the counts the
 * enumeration produces.
 */
export function wiringCountFor(n: number): number {
  let total = 0;
  let choose = 1; // C(n, k), updated as k grows
  for (let k = 1; k <= n; k += 1) {
    choose = (choose * (n - k + 1)) / k;
    total += choose * (SERIES_PARALLEL_NETWORKS[k - 1] ?? Number.NaN) * 2 ** (k - 1);
  }
  return total;
}

type Raw = Record<string, unknown>;

const asRecord = (value: unknown): Raw => (typeof value === 'object' && value !== null ? (value as Raw) : {});
const asNumber = (value: unknown): number | undefined => (typeof value === 'number' ? value : undefined);
const asString = (value: unknown): string | undefined => (typeof value === 'string' ? value : undefined);

/** Parse and validate guitar file text. `source` names the file in messages. Throws InputError listing every problem. */
export function parseGuitarText(text: string, source = 'guitar file'): Guitar {
  return parseGuitar(parseJsonText(text, source));
}

/** Validate an already parsed JSON value as a guitar. Throws InputError listing every problem. */
export function parseGuitar(raw: unknown): Guitar {
  const problems: InputProblem[] = [];
  const assumed: string[] = [];
  const normalised = asRecord(validateField(GUITAR_SPEC, raw, '', problems, assumed));
  const rawRecord = asRecord(raw);

  const scaleM = asNumber(normalised.scale);
  const coilsRaw = Array.isArray(normalised.coils) ? normalised.coils : [];
  const coilsInput = Array.isArray(rawRecord.coils) ? (rawRecord.coils as unknown[]) : [];

  // Unique coil ids.
  const firstUse = new Map<string, number>();
  coilsRaw.forEach((coil, index) => {
    const id = asString(asRecord(coil).id);
    if (id === undefined) return;
    const earlier = firstUse.get(id);
    if (earlier !== undefined) {
      problems.push(problemAt(`coils[${index}].id`, `a name not used by another coil (coils[${earlier}] is already "${id}")`, id));
    } else firstUse.set(id, index);
  });

  // No coil or pickup named like a wiring number ("w12" selects a wiring wherever a wiring is named).
  coilsRaw.forEach((coil, index) => {
    for (const field of ['id', 'pickup'] as const) {
      const name = asString(asRecord(coil)[field]);
      if (name !== undefined && WIRING_NUMBER_PATTERN.test(name)) {
        problems.push(problemAt(`coils[${index}].${field}`, 'a name that is not a wiring number like "w1" (those select wirings)', name));
      }
    }
  });

  // Coils inside the scale.
  if (scaleM !== undefined) {
    const scaleText = `0–${formatEngineering(scaleM * 1000)} mm`;
    coilsRaw.forEach((coil, index) => {
      const position = asRecord(coil).position;
      const positionInput = asRecord(coilsInput[index]).position;
      const check = (value: unknown, input: unknown, at: string): void => {
        if (typeof value === 'number' && value >= scaleM) {
          problems.push(problemAt(at, `a length inside the scale (${scaleText})`, input));
        }
      };
      if (typeof position === 'object' && position !== null) {
        check(asRecord(position).bass, asRecord(positionInput).bass, `coils[${index}].position.bass`);
        check(asRecord(position).treble, asRecord(positionInput).treble, `coils[${index}].position.treble`);
      } else check(position, positionInput, `coils[${index}].position`);
    });
  }

  // Pickups and the coils they house.
  const pickupsRaw = asRecord(normalised.pickups);
  const members = new Map<string, number[]>();
  coilsRaw.forEach((coil, index) => {
    const pickupName = asString(asRecord(coil).pickup);
    if (pickupName === undefined) return;
    if (firstUse.has(pickupName)) {
      problems.push(problemAt(`coils[${index}].pickup`, 'a pickup name that is not also a coil id', pickupName));
    }
    members.set(pickupName, [...(members.get(pickupName) ?? []), index]);
  });
  for (const [name, entry] of Object.entries(pickupsRaw)) {
    const housed = members.get(name) ?? [];
    if (housed.length === 0) {
      problems.push(problemAt(`pickups.${name}`, `a pickup named by at least one coil's "pickup" field`, 'no coil in it'));
    }
    if (asRecord(entry).leads === 2 && housed.length === 1) {
      problems.push(problemAt(`pickups.${name}.leads`, 'two or more coils in a two-lead pickup (one coil has two leads anyway)', `1 coil`));
    }
    if (firstUse.has(name)) {
      problems.push(problemAt(`pickups.${name}`, 'a pickup name that is not also a coil id', name));
    }
  }

  // Cable: a total, or a length with capacitance per metre, not both.
  const cableRaw = asRecord(normalised.cable);
  const cableInput = asRecord(rawRecord.cable);
  if (cableInput.capacitance !== undefined && cableInput.length !== undefined) {
    problems.push(problemAt('cable', 'either "capacitance", or "length" with "capacitancePerMetre", not both', cableInput));
  }
  if (cableInput.capacitancePerMetre !== undefined && cableInput.length === undefined) {
    problems.push(problemAt('cable.length', 'a length to go with "capacitancePerMetre"', undefined));
  }
  const cableLengthM = asNumber(cableRaw.length);
  if (cableLengthM !== undefined && cableInput.capacitance === undefined) {
    // Total = length × capacitance per metre must stay in the range a total capacitance is accepted in.
    const perMetreF = asNumber(cableRaw.capacitancePerMetre) ?? DEFAULT_CABLE_CAPACITANCE_PER_METRE_F;
    const totalF = cableLengthM * perMetreF;
    if (!(totalF >= CABLE_CAPACITANCE_MIN_F && totalF <= CABLE_CAPACITANCE_MAX_F)) {
      problems.push(
        problemAt(
          'cable.length',
          `a lead whose total capacitance (length × capacitancePerMetre) is between 1 pF and 20 nF`,
          `${String(cableInput.length)} × ${String(cableInput.capacitancePerMetre ?? `${formatEngineering(perMetreF, 'F')}/m`)} = ${formatEngineering(totalF, 'F')}`,
        ),
      );
    }
  }

  // Treble bleed: a series arrangement needs its resistor.
  const bleedRaw = asRecord(normalised.controls).trebleBleed;
  if (bleedRaw && asRecord(bleedRaw).arrangement === 'series' && asRecord(bleedRaw).resistor === undefined) {
    problems.push(problemAt('controls.trebleBleed.resistor', 'a resistor for the "series" arrangement', undefined));
  }

  if (problems.length > 0) throw new InputError(problems);

  const coils = coilsRaw.map((entry, index) => buildCoil(asRecord(entry), index, assumed));
  const pickups: Pickup[] = [...members.entries()].map(([name, coilIndices]) => ({
    name,
    leads: asRecord(pickupsRaw[name]).leads === 2 ? 2 : 4,
    coilIndices,
    coupling: asNumber(asRecord(pickupsRaw[name]).coupling) ?? DEFAULT_PICKUP_COUPLING,
  }));
  // A pickup with no entry of its own still couples its coils by the default k: say so.
  for (const pickup of pickups) {
    const path = `pickups.${pickup.name}.coupling`;
    if (pickup.coilIndices.length > 1 && pickupsRaw[pickup.name] === undefined && !assumed.includes(path)) assumed.push(path);
  }
  const elements = buildElements(coils, pickups);
  if (elements.length > MAX_WIRING_ELEMENTS) {
    const count = wiringCountFor(elements.length);
    throw new InputError([
      {
        path: 'coils',
        expected: `at most ${MAX_WIRING_ELEMENTS} wiring elements (coils on their own leads plus two-lead pickups; ${MAX_WIRING_ELEMENTS} give ${formatCount(wiringCountFor(MAX_WIRING_ELEMENTS))} wirings)`,
        got: `${elements.length} elements, which would give ${formatCount(count)} wirings`,
      },
    ]);
  }

  const tuningInput = Array.isArray(rawRecord.tuning) ? (rawRecord.tuning as unknown[]) : undefined;
  const tuning = (normalised.tuning as number[]).map((hz, index): OpenString => {
    const written = tuningInput?.[index];
    return {
      index,
      number: (normalised.tuning as number[]).length - index,
      openHz: hz,
      name: typeof written === 'string' && parseNoteName(written) !== undefined ? written.trim() : noteName(hzToMidi(hz)),
    };
  });

  return Object.freeze({
    name: asString(normalised.name) ?? '',
    notes: asString(normalised.notes),
    scaleM: scaleM ?? 0,
    strings: Object.freeze(tuning),
    coils: Object.freeze(coils),
    pickups: Object.freeze(pickups),
    elements: Object.freeze(elements),
    controls: buildControls(asRecord(normalised.controls)),
    cable: buildCable(cableRaw),
    amp: buildAmp(asRecord(normalised.amp)),
    assumed: Object.freeze(assumed),
  });
}

/**
 * A coil with its derived figures: construction (steel poles inside a pickup
 * housing, rod magnets otherwise), turns (N = N0·√(L/L0) when missing),
 * sensitivities (turns / nominal turns when missing) and the eddy branch
 * (docs/physics.md §1.6).
 */
function buildCoil(entry: Raw, index: number, assumed: string[]): Coil {
  const position = entry.position;
  const bass = typeof position === 'number' ? position : (asNumber(asRecord(position).bass) ?? 0);
  const treble = typeof position === 'number' ? position : (asNumber(asRecord(position).treble) ?? 0);
  const inductanceH = entry.inductance as number;
  const pickupName = asString(entry.pickup);
  let construction: CoilConstruction;
  if (entry.construction === 'rod magnets' || entry.construction === 'steel poles') construction = entry.construction;
  else {
    construction = pickupName === undefined ? 'rod magnets' : 'steel poles';
    assumed.push(`coils[${index}].construction`);
  }
  const defaults = CONSTRUCTION_DEFAULTS[construction];
  const givenTurns = asNumber(entry.turns);
  const turns = givenTurns ?? turnsFromInductance(inductanceH, construction);
  const relativeTurns = turns / defaults.nominalTurns;
  const givenSensitivity = asNumber(entry.sensitivity);
  const eddyShare = asNumber(entry.eddyShare) ?? defaults.eddyShare;
  const eddyCornerHz = asNumber(entry.eddyCorner) ?? defaults.eddyCornerHz;
  return Object.freeze({
    id: asString(entry.id) ?? '',
    index,
    positionBassM: bass,
    positionTrebleM: treble,
    resistanceOhms: entry.resistance as number,
    inductanceH,
    capacitanceF: entry.capacitance as number,
    apertureM: entry.aperture as number,
    winding: entry.winding === 'ccw' ? 'ccw' : 'cw',
    magnet: entry.magnet === 'south' ? 'south' : 'north',
    construction,
    turns,
    turnsSource: givenTurns === undefined ? 'inductance' : 'file',
    lossResistanceOhms: asNumber(entry.lossResistance) ?? null,
    eddyShare,
    eddyResistanceOhms: eddyResistanceFromCorner(eddyCornerHz, eddyShare, inductanceH),
    sensitivity: givenSensitivity ?? relativeTurns,
    humSensitivity: asNumber(entry.humSensitivity) ?? relativeTurns,
    sensitivityGiven: givenSensitivity !== undefined,
    pickup: pickupName,
    notes: asString(entry.notes),
  });
}

/** Coils on their own leads are elements; a two-lead pickup is one element, placed where its first coil is declared. */
function buildElements(coils: readonly Coil[], pickups: readonly Pickup[]): WiringElement[] {
  const twoLead = new Map(pickups.filter((p) => p.leads === 2).map((p) => [p.name, p]));
  const elements: WiringElement[] = [];
  const placed = new Set<string>();
  for (const coil of coils) {
    const housing = coil.pickup === undefined ? undefined : twoLead.get(coil.pickup);
    if (housing === undefined) {
      elements.push({ id: coil.id, index: elements.length, kind: 'coil', coilIndices: [coil.index] });
    } else if (!placed.has(housing.name)) {
      placed.add(housing.name);
      elements.push({ id: housing.name, index: elements.length, kind: 'two-lead pickup', coilIndices: housing.coilIndices });
    }
  }
  return elements.map((element) => Object.freeze(element));
}

function buildPot(raw: Raw): Pot {
  return {
    potOhms: raw.pot as number,
    setting: raw.setting as number,
    taper: raw.taper === 'linear' ? 'linear' : 'audio',
    audioMidpoint: raw.audioMidpoint as number,
  };
}

function buildControls(raw: Raw): Controls {
  const tone = raw.tone === null || raw.tone === undefined ? null : asRecord(raw.tone);
  const bleed = raw.trebleBleed === null || raw.trebleBleed === undefined ? null : asRecord(raw.trebleBleed);
  const toneControl: ToneControl | null = tone ? { ...buildPot(tone), capacitorF: tone.capacitor as number } : null;
  const trebleBleed: TrebleBleed | null = bleed
    ? {
        capacitorF: bleed.capacitor as number,
        resistorOhms: asNumber(bleed.resistor),
        arrangement: bleed.arrangement === 'series' ? 'series' : 'parallel',
      }
    : null;
  return Object.freeze({ volume: buildPot(asRecord(raw.volume)), tone: toneControl, trebleBleed });
}

function buildCable(raw: Raw): Cable {
  const lengthM = asNumber(raw.length);
  if (lengthM !== undefined) {
    const perMetre = asNumber(raw.capacitancePerMetre) ?? DEFAULT_CABLE_CAPACITANCE_PER_METRE_F;
    return { capacitanceF: lengthM * perMetre, lengthM, capacitancePerMetreF: perMetre };
  }
  const total = asNumber(raw.capacitance) ?? parseQuantity(DEFAULT_CABLE_CAPACITANCE, 'capacitance');
  return { capacitanceF: total, lengthM: undefined, capacitancePerMetreF: undefined };
}

function buildAmp(raw: Raw): Amp {
  return { resistanceOhms: raw.resistance as number, capacitanceF: raw.capacitance as number };
}

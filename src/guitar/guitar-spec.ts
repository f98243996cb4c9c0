/**
 * The guitar file, field by field: types, plausible ranges, defaults and
 * where each default comes from. Plausible ranges are wide on purpose: they
 * catch slips of unit or prefix ("473" farads, "2.4mH" for a pickup), not
 * unusual but real parts.
 */
import type { FieldEntry, FieldSpec, ObjectSpec, QuantitySpec } from './field-spec.js';

/** Identifier shape for coils and pickups: a letter, then letters, digits, "-", "_" or ".". */
export const ID_PATTERN = /^[A-Za-z][A-Za-z0-9_.-]{0,31}$/u;
const ID_PATTERN_TEXT = 'a name of 1–32 letters, digits, "-", "_" or "." starting with a letter';

/** Knob numbers run from 0 to 10 (common practice). */
export const KNOB_MIN = 0;
export const KNOB_MAX = 10;

function quantity(
  quantityKind: QuantitySpec['quantity'],
  description: string,
  min: number,
  max: number,
  rangeText: string,
  zeroAllowed = false,
): QuantitySpec {
  return { type: 'quantity', quantity: quantityKind, description, min, max, rangeText, zeroAllowed };
}


const knob = (what: string): FieldSpec => ({
  type: 'number',
  description: `${what} knob setting, 0 (fully down) to 10 (fully up).`,
  min: KNOB_MIN,
  max: KNOB_MAX,
  noun: 'a knob setting',
});

const taper: FieldSpec = {
  type: 'enum',
  description:
    'Pot taper: "audio" (logarithmic; by default 10 % of the track at the mid setting) or "linear".',
  values: ['audio', 'linear'],
};

const audioMidpoint: FieldSpec = {
  type: 'number',
  description:
    'For an audio taper: the fraction of the track resistance reached at setting 5 (0.1 for the common "10 %" pot; 0.15 to 0.4 for gentler tapers).',
  min: 0.01,
  max: 0.49,
  noun: 'a fraction',
};

const position: FieldSpec = {
  type: 'scalar-or-object',
  description:
    'Distance from the bridge saddle to the coil centre. A slanted coil gives { "bass": …, "treble": … }: the distance under the lowest and the highest string.',
  scalar: quantity('length', 'Distance from the bridge saddle to the coil centre.', 0, 2, '0 and 2 m'),
  object: {
    type: 'object',
    description: 'A slanted coil.',
    fields: {
      bass: { spec: quantity('length', 'Distance under the lowest string.', 0, 2, '0 and 2 m'), required: true },
      treble: { spec: quantity('length', 'Distance under the highest string.', 0, 2, '0 and 2 m'), required: true },
    },
  },
};

/**
 * Least relative sensitivity accepted, for the string signal and for hum alike: 1/1000 of nominal, 60 dB
 * down (a plausibility bound: a winding's EMF grows with its turns and area, and the `turns` field accepts
 * 100 at least against a nominal coil's thousands; far smaller values also underflow the rendered energies to
 * zero, and a hum sensitivity of 0 would make a single coil read as hum cancelling).
 */
export const MIN_RELATIVE_SENSITIVITY = 0.001;

const coil: ObjectSpec = {
  type: 'object',
  description: 'One winding: a single-coil pickup, or one coil of a humbucker.',
  fields: {
    id: {
      spec: { type: 'string', description: 'Name of the coil as used in wiring expressions.', pattern: ID_PATTERN, patternText: ID_PATTERN_TEXT, maxLength: 32 },
      required: true,
    },
    position: { spec: position, required: true },
    resistance: {
      spec: quantity('resistance', 'DC resistance of the winding.', 1, 100e3, '1 Ω and 100 kΩ'),
      required: true,
    },
    inductance: {
      spec: quantity('inductance', 'Inductance of the winding.', 0.01, 100, '10 mH and 100 H'),
      required: true,
    },
    capacitance: {
      spec: quantity('capacitance', 'Self-capacitance of the winding, across its two leads.', 1e-12, 10e-9, '1 pF and 10 nF'),
      default: '100p',
      defaultSource: 'common practice (80–200 pF is typical of pickup windings)',
    },
    aperture: {
      spec: quantity('length', 'Width of the strip of string the coil senses.', 1e-3, 0.1, '1 mm and 100 mm'),
      default: '20mm',
      defaultSource: 'from memory (a single coil senses a window of the order of 20–30 mm)',
    },
    winding: {
      spec: { type: 'enum', description: 'Winding sense seen from the top: "cw" or "ccw".', values: ['cw', 'ccw'] },
      default: 'cw',
      defaultSource: 'assumed; say it when known, since phase and hum depend on it',
    },
    magnet: {
      spec: { type: 'enum', description: 'Magnet pole facing the strings: "north" or "south".', values: ['north', 'south'] },
      default: 'north',
      defaultSource: 'assumed; say it when known, since phase depends on it',
    },
    construction: {
      spec: {
        type: 'enum',
        description:
          'How the coil is built: "rod magnets" (winding round magnet rods, the usual single coil) or "steel poles" (winding round steel poles over a bar magnet, a humbucker\'s coil). Sets the defaults for turns and losses.',
        values: ['rod magnets', 'steel poles'],
      },
    },
    turns: {
      spec: { type: 'number', description: 'Turns of wire. When missing, derived from the inductance (N ∝ √L for coils of one construction).', min: 100, max: 100000, integer: true, noun: 'a number of turns' },
    },
    lossResistance: {
      spec: quantity('resistance', 'Parallel loss resistance across the leads (core losses), as fitted to a measured impedance; absent for none.', 10e3, 10e9, '10 kΩ and 10 GΩ'),
    },
    eddyShare: {
      spec: { type: 'number', description: 'Share of the inductance that eddy currents take away at high frequency (0 for none).', min: 0, max: 0.95, noun: 'a share between 0 and 0.95' },
    },
    eddyCorner: {
      spec: quantity('frequency', 'Corner frequency of the eddy-current loss branch: above it the inductance falls by the eddy share.', 10, 1e6, '10 Hz and 1 MHz'),
    },
    sensitivity: {
      spec: { type: 'number', description: 'Relative string-signal sensitivity, e.g. a measured output relative to a nominal coil. When missing: turns / nominal turns of the construction.', min: MIN_RELATIVE_SENSITIVITY, max: 100, noun: 'a relative sensitivity' },
    },
    humSensitivity: {
      spec: { type: 'number', description: 'Relative sensitivity to a mains field (turns × area; 1 = nominal coil). When missing: turns / nominal turns of the construction.', min: MIN_RELATIVE_SENSITIVITY, max: 100, noun: 'a relative hum sensitivity' },
    },
    pickup: {
      spec: { type: 'string', description: 'Name of the pickup housing this coil (shared by the coils of a humbucker).', pattern: ID_PATTERN, patternText: ID_PATTERN_TEXT, maxLength: 32 },
    },
    notes: { spec: { type: 'string', description: 'Free text.', maxLength: 2000 } },
  },
};

/**
 * Coupling coefficient k between the coils of one pickup when the file gives
 * none (from memory: the side-by-side coils of a humbucker share a small part
 * of their flux, so their series inductance exceeds the sum of the two by a
 * few tenths of a henry; measure yours with k = (L_series − L1 − L2)/(2·√(L1·L2))).
 */
export const DEFAULT_PICKUP_COUPLING = 0.1;

const pickup: ObjectSpec = {
  type: 'object',
  description: 'A pickup housing two or more coils.',
  fields: {
    coupling: {
      spec: {
        type: 'number',
        description:
          'Magnetic coupling coefficient k between its coils: mutual inductance M = k·√(L1·L2). Positive for coils side by side (one coil\'s flux returns through the other), negative for coils stacked on one axis.',
        min: -0.99,
        max: 0.99,
        noun: 'a coupling coefficient between -0.99 and 0.99',
      },
      default: DEFAULT_PICKUP_COUPLING,
      defaultSource: 'from memory (side-by-side humbucker coils share a small part of their flux)',
    },
    leads: {
      spec: { type: 'enum', description: '2: the coils are joined in series inside the cover and wired as one element; 4: every coil on its own leads.', values: [2, 4] },
      default: 4,
      defaultSource: 'every coil on its own leads',
    },
    notes: { spec: { type: 'string', description: 'Free text.', maxLength: 2000 } },
  },
};

const controls: ObjectSpec = {
  type: 'object',
  description: 'The master volume and tone controls, and an optional treble bleed across the volume pot.',
  fields: {
    volume: {
      spec: {
        type: 'object',
        description: 'Volume pot: track from the pickups (hot) to ground, wiper to the output jack.',
        fields: {
          pot: { spec: quantity('resistance', 'Track resistance.', 1e3, 10e6, '1 kΩ and 10 MΩ'), default: '250k', defaultSource: 'common practice (250 kΩ with single coils, 500 kΩ with humbuckers)' },
          setting: { spec: knob('Volume'), default: 10, defaultSource: 'fully up' },
          taper: { spec: taper, default: 'audio', defaultSource: 'common practice' },
          audioMidpoint: { spec: audioMidpoint, default: 0.1, defaultSource: 'common practice (the usual "10 %" audio taper)', quietDefault: true },
        },
      },
      default: {},
      defaultSource: 'common practice',
    },
    tone: {
      spec: {
        type: 'object',
        description: 'Tone control: pot (as a variable resistor) in series with a capacitor, from hot to ground. null for none.',
        fields: {
          pot: { spec: quantity('resistance', 'Track resistance.', 1e3, 10e6, '1 kΩ and 10 MΩ'), default: '250k', defaultSource: 'common practice' },
          capacitor: { spec: quantity('capacitance', 'Tone capacitor.', 100e-12, 10e-6, '100 pF and 10 µF'), default: '22n', defaultSource: 'common practice (22 nF or 47 nF)' },
          setting: { spec: knob('Tone'), default: 10, defaultSource: 'fully up' },
          taper: { spec: taper, default: 'audio', defaultSource: 'common practice' },
          audioMidpoint: { spec: audioMidpoint, default: 0.1, defaultSource: 'common practice', quietDefault: true },
        },
      },
      default: {},
      defaultSource: 'common practice',
      nullable: true,
    },
    trebleBleed: {
      spec: {
        type: 'object',
        description: 'Treble bleed across the volume pot (from hot to wiper): a capacitor, optionally with a resistor in parallel or in series. null or absent for none.',
        fields: {
          capacitor: { spec: quantity('capacitance', 'Bleed capacitor.', 10e-12, 100e-9, '10 pF and 100 nF'), required: true },
          resistor: { spec: quantity('resistance', 'Bleed resistor.', 1e3, 10e6, '1 kΩ and 10 MΩ') },
          arrangement: {
            spec: { type: 'enum', description: 'How the resistor joins the capacitor: "parallel" or "series".', values: ['parallel', 'series'] },
            default: 'parallel',
            defaultSource: 'common practice',
          },
        },
      },
      nullable: true,
    },
  },
};

/** Total cable capacitance the guitar file accepts, farads (a plausibility range: a few centimetres of lead to a hundred metres of ordinary lead). */
export const CABLE_CAPACITANCE_MIN_F = 1e-12;
export const CABLE_CAPACITANCE_MAX_F = 20e-9;

const cable: ObjectSpec = {
  type: 'object',
  description: 'The lead from guitar to amplifier: give its total capacitance, or its length and capacitance per metre.',
  fields: {
    capacitance: { spec: quantity('capacitance', 'Total capacitance of the lead.', CABLE_CAPACITANCE_MIN_F, CABLE_CAPACITANCE_MAX_F, '1 pF and 20 nF') },
    length: { spec: quantity('length', 'Length of the lead.', 0.1, 100, '10 cm and 100 m') },
    capacitancePerMetre: {
      spec: quantity('capacitance', 'Capacitance per metre of lead.', 10e-12, 1e-9, '10 pF and 1 nF per metre'),
    },
  },
};

const amp: ObjectSpec = {
  type: 'object',
  description: 'The amplifier input.',
  fields: {
    resistance: { spec: quantity('resistance', 'Input resistance.', 1e3, 100e6, '1 kΩ and 100 MΩ'), default: '1M', defaultSource: 'common practice' },
    capacitance: { spec: quantity('capacitance', 'Input capacitance.', 0, 10e-9, '0 and 10 nF', true), default: '50p', defaultSource: 'from memory (a few tens of pF)' },
  },
};

/**
 * Switch hardware for `coilbench switch` (src/switching/): each switch a
 * preset named by its geometry or written out. The planner checks what the
 * shape cannot (lug numbers within the pole, at least two positions).
 */
const SWITCH_PRESET_PATTERN = /^(lever-5-position|lever-3-position|rotary-\d{1,2}-position|toggle-2-position|toggle-3-position|push-pull)-\d-pole$/u;
const switchDefinition: ObjectSpec = {
  type: 'object',
  description:
    'One switch: { "preset": "lever-5-position-2-pole" } (also lever-3-position, rotary-N-position, toggle-2-position, toggle-3-position, push-pull, each -P-pole), or written out with poles, lugs and positions.',
  fields: {
    name: { spec: { type: 'string', description: 'A name for the switch in reports.', maxLength: 40 } },
    preset: {
      spec: { type: 'string', description: 'A switch named by its geometry, like "lever-5-position-2-pole".', pattern: SWITCH_PRESET_PATTERN, patternText: 'a preset like "lever-5-position-2-pole", "toggle-2-position-2-pole", "push-pull-2-pole" or "rotary-6-position-2-pole"', maxLength: 40 },
    },
    poles: { spec: { type: 'number', description: 'Poles: identical sets of a common lug and its contact lugs, moving together.', min: 1, max: 6, integer: true, noun: 'a number of poles' } },
    lugs: { spec: { type: 'number', description: 'Contact lugs per pole (the common lug not counted).', min: 1, max: 12, integer: true, noun: 'a number of lugs' } },
    positions: {
      spec: {
        type: 'array',
        description: 'For each position, the contact lugs (numbered from 1) the common touches: [[1], [1, 2], [2], [2, 3], [3]] for a lever whose in-between positions touch two lugs; [] for a centre-off.',
        items: { type: 'array', description: 'Lugs the common touches in this position.', items: { type: 'number', description: 'A lug number, from 1.', min: 1, max: 12, integer: true, noun: 'a lug number' }, minItems: 0, maxItems: 12 },
        minItems: 2,
        maxItems: 12,
      },
    },
    notes: { spec: { type: 'string', description: 'Free text.', maxLength: 2000 } },
  },
};

const switching: ObjectSpec = {
  type: 'object',
  description: 'The switch hardware `coilbench switch` plans lug wiring for: the kit\'s positions are every combination of its switches\' positions, the first switch changing fastest.',
  fields: {
    switches: { spec: { type: 'array', description: 'The switches, in order.', items: switchDefinition, minItems: 1, maxItems: 4 }, required: true },
    notes: { spec: { type: 'string', description: 'Free text.', maxLength: 2000 } },
  },
};

/** Standard six-string tuning, lowest string first (common practice). */
export const STANDARD_TUNING: readonly string[] = Object.freeze(['E2', 'A2', 'D3', 'G3', 'B3', 'E4']);
/** Default scale: 25.5 in (common practice). */
export const DEFAULT_SCALE = '25.5in';
/** Default total cable capacitance: a few metres of ordinary lead (common practice; 300–1000 pF is typical). */
export const DEFAULT_CABLE_CAPACITANCE = '500p';

export const GUITAR_SPEC: ObjectSpec = {
  type: 'object',
  description: 'A guitar for coilbench: its coils, controls, cable and amplifier input.',
  fields: {
    $schema: { spec: { type: 'string', description: 'Address of this JSON Schema, for editors.', maxLength: 500 } },
    name: { spec: { type: 'string', description: 'Name of the guitar, shown in reports.', maxLength: 120 }, required: true },
    notes: { spec: { type: 'string', description: 'Free text.', maxLength: 5000 } },
    scale: {
      spec: quantity('length', 'Scale length: nut to bridge saddle.', 0.3, 1.2, '300 mm and 1200 mm'),
      default: DEFAULT_SCALE,
      defaultSource: 'common practice',
    },
    tuning: {
      spec: {
        type: 'array',
        description: 'Open-string pitches from the lowest string; string 1 is the highest, as the trade numbers them.',
        items: { type: 'pitch', description: 'A note like "E2" or "F#3", or a frequency in Hz.' },
        minItems: 1,
        maxItems: 12,
      },
      default: STANDARD_TUNING,
      defaultSource: 'common practice (standard six-string tuning)',
    },
    coils: {
      spec: { type: 'array', description: 'Every coil, in the order used to name and number wirings.', items: coil, minItems: 1, maxItems: 8 },
      required: true,
    },
    pickups: {
      spec: {
        type: 'record',
        description: 'Pickups that house several coils, by name. Coils name their pickup with "pickup".',
        keyPattern: ID_PATTERN,
        keyPatternText: ID_PATTERN_TEXT,
        values: pickup,
      },
      default: {},
      defaultSource: 'every coil on its own leads',
      quietDefault: true,
    },
    controls: { spec: controls, default: {}, defaultSource: 'common practice' },
    cable: { spec: cable, default: { capacitance: DEFAULT_CABLE_CAPACITANCE }, defaultSource: 'common practice' },
    amp: { spec: amp, default: {}, defaultSource: 'common practice' },
    switching: { spec: switching },
  },
};

/** Every field entry with a default, with its dotted path, for documentation. */
export function listDefaults(spec: ObjectSpec = GUITAR_SPEC, prefix = ''): Array<{ path: string; entry: FieldEntry }> {
  const found: Array<{ path: string; entry: FieldEntry }> = [];
  for (const [name, entry] of Object.entries(spec.fields)) {
    const path = prefix === '' ? name : `${prefix}.${name}`;
    if (entry.default !== undefined && entry.spec.type !== 'object') found.push({ path, entry });
    const inner = entry.spec.type === 'array' ? entry.spec.items : entry.spec;
    if (inner.type === 'object') for (const item of listDefaults(inner, inner === entry.spec ? path : `${path}[]`)) found.push(item);
  }
  return found;
}

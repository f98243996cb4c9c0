/**
 * Options of the string render: one interface, one frozen defaults object,
 * merged and validated once (`resolveStringOptions`).
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import type { OpenString } from '../guitar/index.js';
import type { PluckShape } from './render-excitation.js';
import { TYPICAL_STRING_SET_SCALE_M, typicalInharmonicity } from './typical-string-set.js';

export interface StringOptions {
  /** Sample rate, Hz: an integer from 8000 to 384000. Default 48000. */
  readonly sampleRateHz: number;
  /** Seed of the pluck noise, an integer from 0 to 2³² − 1: the same seed and input give the same bytes. Default 1. */
  readonly seed: number;
  /**
   * Time for each note's fundamental to fall by 60 dB, seconds (0.05 to 60):
   * one number for every string, one per string lowest first, or 'by-pitch'
   * (the default): T60_AT_LOW_E_S on an open 82.4 Hz string falling to
   * T60_AT_HIGH_E_S two octaves up, as a power of the open string's pitch.
   */
  readonly t60S: number | readonly number[] | 'by-pitch';
  /**
   * How slowly the highs die compared with the fundamental, 0 to 1: 0 is
   * plain Karplus–Strong averaging (darkest), 1 no extra loss of highs. One
   * number or one per string, lowest first. Default 0.5.
   */
  readonly brightness: number | readonly number[];
  /** Time the render runs on after the last pluck, seconds (0 to 60). Default 3. */
  readonly tailS: number;
  /** Pluck distance from the bridge for notes that give none, metres. Default 0.13 (common practice: players pick about 130 mm from the bridge). */
  readonly pluckM: number;
  /** How long a string plucked again takes to damp its previous note, seconds (0.001 to 1). Default 0.03. */
  readonly repluckDampS: number;
  /** Fade to silence over the end of the render, seconds (0 to 1), so the waves end at zero. Default 0.05. */
  readonly fadeOutS: number;
  /** 'natural' (seeded noise, pick direction, dynamic level) or 'ideal' (the textbook ideal pluck, for checks). Default 'natural'. */
  readonly pluckShape: PluckShape;
  /**
   * Inharmonicity coefficient B of each open string (Fletcher & Rossing
   * §2.18: f_n = n·f0·√(1 + B·n²)), 0 to MAX_INHARMONICITY: 'typical' (the
   * default: TYPICAL_INHARMONICITY, derived from a 0.010–0.046 in set in
   * typical-string-set.ts, by nearest open pitch, for the guitar's scale),
   * one number for every string, or one per string lowest first. 0 turns
   * stiffness off: the loop is then exactly the flexible-string one. A
   * fretted note's B grows as 1/L² (L the vibrating length).
   */
  readonly inharmonicity: 'typical' | number | readonly number[];
}

/** Largest B accepted (from memory: a piano's shortest treble strings reach about 0.01; guitar strings are far below). */
export const MAX_INHARMONICITY = 0.01;

/** t60 of an open low E (82.4 Hz), seconds (from memory: an electric guitar's low E sustains several seconds). */
export const T60_AT_LOW_E_S = 7;
/** t60 of an open high E (329.6 Hz), seconds (from memory: the high E rings a few seconds). */
export const T60_AT_HIGH_E_S = 3;
/** Pitches those two t60 values belong to, Hz (E2 and E4, ISO 16 equal temperament). */
const LOW_E_HZ = 82.4069;
const HIGH_E_HZ = 329.6276;

export const DEFAULT_STRING_OPTIONS: StringOptions = Object.freeze({
  sampleRateHz: 48000,
  seed: 1,
  t60S: 'by-pitch',
  brightness: 0.5,
  tailS: 3,
  pluckM: 0.13,
  repluckDampS: 0.03,
  fadeOutS: 0.05,
  pluckShape: 'natural',
  inharmonicity: 'typical',
});

/** Options with per-string values expanded, lowest string first. */
export interface ResolvedStringOptions extends StringOptions {
  readonly t60PerString: readonly number[];
  readonly brightnessPerString: readonly number[];
  /** Open-string inharmonicity B per string, lowest first. */
  readonly inharmonicityPerString: readonly number[];
}

const MIN_SAMPLE_RATE_HZ = 8000; // telephone band, the lowest rate that still holds a guitar's pitch range
const MAX_SAMPLE_RATE_HZ = 384000; // highest common audio interface rate (common practice)
const MIN_T60_S = 0.05;
const MAX_T60_S = 60;
const MAX_TAIL_S = 60;
const MIN_DAMP_S = 0.001;
const MAX_DAMP_S = 1;
const MAX_FADE_S = 1;
const MAX_SEED = 0xffffffff;
const MAX_PLUCK_M = 2; // longer than any scale (common practice: scales are under 1 m)

/** t60 by pitch: a power law through (E2, T60_AT_LOW_E_S) and (E4, T60_AT_HIGH_E_S) (modelling choice). */
export function t60ByPitchS(openHz: number): number {
  const exponent = Math.log(T60_AT_HIGH_E_S / T60_AT_LOW_E_S) / Math.log(HIGH_E_HZ / LOW_E_HZ);
  return Math.min(MAX_T60_S, Math.max(MIN_T60_S, T60_AT_LOW_E_S * (openHz / LOW_E_HZ) ** exponent));
}

const inRange = (value: unknown, low: number, high: number): value is number =>
  typeof value === 'number' && Number.isFinite(value) && value >= low && value <= high;

/** Merge `options` over the defaults and check every field once; throws InputError listing each problem. */
export function resolveStringOptions(
  options: Partial<StringOptions>,
  strings: readonly OpenString[],
  scaleM: number = TYPICAL_STRING_SET_SCALE_M,
): ResolvedStringOptions {
  const merged: StringOptions = { ...DEFAULT_STRING_OPTIONS, ...options };
  const problems: InputProblem[] = [];
  const check = (ok: boolean, name: string, expected: string, value: unknown): void => {
    if (!ok) problems.push(problemAt(`options.${name}`, expected, value));
  };
  check(
    Number.isInteger(merged.sampleRateHz) && inRange(merged.sampleRateHz, MIN_SAMPLE_RATE_HZ, MAX_SAMPLE_RATE_HZ),
    'sampleRateHz',
    `a whole number of hertz from ${MIN_SAMPLE_RATE_HZ} to ${MAX_SAMPLE_RATE_HZ}`,
    merged.sampleRateHz,
  );
  check(Number.isInteger(merged.seed) && inRange(merged.seed, 0, MAX_SEED), 'seed', `a whole number from 0 to ${MAX_SEED}`, merged.seed);
  check(inRange(merged.tailS, 0, MAX_TAIL_S), 'tailS', `seconds from 0 to ${MAX_TAIL_S}`, merged.tailS);
  check(inRange(merged.pluckM, Number.MIN_VALUE, MAX_PLUCK_M), 'pluckM', `a distance from the bridge in metres, above 0 and at most ${MAX_PLUCK_M}`, merged.pluckM);
  check(inRange(merged.repluckDampS, MIN_DAMP_S, MAX_DAMP_S), 'repluckDampS', `seconds from ${MIN_DAMP_S} to ${MAX_DAMP_S}`, merged.repluckDampS);
  check(inRange(merged.fadeOutS, 0, MAX_FADE_S), 'fadeOutS', `seconds from 0 to ${MAX_FADE_S}`, merged.fadeOutS);
  check(merged.pluckShape === 'natural' || merged.pluckShape === 'ideal', 'pluckShape', '"natural" or "ideal"', merged.pluckShape);

  const perString = (
    name: string,
    value: unknown,
    low: number,
    high: number,
    what: string,
    byPitch: ((openHz: number) => number) | undefined,
    byPitchWord = 'by-pitch',
  ): number[] => {
    if (byPitch && value === byPitchWord) return strings.map((string) => byPitch(string.openHz));
    if (inRange(value, low, high)) return strings.map(() => value);
    if (Array.isArray(value) && value.length === strings.length) {
      value.forEach((item: unknown, index) => check(inRange(item, low, high), `${name}[${index}]`, what, item));
      return value.map((item: unknown) => (typeof item === 'number' ? item : low));
    }
    const forms = byPitch ? `"${byPitchWord}", ${what}, or ${strings.length} such values` : `${what} or ${strings.length} such values`;
    check(false, name, `${forms} (one per string, lowest first)`, value);
    return strings.map(() => low);
  };
  const t60PerString = perString('t60S', merged.t60S, MIN_T60_S, MAX_T60_S, `seconds from ${MIN_T60_S} to ${MAX_T60_S}`, t60ByPitchS);
  const brightnessPerString = perString('brightness', merged.brightness, 0, 1, 'a number from 0 to 1', undefined);
  const inharmonicityPerString = perString(
    'inharmonicity',
    merged.inharmonicity,
    0,
    MAX_INHARMONICITY,
    `a coefficient B from 0 to ${MAX_INHARMONICITY}`,
    (openHz) => typicalInharmonicity(openHz, scaleM),
    'typical',
  );

  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze({ ...merged, t60PerString, brightnessPerString, inharmonicityPerString });
}

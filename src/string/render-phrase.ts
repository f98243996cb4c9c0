/**
 * Plays a phrase on a guitar's strings: one Karplus–Strong loop per note,
 * each note's travelling velocity wave at the bridge, W_s(t), summed per
 * string. The pickups turn these into coil EMFs (src/pickup).
 *
 * Physics kept here (Fletcher & Rossing, ch. 2; docs/physics.md §8):
 * - the wave speed of a string is c = 2·L·f_open and does not change with
 *   the fret; fret m shortens the vibrating length to L·2^(−m/12), so the
 *   note sounds f_open·2^(m/12);
 * - a pluck at distance p from the bridge gives the comb of `renderExcitation`;
 * - a string plucked again damps its previous note.
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import type { Guitar } from '../guitar/index.js';
import { createRandom, seedFromText } from '../math/index.js';
import { formatEngineering, SEMITONES_PER_OCTAVE } from '../units/index.js';
import { designStringLoop } from './design-string-loop.js';
import { MAX_FRET, type Phrase, type PhraseNote } from './phrase.js';
import { renderExcitation } from './render-excitation.js';
import { runStringLoop } from './run-string-loop.js';
import { type StringOptions, resolveStringOptions } from './string-options.js';

/** Millimetres in a metre (SI), for messages in the units people write. */
const MILLIMETRES_PER_METRE = 1000;

/** Height a full-velocity pluck pulls the string to, metres (from memory: a firm pluck displaces a string by a couple of millimetres). */
export const FULL_PLUCK_DISPLACEMENT_M = 0.002;

export interface StringRender {
  readonly sampleRateHz: number;
  /** Samples in each wave. */
  readonly length: number;
  /** Travelling velocity wave arriving at the bridge, m/s, per string index (lowest string first). */
  readonly waves: Float64Array[];
  /** Transverse wave speed c = 2·L·f_open per string index, m/s. */
  readonly waveSpeedsMps: number[];
}

/** What a render of `phrase` will be without rendering it: its rate, its length (the last note plus the ring-out) and its strings' wave speeds. */
export function planPhrase(guitar: Pick<Guitar, 'scaleM' | 'strings'>, phrase: Phrase, options: Partial<StringOptions> = {}): Omit<StringRender, 'waves'> {
  return phraseFrame(guitar, phrase, resolveStringOptions(options, guitar.strings, guitar.scaleM));
}

function phraseFrame(guitar: Pick<Guitar, 'scaleM' | 'strings'>, phrase: Phrase, settings: StringOptions): Omit<StringRender, 'waves'> {
  const lastTimeS = phrase.notes.reduce((latest, note) => Math.max(latest, note.timeS), 0);
  return {
    sampleRateHz: settings.sampleRateHz,
    length: Math.max(1, Math.ceil((lastTimeS + settings.tailS) * settings.sampleRateHz)),
    waveSpeedsMps: guitar.strings.map((string) => 2 * guitar.scaleM * string.openHz),
  };
}

/** Render `phrase` on the guitar's strings. Throws InputError for options or notes the guitar cannot play. */
export function renderPhrase(guitar: Pick<Guitar, 'scaleM' | 'strings'>, phrase: Phrase, options: Partial<StringOptions> = {}): StringRender {
  const settings = resolveStringOptions(options, guitar.strings, guitar.scaleM);
  checkPhraseFitsGuitar(phrase, guitar, settings.pluckM);
  const fs = settings.sampleRateHz;
  const stringCount = guitar.strings.length;
  const { length, waveSpeedsMps } = phraseFrame(guitar, phrase, settings);
  const waves = guitar.strings.map(() => new Float64Array(length));
  const dampLength = Math.max(1, Math.round(settings.repluckDampS * fs));

  // Notes in time order (stable), each with its string index (0 = lowest).
  const ordered = phrase.notes
    .map((note, order) => ({ note, order, index: stringCount - note.string, start: Math.round(note.timeS * fs) }))
    .sort((a, b) => a.start - b.start || a.order - b.order);

  ordered.forEach((entry, position) => {
    const { note, index, start } = entry;
    const open = guitar.strings[index];
    const wave = waves[index];
    const c = waveSpeedsMps[index];
    if (!open || !wave || c === undefined) return;
    const next = ordered.slice(position + 1).find((later) => later.index === index);
    const vibratingM = guitar.scaleM * 2 ** (-note.fret / SEMITONES_PER_OCTAVE);
    const frequencyHz = open.openHz * 2 ** (note.fret / SEMITONES_PER_OCTAVE);
    const loop = designStringLoop({
      sampleRateHz: fs,
      frequencyHz,
      t60S: settings.t60PerString[index] ?? 1,
      brightness: settings.brightnessPerString[index] ?? 1,
      // B = π³·E·d⁴/(64·T·L²) (Fletcher & Rossing ch. 2): the fretted length L·2^(−m/12) multiplies B by 2^(2m/12).
      inharmonicity: (settings.inharmonicityPerString[index] ?? 0) * 2 ** ((2 * note.fret) / SEMITONES_PER_OCTAVE),
    });
    const excitation = renderExcitation({
      sampleRateHz: fs,
      periodSamples: loop.periodSamples,
      waveSpeedMps: c,
      vibratingM,
      pluckM: note.pluckM ?? settings.pluckM,
      displacementM: note.velocity * FULL_PLUCK_DISPLACEMENT_M,
      velocity: note.velocity,
      direction: note.direction ?? 'down',
      shape: settings.pluckShape,
      // Seeded by the note itself, so adding a note elsewhere leaves this one's bytes unchanged.
      random: createRandom(seedFromText(`${settings.seed}:${note.string}:${start}:${note.fret}`)),
    });
    runStringLoop(loop, excitation, wave, { start, stop: length, dampStart: next ? next.start : Infinity, dampLength });
  });

  fadeOut(waves, Math.round(settings.fadeOutS * fs));
  return { sampleRateHz: fs, length, waves, waveSpeedsMps };
}

/** Raised-cosine fade over the last `samples` samples, so every wave ends at zero. */
function fadeOut(waves: readonly Float64Array[], samples: number): void {
  for (const wave of waves) {
    const count = Math.min(samples, wave.length);
    for (let i = 0; i < count; i += 1) {
      const gain = Math.sin((Math.PI / 2) * (i / count));
      const n = wave.length - 1 - i;
      wave[n] = (wave[n] as number) * gain * gain;
    }
  }
}

/** Throws InputError unless every note of `phrase` is on a string the guitar has, plucked between the bridge and the fret (so a render can refuse before it writes anything). */
export function checkPhraseFits(guitar: Pick<Guitar, 'scaleM' | 'strings'>, phrase: Phrase, options: Partial<StringOptions> = {}): void {
  checkPhraseFitsGuitar(phrase, guitar, resolveStringOptions(options, guitar.strings).pluckM);
}

/** Every note on a string the guitar has, plucked between the bridge and the fret. */
export function checkPhraseFitsGuitar(phrase: Phrase, guitar: Pick<Guitar, 'scaleM' | 'strings'>, defaultPluckM: number): void {
  const problems: InputProblem[] = [];
  const count = guitar.strings.length;
  phrase.notes.forEach((note: PhraseNote, i) => {
    const at = `notes[${i}]`;
    if (!Number.isInteger(note.string) || note.string < 1 || note.string > count) {
      problems.push(problemAt(`${at}.string`, `a string number from 1 (highest) to ${count} (lowest)`, note.string));
      return;
    }
    if (!Number.isFinite(note.timeS) || note.timeS < 0) problems.push(problemAt(`${at}.time`, 'a time in seconds, 0 or more', note.timeS));
    if (!(note.velocity > 0 && note.velocity <= 1)) problems.push(problemAt(`${at}.velocity`, 'a velocity above 0 and at most 1', note.velocity));
    if (!Number.isInteger(note.fret) || note.fret < 0 || note.fret > MAX_FRET) {
      problems.push(problemAt(`${at}.fret`, `a fret from 0 (open) to ${MAX_FRET}`, note.fret));
      return;
    }
    const vibratingM = guitar.scaleM * 2 ** (-note.fret / SEMITONES_PER_OCTAVE);
    const pluckM = note.pluckM ?? defaultPluckM;
    if (!(pluckM > 0 && pluckM < vibratingM)) {
      const path = note.pluckM === undefined ? `${at}.fret` : `${at}.pluck`;
      problems.push(
        problemAt(
          path,
          `a pluck between the bridge and the fret (${formatEngineering(vibratingM * MILLIMETRES_PER_METRE)} mm of string vibrate at fret ${note.fret}; pluck at ${formatEngineering(pluckM * MILLIMETRES_PER_METRE)} mm)`,
          note.pluckM === undefined ? note.fret : `${formatEngineering(pluckM * MILLIMETRES_PER_METRE)}mm`,
        ),
      );
    }
  });
  if (problems.length > 0) throw new InputError(problems);
}

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { YIN } from 'pitchfinder';
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { parseGuitarText } from '../guitar/index.js';
import { centsBetween, midiToHz } from '../units/index.js';
import { decibels, harmonicAmplitudes, toneAmplitude } from '../../test/support/harmonics.js';
import { builtInPhrase } from './built-in-phrase.js';
import type { Phrase, PhraseNote } from './phrase.js';
import { renderPhrase } from './render-phrase.js';

const demo = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8'));
const FS = 48000;
const phraseOf = (...notes: PhraseNote[]): Phrase => ({ name: 'test', notes });

/** Pitch by the pitchfinder package's YIN (npm pitchfinder 2.3.4), an estimator that is not ours. */
function yinPitch(wave: Float64Array, startS: number, sampleRateHz = FS): number {
  const start = Math.round(startS * sampleRateHz);
  const frame = Float32Array.from(wave.subarray(start, start + 8192));
  return YIN({ sampleRate: sampleRateHz })(frame) ?? Number.NaN;
}

describe('renderPhrase: pitch (equal temperament, A4 = 440 Hz, ISO 16:1975)', () => {
  it('the estimator itself is accurate to a fraction of a cent on a known harmonic tone at each open-string pitch', () => {
    for (const string of demo.strings) {
      const tone = Float64Array.from({ length: 16384 }, (_, n) => {
        let sum = 0;
        for (let k = 1; k <= 12; k += 1) sum += Math.sin((2 * Math.PI * k * string.openHz * n) / FS) / k;
        return sum;
      });
      expect(Math.abs(centsBetween(yinPitch(tone, 0), string.openHz))).toBeLessThan(0.2);
    }
  });

  // Flexible strings (B = 0) here: YIN reads a whole waveform's period, which a stiff string's stretched
  // partials pull sharp of its fundamental; stiff strings' fundamentals are checked in dispersion-allpass.test.ts.
  const openStrings = renderPhrase(demo, builtInPhrase('open-strings'), { inharmonicity: 0 });
  // ISO 16 pitches: E2 A2 D3 G3 B3 E4 = MIDI 40 45 50 55 59 64, f = 440·2^((m − 69)/12).
  it.each([40, 45, 50, 55, 59, 64].map((midi, index) => [index, midi]))('open-strings: string index %i (MIDI %i) within ±3 cents', (index, midi) => {
    const note = builtInPhrase('open-strings').notes[index];
    const wave = openStrings.waves[index];
    expect(note?.string).toBe(6 - index);
    for (const after of [0.3, 0.8]) {
      const cents = centsBetween(yinPitch(wave ?? new Float64Array(), (note?.timeS ?? 0) + after), midiToHz(midi));
      expect(Math.abs(cents)).toBeLessThan(3);
    }
  });

  it.each([
    [6, 5, 45], // A2
    [5, 7, 52], // E3
    [3, 12, 67], // G4
    [1, 19, 83], // B5
    [1, 24, 88], // E6
  ])('string %i fret %i sounds MIDI %i within ±3 cents', (string, fret, midi) => {
    const render = renderPhrase(demo, phraseOf({ timeS: 0, string, fret, velocity: 0.8 }), { tailS: 0.5, inharmonicity: 0 });
    const wave = render.waves[6 - string] ?? new Float64Array();
    expect(Math.abs(centsBetween(yinPitch(wave, 0.15), midiToHz(midi)))).toBeLessThan(3);
  });

  it('keeps its pitch at other sample rates', () => {
    const render = renderPhrase(demo, phraseOf({ timeS: 0, string: 1, fret: 0, velocity: 1 }), { sampleRateHz: 44100, tailS: 0.5 });
    expect(Math.abs(centsBetween(yinPitch(render.waves[5] ?? new Float64Array(), 0.15, 44100), midiToHz(64)))).toBeLessThan(3);
  });
});

describe('renderPhrase: decay, level and shape', () => {
  it.each([
    [6, 2],
    [3, 4],
    [1, 1.5],
  ])('string %i with t60 = %s s: the fundamental falls 60 dB in t60 (±3 %)', (string, t60S) => {
    const render = renderPhrase(demo, phraseOf({ timeS: 0, string, fret: 0, velocity: 1 }), { t60S, tailS: 2.5, fadeOutS: 0 });
    const index = 6 - string;
    const f1 = demo.strings[index]?.openHz ?? 0;
    const wave = render.waves[index] ?? new Float64Array();
    const early = toneAmplitude(wave, FS, f1, 0.2, 0.5);
    const late = toneAmplitude(wave, FS, f1, 1.7, 0.5);
    const dbPerSecond = decibels(early, late) / 1.5;
    const measuredT60 = 60 / dbPerSecond;
    expect(measuredT60).toBeGreaterThan(t60S * 0.97);
    expect(measuredT60).toBeLessThan(t60S * 1.03);
  });

  it('the wave speed is 2·L·f_open per string and does not change with the fret (docs/physics.md §8: E2 on 647.7 mm is 106.75 m/s)', () => {
    const guitar = { scaleM: 0.6477, strings: demo.strings };
    const open = renderPhrase(guitar, phraseOf({ timeS: 0, string: 6, fret: 0, velocity: 1 }), { tailS: 0.1 });
    const fretted = renderPhrase(guitar, phraseOf({ timeS: 0, string: 6, fret: 7, velocity: 1 }), { tailS: 0.1 });
    expect(open.waveSpeedsMps[0]).toBeCloseTo(106.75, 2);
    expect(open.waveSpeedsMps[5]).toBeCloseTo(427.0, 1);
    expect(fretted.waveSpeedsMps).toEqual(open.waveSpeedsMps);
  });

  it('louder plucks give more level; softer ones are darker (dynamic level, Jaffe & Smith 1983)', () => {
    const at = (velocity: number): number[] => {
      const render = renderPhrase(demo, phraseOf({ timeS: 0, string: 5, fret: 0, velocity }), { tailS: 1 });
      return harmonicAmplitudes(render.waves[1] ?? new Float64Array(), FS, 110, 30, 0.1, 0.5);
    };
    const hard = at(1);
    const soft = at(0.3);
    expect((hard[0] ?? 0) / (soft[0] ?? 1)).toBeGreaterThan(2.5);
    expect((soft[29] ?? 0) / (soft[0] ?? 1)).toBeLessThan((hard[29] ?? 0) / (hard[0] ?? 1));
  });

  // Pluck-position comb: notches at k·c/(2p), fixed in hertz when the string is fretted
  // (docs/physics.md §2, derived; Jaffe & Smith 1983). p = L/4 puts a notch at 4·f_open.
  // On a flexible string (B = 0): stiffness moves the partials off the harmonics this test measures at.
  it.each([
    [0, 4],
    [5, 3],
    [12, 2],
  ])('a pluck at a quarter of the scale: at fret %i, harmonic %i (= 4·f_open) is ≥ 30 dB below its neighbours', (fret, harmonic) => {
    const render = renderPhrase(demo, phraseOf({ timeS: 0, string: 6, fret, velocity: 1, pluckM: demo.scaleM / 4 }), { tailS: 1.2, inharmonicity: 0 });
    const f1 = 82.4069 * 2 ** (fret / 12);
    const levels = harmonicAmplitudes(render.waves[0] ?? new Float64Array(), FS, f1, harmonic + 1, 0.2, 0.8);
    const notch = levels[harmonic - 1] ?? 0;
    expect(decibels(levels[harmonic - 2] ?? 0, notch)).toBeGreaterThan(30);
    expect(decibels(levels[harmonic] ?? 0, notch)).toBeGreaterThan(30);
  });
});

describe('renderPhrase: determinism and re-plucks', () => {
  const bytes = (waves: Float64Array[]): Buffer => Buffer.concat(waves.map((wave) => Buffer.from(wave.buffer, wave.byteOffset, wave.byteLength)));

  it('renders the same input to the same bytes, and another seed to other bytes', () => {
    const a = renderPhrase(demo, builtInPhrase('riff'));
    const b = renderPhrase(demo, builtInPhrase('riff'));
    const c = renderPhrase(demo, builtInPhrase('riff'), { seed: 2 });
    expect(bytes(a.waves).equals(bytes(b.waves))).toBe(true);
    expect(bytes(a.waves).equals(bytes(c.waves))).toBe(false);
  });

  it('a string plucked again damps its previous note; another string is not touched', () => {
    const first: PhraseNote = { timeS: 0.05, string: 4, fret: 0, velocity: 1 };
    const again: PhraseNote = { timeS: 0.5, string: 4, fret: 2, velocity: 0.7 };
    const elsewhere: PhraseNote = { timeS: 0.5, string: 3, fret: 2, velocity: 0.7 };
    const options = { tailS: 1, fadeOutS: 0, repluckDampS: 0.03 };
    const both = renderPhrase(demo, phraseOf(first, again), options).waves[2] ?? new Float64Array();
    const firstAlone = renderPhrase(demo, phraseOf(first), { ...options, tailS: 1.45 }).waves[2] ?? new Float64Array();
    const againAlone = renderPhrase(demo, phraseOf(again), options).waves[2] ?? new Float64Array();
    const pluck = Math.round(0.5 * FS);
    const dampEnd = pluck + Math.round(0.03 * FS);
    for (let n = 0; n < pluck; n += 100) expect(both[n]).toBe(firstAlone[n]);
    for (let n = dampEnd; n < both.length; n += 100) expect(both[n]).toBe(againAlone[n]);
    // Without the damping the first note would still ring here.
    expect(Math.abs(firstAlone[dampEnd + 1000] ?? 0)).toBeGreaterThan(1e-3);
    const untouched = renderPhrase(demo, phraseOf(first, elsewhere), options).waves[2] ?? new Float64Array();
    for (let n = 0; n < untouched.length; n += 100) expect(untouched[n]).toBe(firstAlone[n]);
  });

  it('ends every wave at zero (fade-out)', () => {
    const render = renderPhrase(demo, builtInPhrase('strum'));
    for (const wave of render.waves) expect(Math.abs(wave[wave.length - 1] ?? 1)).toBe(0);
  });
});

describe('renderPhrase: bad input', () => {
  const problems = (run: () => unknown): string[] => {
    try {
      run();
    } catch (error) {
      if (error instanceof InputError) return error.problems.map((problem) => problem.path);
      throw error;
    }
    return [];
  };

  it('refuses notes the guitar cannot play, each with its path', () => {
    expect(
      problems(() =>
        renderPhrase(
          demo,
          phraseOf(
            { timeS: 0, string: 7, fret: 0, velocity: 1 },
            { timeS: 0, string: 1, fret: 0, velocity: 1, pluckM: 0.7 },
            { timeS: 0, string: 2, fret: 0, velocity: 0 },
            { timeS: 0, string: 2, fret: 30, velocity: 1 },
          ),
        ),
      ),
    ).toEqual(['notes[0].string', 'notes[1].pluck', 'notes[2].velocity', 'notes[3].fret']);
  });

  it('refuses bad options, each with its path', () => {
    expect(problems(() => renderPhrase(demo, builtInPhrase('strum'), { sampleRateHz: 1000, t60S: [1, 2], brightness: 2 }))).toEqual([
      'options.sampleRateHz',
      'options.t60S',
      'options.brightness',
    ]);
    expect(problems(() => renderPhrase(demo, builtInPhrase('strum'), { t60S: [1, 2, 3, 4, 5, -1] }))).toEqual(['options.t60S[5]']);
  });
});

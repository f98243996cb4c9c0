import { describe, expect, it } from 'vitest';
import { centsBetween, midiToHz, noteName, parseNoteName } from './pitch.js';

// Open-string frequencies of standard tuning, equal temperament with A4 = 440 Hz
// (ISO 16:1975); the values are the table in docs/physics.md §8.
const ISO16_TABLE = [
  ['E2', 40, 82.4069],
  ['A2', 45, 110.0],
  ['D3', 50, 146.8324],
  ['G3', 55, 195.9977],
  ['B3', 59, 246.9417],
  ['E4', 64, 329.6276],
] as const;

describe('pitch', () => {
  it.each(ISO16_TABLE)('%s is MIDI %d at %d Hz', (name, midi, hz) => {
    expect(parseNoteName(name)).toBe(midi);
    expect(midiToHz(midi)).toBeCloseTo(hz, 3);
    expect(noteName(midi)).toBe(name);
  });

  it('reads accidentals', () => {
    expect(parseNoteName('F#2')).toBe(42);
    expect(parseNoteName('Gb2')).toBe(42);
    expect(parseNoteName('Eb2')).toBe(39);
    expect(parseNoteName('H3')).toBeUndefined();
  });

  it('measures cents', () => {
    expect(centsBetween(440 * 2 ** (1 / 12), 440)).toBeCloseTo(100, 10);
    // E2 from a Karplus–Strong delay of 534 samples at 44.1 kHz: +2.10 cents (docs/physics.md §4.3).
    expect(centsBetween(44100 / 534.5, midiToHz(40))).toBeCloseTo(2.1, 1);
  });
});

import { describe, expect, it } from 'vitest';
import { BUILT_IN_PHRASES, builtInPhrase } from './built-in-phrase.js';
import { maxOf, minOf } from '../math/index.js';

describe('builtInPhrase', () => {
  it('open-strings plays each open string once, lowest (6) to highest (1)', () => {
    const notes = builtInPhrase('open-strings').notes;
    expect(notes.map((note) => note.string)).toEqual([6, 5, 4, 3, 2, 1]);
    expect(notes.every((note) => note.fret === 0)).toBe(true);
    expect(notes.map((note) => note.timeS)).toEqual([...notes.map((note) => note.timeS)].sort((a, b) => a - b));
  });

  it('strum is an open E major chord (E B E G# B E), down strum from the lowest string, spread under 0.1 s', () => {
    const notes = builtInPhrase('strum').notes;
    expect(notes.map((note) => [note.string, note.fret])).toEqual([
      [6, 0],
      [5, 2],
      [4, 2],
      [3, 1],
      [2, 0],
      [1, 0],
    ]);
    expect(notes.every((note) => note.direction === 'down')).toBe(true);
    const times = notes.map((note) => note.timeS);
    expect(maxOf(times) - minOf(times)).toBeLessThan(0.1);
  });

  it('riff is a single-note line: one note at a time, in time order', () => {
    const notes = builtInPhrase('riff').notes;
    expect(notes.length).toBeGreaterThan(8);
    for (let i = 1; i < notes.length; i += 1) expect(notes[i]?.timeS ?? 0).toBeGreaterThan(notes[i - 1]?.timeS ?? 0);
  });

  it('follows the guitar: more strings in open-strings, notes on missing strings left out', () => {
    expect(builtInPhrase('open-strings', 7).notes.map((note) => note.string)).toEqual([7, 6, 5, 4, 3, 2, 1]);
    expect(builtInPhrase('strum', 4).notes.map((note) => note.string)).toEqual([4, 3, 2, 1]);
    expect(BUILT_IN_PHRASES).toEqual(['open-strings', 'strum', 'riff']);
  });
});

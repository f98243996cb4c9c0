import { describe, expect, it } from 'vitest';
import { InputError } from '../errors/index.js';
import { parsePhrase } from './parse-phrase.js';

function problemsOf(text: string): { path: string; message: string }[] {
  try {
    parsePhrase(text, 'riff.json', 6);
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((problem) => ({ path: problem.path, message: `${problem.path}: expected ${problem.expected}, got ${problem.got}` }));
    throw error;
  }
  return [];
}

describe('parsePhrase', () => {
  it('reads notes with times, strings, frets, velocities, pluck lengths and directions', () => {
    const phrase = parsePhrase(
      JSON.stringify({
        name: 'two notes',
        notes: [
          { time: 0, string: 5, fret: 0, velocity: 1, pluck: '130mm' },
          { time: 0.5, string: 1, fret: 12, velocity: 0.5, pluck: '2in', direction: 'up' },
        ],
      }),
      'two.json',
      6,
    );
    expect(phrase.name).toBe('two notes');
    expect(phrase.notes).toEqual([
      { timeS: 0, string: 5, fret: 0, velocity: 1, pluckM: 0.13 },
      { timeS: 0.5, string: 1, fret: 12, velocity: 0.5, pluckM: 0.0508, direction: 'up' },
    ]);
  });

  it('names the phrase after its file when it has no name', () => {
    expect(parsePhrase('{ "notes": [ { "time": 0, "string": 6, "fret": 0, "velocity": 1 } ] }', 'open.json', 6).name).toBe('open.json');
  });

  it('reports JSON syntax errors with line and column', () => {
    expect(problemsOf('{ "notes": [ { "time": 0, } ] }')[0]?.path).toBe('riff.json:1:27');
  });

  it('reports every problem at once, each with its path', () => {
    const problems = problemsOf(
      JSON.stringify({
        notes: [
          { time: -1, string: 0, fret: 1.5, velocity: 2 },
          { time: 0, string: 7, fret: 25, velocity: 0, pluck: '-3mm' },
          { time: 0, string: 3, fret: 0, velocity: 1, pluck: '130', direction: 'sideways', tempo: 120 },
          'a note',
        ],
      }),
    );
    expect(problems.map((problem) => problem.path)).toEqual([
      'notes[0].time',
      'notes[0].string',
      'notes[0].fret',
      'notes[0].velocity',
      'notes[1].string',
      'notes[1].fret',
      'notes[1].velocity',
      'notes[1].pluck',
      'notes[2].tempo',
      'notes[2].pluck',
      'notes[2].direction',
      'notes[3]',
    ]);
    expect(problems[1]?.message).toBe('notes[0].string: expected a string number from 1 (highest) to 6 (lowest), got 0');
    expect(problems[5]?.message).toBe('notes[1].fret: expected a fret from 0 (open) to 24, got 25');
  });

  it('refuses a file without notes, or with unknown fields', () => {
    expect(problemsOf('{ "notes": [] }').map((problem) => problem.path)).toEqual(['notes']);
    expect(problemsOf('{ "note": [] }').map((problem) => problem.path)).toEqual(['note', 'notes']);
    expect(problemsOf('[1, 2]').map((problem) => problem.path)).toEqual(['riff.json']);
    expect(problemsOf('{ "name": 3, "notes": [ { "time": 0, "string": 1, "fret": 0, "velocity": 1 } ] }').map((problem) => problem.path)).toEqual(['name']);
  });
});

import { describe, expect, it } from 'vitest';
import { closestName, editDistance, listWithSuggestion, oneOfChoices } from './closest-name.js';

describe('editDistance', () => {
  // Worked values: "kitten" → "sitting" is 3 (the textbook Levenshtein example); a swap of neighbours is one edit
  // in the optimal string alignment distance ("ca" → "ac"), and "ca" → "abc" is 3 there (not 2 as with unrestricted
  // Damerau–Levenshtein: the swapped pair may not be edited again).
  it.each([
    ['kitten', 'sitting', 3],
    ['', 'abc', 3],
    ['abc', 'abc', 0],
    ['ca', 'ac', 1],
    ['ca', 'abc', 3],
    ['nekc', 'neck', 1],
  ])('%s → %s is %d', (a, b, distance) => {
    expect(editDistance(a, b)).toBe(distance);
    expect(editDistance(b, a)).toBe(distance);
  });
});

describe('closestName', () => {
  const fields = ['id', 'position', 'resistance', 'inductance', 'capacitance', 'aperture'];
  it('finds the field or coil a typo meant, ignoring letter case', () => {
    expect(closestName('resistence', fields)).toBe('resistance');
    expect(closestName('inductence', fields)).toBe('inductance');
    expect(closestName('Id', fields)).toBe('id');
    expect(closestName('nekc', ['neck', 'mid', 'bridge'])).toBe('neck');
    expect(closestName('brige', ['neck', 'mid', 'bridge'])).toBe('bridge');
  });

  it('suggests nothing for a word far from every name, too short to tell, or equally near two', () => {
    expect(closestName('colour', fields)).toBeUndefined();
    expect(closestName('x', ['y', 'z'])).toBeUndefined();
    expect(closestName('bridg', ['bridge1', 'bridge2'])).toBeUndefined();
    expect(listWithSuggestion('zzz', ['id', 'position'])).toBe('id, position');
    expect(listWithSuggestion('positon', ['id', 'position'])).toBe('id, position; did you mean position?');
  });
});

describe('oneOfChoices', () => {
  const chains = ['direct', 'clean', 'drive', 'compressed'];
  it('lists the choices and names the one a typo meant', () => {
    expect(oneOfChoices('cleen', chains)).toBe('one of direct, clean, drive, compressed (did you mean clean?)');
    expect(oneOfChoices('Drive', chains)).toBe('one of direct, clean, drive, compressed (did you mean drive?)');
    expect(oneOfChoices('pcm32', ['pcm24', 'pcm16', 'f32'])).toBe('one of pcm24, pcm16, f32');
    expect(oneOfChoices('sout', ['north', 'south'], true)).toBe('one of "north" or "south" (did you mean "south"?)');
    expect(oneOfChoices('cww', ['cw', 'ccw'], true)).toBe('one of "cw" or "ccw"');
  });

  it('suggests nothing for a value that is not text or is far from every choice', () => {
    expect(oneOfChoices(3, chains)).toBe('one of direct, clean, drive, compressed');
    expect(oneOfChoices('fuzz', chains)).toBe('one of direct, clean, drive, compressed');
  });
});

import { describe, expect, it } from 'vitest';
import { guitarFolderName } from './folder-name.js';

describe('guitarFolderName', () => {
  it('keeps Latin names readable as they were', () => {
    expect(guitarFolderName('Demo three single-coil guitar (invented values)')).toBe('demo-three-single-coil-guitar-invented-values');
    expect(guitarFolderName('Café guitar')).toBe('cafe-guitar');
  });

  it('gives names in other scripts, symbols only, or dots their own folder, never "..", "~" or a shared "guitar"', () => {
    const names = ['..', '.', '~', '/', '', '   ', 'Гитара', 'Гитара 2', 'ギター', 'ギタ', 'My Гитара', 'My ギター', '🎸', '🎸🎸'];
    const folders = names.map(guitarFolderName);
    expect(new Set(folders).size).toBe(names.length);
    for (const folder of folders) {
      expect(folder).toMatch(/^[a-z0-9]+(?:-[a-z0-9]+)*$/u);
      expect(folder).not.toBe('guitar');
    }
    expect(guitarFolderName('My Гитара')).toMatch(/^my-[0-9a-f]{8}$/u);
  });

  it('keeps two long names that share their first 60 characters apart', () => {
    const stem = 'A very long guitar name that goes on and on past the limit of sixty';
    expect(guitarFolderName(`${stem} one`)).not.toBe(guitarFolderName(`${stem} two`));
  });
});

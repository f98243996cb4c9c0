import { describe, expect, it } from 'vitest';
import { enumerateWirings } from '../wiring/index.js';
import { netlistFileName, wavFileName } from './index.js';

/** NAME_MAX of common file systems, bytes. */
const NAME_MAX_BYTES = 255;

describe('WAV and netlist names', () => {
  const elements = ['neck_slug', 'neck_screw', 'middle', 'bridge_screw', 'bridge_slug'].map((id, index) => ({ id, index, kind: 'coil' as const, coilIndices: [index] }));
  const wirings = enumerateWirings(elements);

  it('read differently after their number for every wiring of five coils (no cut that merges descriptions)', () => {
    const readable = wirings.map((wiring) => wavFileName(wiring).replace(/^w\d+-/u, ''));
    expect(new Set(readable).size).toBe(wirings.length);
    expect(new Set(wirings.map(netlistFileName)).size).toBe(wirings.length);
  });

  it('fit a file name with the page copy\'s ".js" added', () => {
    for (const wiring of wirings) expect(Buffer.byteLength(`${wavFileName(wiring)}.js`)).toBeLessThanOrEqual(NAME_MAX_BYTES);
  });

  it('keep a short description whole', () => {
    expect(wavFileName({ id: 'w9', description: 'neck and bridge in series, bridge out of phase' })).toBe('w9-neck-and-bridge-in-series-bridge-out-of-phase.wav');
  });
});

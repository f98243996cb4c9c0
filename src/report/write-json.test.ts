import { describe, expect, it } from 'vitest';
import { mapIterable, writeJson, writeJsonPausing } from './write-json.js';

const written = (value: unknown): { text: string; writes: number } => {
  let text = '';
  let writes = 0;
  writeJson(value, (part) => {
    text += part;
    writes += 1;
  });
  return { text, writes };
};

describe('writeJson', () => {
  it('prints exactly what JSON.stringify(value, null, 2) prints, long arrays included', () => {
    const long = Array.from({ length: 3000 }, (_, i) => ({ id: `w${i + 1}`, coils: ['a', 'b'], note: i % 7 === 0 ? undefined : 'x\ny "q"', n: i / 3 }));
    const values: unknown[] = [
      { guitar: 'g', count: long.length, wirings: long, empty: [], nested: { deep: long.slice(0, 300), skip: undefined } },
      long,
      [1, undefined, () => 1, 'a'],
      { a: 1 },
      'text',
      [],
      {},
    ];
    for (const value of values) expect(written(value).text).toBe(`${JSON.stringify(value, null, 2)}\n`);
  });

  it('writes a long document in many chunks, none of them the whole', () => {
    const long = Array.from({ length: 5_000 }, (_, i) => ({ id: `w${i + 1}`, description: 'neck and bridge in series' }));
    const { text, writes } = written({ wirings: long });
    expect(writes).toBeGreaterThan(3);
    expect(JSON.parse(text)).toEqual({ wirings: long });
  });

  it('prints a streamed array (items made as they are written) exactly as JSON.stringify prints the array, pausing between items', async () => {
    const items = Array.from({ length: 1000 }, (_, i) => ({ id: `w${i + 1}`, coils: ['a'], n: i / 7 }));
    for (const value of [items, items.slice(0, 3), []]) {
      const document = { guitar: 'g', count: value.length, wirings: value };
      let text = '';
      let pauses = 0;
      await writeJsonPausing({ ...document, wirings: mapIterable(value, (item) => ({ ...item })) }, (part) => (text += part), async () => {
        pauses += 1;
      });
      expect(text).toBe(`${JSON.stringify(document, null, 2)}\n`);
      expect(pauses).toBeGreaterThanOrEqual(value.length);
      expect(written({ wirings: mapIterable(value, (item) => item) }).text).toBe(`${JSON.stringify({ wirings: value }, null, 2)}\n`);
    }
  });
});

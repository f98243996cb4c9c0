import { describe, expect, it } from 'vitest';
import { MessageChannel } from 'node:worker_threads';
import { transferablesOf } from './transferables.js';

describe('transferablesOf', () => {
  it('finds the buffer behind every typed array once, however deep and however many views share it', () => {
    const shared = new Float64Array(8);
    const own = new Float32Array(3);
    const value = { a: shared.subarray(0, 4), list: [shared.subarray(4), { deeper: [own, null, 'text', 7] }], same: shared, plain: [1, 2] };
    const found = transferablesOf(value);
    expect(found).toHaveLength(2);
    expect(new Set(found)).toEqual(new Set([shared.buffer, own.buffer]));
    expect(transferablesOf({ numbers: [1, 2, 3], text: 'x', empty: null })).toEqual([]);
  });

  it('gives a list a port accepts: the receiver gets the same values, the sender is left with empty views', async () => {
    const responses = new Float64Array(6).map((_, index) => index / 3);
    const value = { responses: [responses.subarray(0, 3), responses.subarray(3)], figures: [{ energy: 1 }] };
    const { port1, port2 } = new MessageChannel();
    const received = new Promise<typeof value>((resolve) => port2.once('message', resolve));
    port1.postMessage(value, transferablesOf(value));
    const got = await received;
    port1.close();
    expect(Array.from(got.responses[1] ?? [])).toEqual([1, 4 / 3, 5 / 3]);
    expect(got.responses[0]?.buffer).toBe(got.responses[1]?.buffer);
    expect(responses.length).toBe(0); // moved, not copied
  });
});

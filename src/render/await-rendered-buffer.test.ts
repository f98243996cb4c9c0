import { describe, expect, it } from 'vitest';
import { WorkError } from '../errors/index.js';
import { type RenderedBuffer, type RenderingContext, awaitRenderedBuffer } from './await-rendered-buffer.js';

const buffer: RenderedBuffer = { copyFromChannel: () => undefined };

/**
 * A stand-in for node-web-audio-api 1.0.9's OfflineAudioContext: the promise
 * resolves to `promiseValue`; the `complete` event (carrying the buffer) is
 * dispatched `eventDelayMs` after the promise settles (negative: before it;
 * null: never), as the library does when its two signals arrive in either order.
 */
function fakeContext(promiseValue: RenderedBuffer | null, eventDelayMs: number | null): RenderingContext & { listeners: number } {
  const listeners = new Set<(event: Event) => void>();
  const fire = (): void => {
    const event = Object.assign(new Event('complete'), { renderedBuffer: buffer });
    for (const listener of listeners) listener(event);
  };
  return {
    get listeners() {
      return listeners.size;
    },
    addEventListener: (_type, listener) => listeners.add(listener),
    removeEventListener: (_type, listener) => listeners.delete(listener),
    async startRendering() {
      if (eventDelayMs !== null && eventDelayMs < 0) fire();
      if (eventDelayMs !== null && eventDelayMs >= 0) setTimeout(fire, eventDelayMs);
      return promiseValue;
    },
  };
}

describe('awaitRenderedBuffer (the promise/complete-event race of node-web-audio-api 1.0.9)', () => {
  it('uses the promise when it brings the buffer', async () => {
    const context = fakeContext(buffer, null);
    await expect(awaitRenderedBuffer(context, 50)).resolves.toEqual({ buffer, source: 'promise' });
    expect(context.listeners).toBe(0);
  });

  it('takes the buffer from the complete event when the promise gives null and the event comes later', async () => {
    const context = fakeContext(null, 20);
    await expect(awaitRenderedBuffer(context, 2000)).resolves.toEqual({ buffer, source: 'complete-event' });
    expect(context.listeners).toBe(0);
  });

  it('takes the buffer from a complete event that came before the promise settled', async () => {
    await expect(awaitRenderedBuffer(fakeContext(null, -1), 50)).resolves.toEqual({ buffer, source: 'complete-event' });
  });

  it('fails with a clear WorkError after the bounded wait when neither brings a buffer', async () => {
    const context = fakeContext(null, null);
    const started = Date.now();
    const failure = await awaitRenderedBuffer(context, 30).catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(WorkError);
    expect((failure as Error).message).toMatch(/finished without a result .*within 30 ms/);
    expect(Date.now() - started).toBeGreaterThanOrEqual(25);
    expect(context.listeners).toBe(0);
  });
});

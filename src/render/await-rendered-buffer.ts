/**
 * Start an OfflineAudioContext's rendering and get its buffer even when the
 * library loses the race between its two completion signals.
 *
 * In node-web-audio-api 1.0.9 the native side reports the end of a render
 * twice, on two separate channels to the JavaScript thread: the promise of
 * `startRendering()` and the context's `complete` event (an
 * OfflineAudioCompletionEvent carrying `renderedBuffer`, Web Audio API
 * §1.3.4 and §1.4, W3C Recommendation 2021). The promise's value is the
 * buffer the completion callback stored; when the promise settles first
 * (under CPU load, when the thread sending the completion is descheduled),
 * it resolves to null. The `complete` event still arrives a little later with
 * the buffer, so it is the second source here:
 *
 * - the listener is attached before rendering starts, so the event cannot be
 *   missed;
 * - a non-null promise value is used at once (the event is not awaited);
 * - otherwise the event is awaited for at most `waitMs`, then a WorkError
 *   says that neither signal brought a buffer.
 */
import { WorkError } from '../errors/index.js';

/** Longest wait for the `complete` event after the promise gave nothing, ms (our choice: far above the few ms the two signals lie apart even on a loaded machine, short enough to report a stuck render). */
export const COMPLETE_EVENT_WAIT_MS = 10_000;

/** What is read from a rendered buffer. */
export interface RenderedBuffer {
  copyFromChannel(destination: Float32Array, channelNumber: number, bufferOffset?: number): void;
}

/** The part of an OfflineAudioContext used here (a fake in tests). */
export interface RenderingContext {
  startRendering(): Promise<RenderedBuffer | null | undefined>;
  addEventListener(type: 'complete', listener: (event: Event) => void): void;
  removeEventListener(type: 'complete', listener: (event: Event) => void): void;
}

/** How the buffer was obtained (counted by the stress test). */
export type BufferSource = 'promise' | 'complete-event';

/** Render `context` and resolve to its buffer and where it came from; rejects with a WorkError after `waitMs` if neither signal brings one. */
export async function awaitRenderedBuffer(
  context: RenderingContext,
  waitMs = COMPLETE_EVENT_WAIT_MS,
): Promise<{ buffer: RenderedBuffer; source: BufferSource }> {
  let fromEvent: RenderedBuffer | null = null;
  let wake: (() => void) | null = null;
  const listener = (event: Event): void => {
    fromEvent = (event as Event & { renderedBuffer?: RenderedBuffer | null }).renderedBuffer ?? null;
    wake?.();
  };
  context.addEventListener('complete', listener);
  try {
    const fromPromise = await context.startRendering();
    if (fromPromise) return { buffer: fromPromise, source: 'promise' };
    if (!fromEvent) {
      let timer: ReturnType<typeof setTimeout> | undefined;
      await new Promise<void>((resolve) => {
        wake = resolve;
        timer = setTimeout(resolve, waitMs);
      });
      clearTimeout(timer);
    }
    const buffer = fromEvent as RenderedBuffer | null;
    if (!buffer) {
      throw new WorkError(`the effects chain's render finished without a result (no buffer from startRendering, no complete event within ${waitMs} ms)`);
    }
    return { buffer, source: 'complete-event' };
  } finally {
    context.removeEventListener('complete', listener);
  }
}

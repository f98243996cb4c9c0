/**
 * A second thread for the render's second pass: while the render's own
 * thread encodes one final WAV file and writes it, the encoding thread
 * (encode-worker.ts) encodes others. The bytes are the same from either
 * thread (encode-final-wav.ts); only the render's own thread writes files.
 */
import type { Worker } from 'node:worker_threads';
import { WorkError } from '../errors/index.js';
import type { EncodedWav } from './encode-final-wav.js';
import type { FileRecord } from './file-record.js';
import type { WavOptions } from './wav-file.js';
import { defaultThreadCount, startRenderWorker } from './worker-threads.js';
import { type WorkerFailure, errorOfFailure } from './worker-failure.js';

/**
 * Fewest files worth the thread (our choice): it starts in about 0.1 s, and
 * a file costs about 2–3 ms to encode and record (24-bit, 2.6 s at 44.1 kHz),
 * so a few dozen files would not repay it. On 572 files (`npm run bench --
 * commands`) the render went from 6.42 to 6.32–6.36 s, within the machine's
 * noise: the second pass is mostly file I/O.
 */
export const ENCODE_THREAD_MIN_FILES = 100;

/**
 * Files handed to the thread and not yet back. The render's own thread
 * encodes a file only when this many are out, so it mostly reads, writes and
 * records while the thread encodes (572 files, `render` with the second pass
 * timed inside the process on the 2-core machine: 1.28–1.48 s with 2 in
 * flight, 1.11–1.25 s with 6; with the thread also reading parked audio from
 * its scratch file, 1.26–1.32 s against 1.34–1.50 s in a slower hour).
 */
export const ENCODE_THREAD_IN_FLIGHT = 6;

/** A file's audio: its samples, or the scratch file the first pass parked them in (read on the thread). */
export type EncodeSource = Float32Array | { readonly scratch: string };

export interface EncodeRequest {
  readonly id: number;
  readonly audio: EncodeSource;
  readonly gain: number;
  readonly options: Partial<WavOptions>;
}

export type EncodeAnswer =
  | { readonly id: number; readonly kind: 'done'; readonly bytes: Uint8Array; readonly record: FileRecord }
  | (WorkerFailure & { readonly id: number });

export interface EncodeThread {
  /** Files handed over and not yet back. */
  inFlight(): number;
  /**
   * Encode on the thread. Samples' buffer moves to the thread when the samples are all of it (do not use them
   * after); a scratch file is read there.
   */
  encode(audio: EncodeSource, gain: number, options: Partial<WavOptions>): Promise<EncodedWav>;
  close(): Promise<void>;
}

/** Is the thread worth it for `files` files on this machine? */
export function encodeThreadPays(files: number): boolean {
  return files >= ENCODE_THREAD_MIN_FILES && defaultThreadCount() > 1;
}

export function startEncodeThread(): EncodeThread {
  const worker: Worker = startRenderWorker('encode-worker', null);
  const waiting = new Map<number, { resolve: (encoded: EncodedWav) => void; reject: (error: Error) => void }>();
  let next = 0;
  let stopped: Error | null = null;
  const failAll = (error: Error): void => {
    stopped = error;
    for (const { reject } of waiting.values()) reject(error);
    waiting.clear();
  };
  worker.on('message', (answer: EncodeAnswer) => {
    const pending = waiting.get(answer.id);
    if (!pending) return;
    waiting.delete(answer.id);
    if (answer.kind === 'done') pending.resolve({ bytes: answer.bytes, record: answer.record });
    else pending.reject(errorOfFailure(answer, 'encoding thread'));
  });
  worker.on('error', (error) => failAll(new WorkError(`encoding thread failed: ${error.message}`, { cause: error })));
  worker.on('exit', (code) => {
    if (waiting.size > 0) failAll(new WorkError(`encoding thread stopped (exit code ${code})`));
  });
  return {
    inFlight: () => waiting.size,
    encode(audio, gain, options) {
      if (stopped) return Promise.reject(stopped);
      const id = next;
      next += 1;
      return new Promise<EncodedWav>((resolve, reject) => {
        waiting.set(id, { resolve, reject });
        // The buffer moves when the samples are all of it; a view into a larger buffer is copied.
        const whole = audio instanceof Float32Array && audio.byteOffset === 0 && audio.byteLength === audio.buffer.byteLength && audio.buffer instanceof ArrayBuffer;
        worker.postMessage({ id, audio, gain, options } satisfies EncodeRequest, whole ? [audio.buffer as ArrayBuffer] : []);
      });
    },
    async close() {
      await worker.terminate();
    },
  };
}

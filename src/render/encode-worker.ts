/**
 * Worker-thread entry that encodes final WAV files for a render's second pass
 * (encode-thread.ts): each message is one file's audio (or the scratch file
 * holding it, read here), gain and WAV options; the answer is its bytes and
 * record (encode-final-wav.ts), or the error as data so the parent can
 * rethrow it with its class. It writes
 * nothing: the render's own thread writes every file, so the interrupt
 * handler knows every temporary file as before. Load it only as a thread's
 * entry.
 */
import { parentPort } from 'node:worker_threads';
import { failureOf } from './worker-failure.js';
import { encodeFinalWav } from './encode-final-wav.js';
import { readScratchAudio } from './scratch-audio.js';
import type { EncodeAnswer, EncodeRequest } from './encode-thread.js';

const port = parentPort;
/** The samples of the last scratch file read here, free once its WAV is encoded: the next one is read into it. */
let spare: Float32Array | undefined;
if (port) {
  port.on('message', (request: EncodeRequest) => {
    try {
      const given = request.audio;
      const audio = given instanceof Float32Array ? given : readScratchAudio(given.scratch, spare);
      const { bytes, record } = encodeFinalWav(audio, request.gain, request.options);
      if (audio !== given) spare = audio;
      port.postMessage({ id: request.id, kind: 'done', bytes, record } satisfies EncodeAnswer, [bytes.buffer as ArrayBuffer]);
    } catch (error) {
      port.postMessage({ ...failureOf(error), id: request.id } satisfies EncodeAnswer);
    }
  });
}

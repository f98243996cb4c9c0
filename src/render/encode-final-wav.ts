/**
 * One final WAV file of a render's second pass, from its audio: the samples
 * times the file's gain (in place), the WAV bytes (wav-file.ts) and their
 * record (file-record.ts). The same function runs on the render's own thread
 * and on the encoding thread (encode-thread.ts), so a file's bytes do not
 * depend on which thread made them.
 */
import { type FileRecord, recordOf } from './file-record.js';
import { type WavOptions, encodeWav } from './wav-file.js';

export interface EncodedWav {
  readonly bytes: Uint8Array;
  readonly record: FileRecord;
}

export function encodeFinalWav(audio: Float32Array, gain: number, options: Partial<WavOptions>): EncodedWav {
  scaleInPlace(audio, gain);
  const bytes = encodeWav(audio, options);
  return { bytes, record: recordOf(bytes) };
}

/** audio[n] ← audio[n]·gain: a function of its own, so V8's compiled code for the running loop has nothing after it to bail out on (src/math/real-fft.ts). */
function scaleInPlace(audio: Float32Array, gain: number): void {
  for (let n = 0; n < audio.length; n += 1) audio[n] = (audio[n] as number) * gain;
}

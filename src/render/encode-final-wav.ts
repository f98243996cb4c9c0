/**
 * One final WAV file of a render's second pass, from its audio: the samples
 * times the file's gain (in place), the WAV bytes (wav-file.ts; made over the
 * samples when they were held with room for it, so the audio is spent) and
 * their record (file-record.ts). The same function runs on the render's own thread
 * and on the encoding thread (encode-thread.ts), so a file's bytes do not
 * depend on which thread made them.
 */
import { type FileRecord, recordOf } from './file-record.js';
import { samplePasses } from './sample-passes.js';
import { type WavOptions, encodeWavOver } from './wav-file.js';

export interface EncodedWav {
  readonly bytes: Uint8Array;
  readonly record: FileRecord;
}

export function encodeFinalWav(audio: Float32Array, gain: number, options: Partial<WavOptions>): EncodedWav {
  samplePasses().scale(audio, gain);
  // Over the samples when they have room for the header (audio held in memory by the first pass): the samples are spent.
  const bytes = encodeWavOver(audio, options);
  return { bytes, record: recordOf(bytes) };
}


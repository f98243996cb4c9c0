/**
 * Scratch audio read back for the second pass: a first-pass render parks
 * processed audio that does not fit in memory as raw float32 files
 * (render-pass.ts). Read into a buffer the caller no longer needs when it has
 * the file's size: memory the process already has, where a fresh buffer per
 * file costs the operating system's zeroing of new pages (about a millisecond
 * for 2.6 s of audio, measured on the 2-core machine). Used by the render's
 * own thread and by the encoding thread (encode-worker.ts).
 */
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';

/** The float32 samples of a scratch file, read into `spare` when it has the file's length (else into a new buffer). */
export function readScratchAudio(path: string, spare?: Float32Array): Float32Array {
  const descriptor = openSync(path, 'r');
  try {
    const size = fstatSync(descriptor).size;
    if (size % Float32Array.BYTES_PER_ELEMENT !== 0) throw new Error(`scratch file ${path} holds ${size} bytes, not whole float32 samples`);
    const samples = spare !== undefined && spare.byteLength === size ? spare : new Float32Array(size / Float32Array.BYTES_PER_ELEMENT);
    const bytes = new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength);
    let read = 0;
    while (read < size) {
      const got = readSync(descriptor, bytes, read, size - read, read);
      if (got === 0) throw new Error(`scratch file ${path} ended after ${read} of ${size} bytes`);
      read += got;
    }
    return samples;
  } finally {
    closeSync(descriptor);
  }
}

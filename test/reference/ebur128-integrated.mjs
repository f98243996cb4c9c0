// Reference loudness from ebur128-wasm@3.0.0 (the Rust ebur128 crate, a port of
// libebur128, as WebAssembly). Node 20 loads it only with
// `node --experimental-wasm-modules`, so tests run this script in a child process.
//
// Usage: node --experimental-wasm-modules ebur128-integrated.mjs JOB.json
// JOB.json: [{ "sampleRateHz": 48000, "files": ["left.f32", "right.f32"] }, …], each file raw
// little-endian float32 samples of one channel (one file = mono, two = stereo).
// Prints a JSON array with the integrated loudness (LUFS) of each case.
import { readFileSync } from 'node:fs';
import { ebur128_integrated_mono, ebur128_integrated_stereo } from 'ebur128-wasm/ebur128_wasm.js';

function readChannel(path) {
  const bytes = readFileSync(path);
  const aligned = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
  return new Float32Array(aligned);
}

const job = JSON.parse(readFileSync(process.argv[2], 'utf8'));
const results = job.map(({ sampleRateHz, files }) => {
  const channels = files.map(readChannel);
  if (channels.length === 1) return ebur128_integrated_mono(sampleRateHz, channels[0]);
  if (channels.length === 2) return ebur128_integrated_stereo(sampleRateHz, channels[0], channels[1]);
  throw new Error(`ebur128-wasm measures one or two channels, got ${channels.length}`);
});
process.stdout.write(`${JSON.stringify(results)}\n`);

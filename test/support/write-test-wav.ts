/**
 * A tiny WAV writer for tests: mono PCM, 16 or 24 bits, little-endian, the
 * canonical 44-byte header (RIFF/WAVE with one "fmt " chunk of 16 bytes and
 * one "data" chunk; Microsoft/IBM RIFF WAVE specification, 1991). Samples
 * are floats in −1..1, rounded and clipped to full scale.
 */
const HEADER_BYTES = 44;
const FMT_CHUNK_BYTES = 16;
const PCM_FORMAT_TAG = 1;
const BITS_PER_BYTE = 8;

export function encodeTestWav(samples: Float32Array | readonly number[], sampleRateHz: number, bitsPerSample: 16 | 24): Uint8Array {
  const bytesPerSample = bitsPerSample / BITS_PER_BYTE;
  const dataBytes = samples.length * bytesPerSample;
  const bytes = new Uint8Array(HEADER_BYTES + dataBytes);
  const view = new DataView(bytes.buffer);
  const ascii = (offset: number, text: string): void => {
    for (let i = 0; i < text.length; i += 1) view.setUint8(offset + i, text.charCodeAt(i));
  };
  ascii(0, 'RIFF');
  view.setUint32(4, HEADER_BYTES - 8 + dataBytes, true);
  ascii(8, 'WAVE');
  ascii(12, 'fmt ');
  view.setUint32(16, FMT_CHUNK_BYTES, true);
  view.setUint16(20, PCM_FORMAT_TAG, true);
  view.setUint16(22, 1, true); // channels
  view.setUint32(24, sampleRateHz, true);
  view.setUint32(28, sampleRateHz * bytesPerSample, true); // byte rate
  view.setUint16(32, bytesPerSample, true); // block align
  view.setUint16(34, bitsPerSample, true);
  ascii(36, 'data');
  view.setUint32(40, dataBytes, true);
  const fullScale = 2 ** (bitsPerSample - 1) - 1;
  for (let i = 0; i < samples.length; i += 1) {
    const value = Math.round(Math.max(-1, Math.min(1, samples[i] ?? 0)) * fullScale);
    const offset = HEADER_BYTES + i * bytesPerSample;
    if (bitsPerSample === 16) view.setInt16(offset, value, true);
    else {
      view.setUint8(offset, value & 0xff);
      view.setUint8(offset + 1, (value >> 8) & 0xff);
      view.setInt8(offset + 2, value >> 16);
    }
  }
  return bytes;
}

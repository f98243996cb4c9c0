/**
 * encodeWav read back by a second reader: the npm package wavefile (11.0.0),
 * an independent RIFF/WAVE parser. Header fields are those of the RIFF WAVE
 * specification (IBM/Microsoft, Multimedia Programming Interface and Data
 * Specifications 1.0, 1991).
 */
import { WaveFile } from 'wavefile';
import { describe, expect, it } from 'vitest';
import { pluckedTone } from '../../test/support/signals.js';
import { InputError } from '../errors/index.js';
import { WAV_HEADER_ROOM_BYTES, type WavFormat, audioWithHeaderRoom, encodeWav, encodeWavOver, pcmFullScale, quantizeSample } from './wav-file.js';

/** The fields wavefile exposes after parsing (its types declare them as plain objects). */
interface ParsedWav {
  fmt: { audioFormat: number; numChannels: number; sampleRate: number; byteRate: number; blockAlign: number; bitsPerSample: number };
  fact: { chunkId: string; dwSampleLength: number };
  data: { chunkSize: number };
}

function readBack(bytes: Uint8Array): { wav: WaveFile; parsed: ParsedWav; channels: Float64Array[] } {
  const wav = new WaveFile(bytes);
  const parsed = wav as unknown as ParsedWav;
  const samples = wav.getSamples(false, Float64Array) as unknown as Float64Array | Float64Array[];
  const channels = parsed.fmt.numChannels === 1 ? [samples as Float64Array] : (samples as Float64Array[]);
  return { wav, parsed, channels };
}

function peak(values: ArrayLike<number>): number {
  let max = 0;
  for (let n = 0; n < values.length; n += 1) max = Math.max(max, Math.abs(values[n] as number));
  return max;
}

const BYTES_PER_SAMPLE: Readonly<Record<WavFormat, number>> = { pcm16: 2, pcm24: 3, f32: 4 };

describe('encodeWav read back by wavefile', () => {
  const left = pluckedTone({ sampleRateHz: 48_000, durationS: 0.5, fundamentalsHz: [110], noteTimesS: [0], harmonics: 20, decayS: 1, amplitude: 0.2, seed: 3 });
  const right = pluckedTone({ sampleRateHz: 48_000, durationS: 0.5, fundamentalsHz: [165], noteTimesS: [0.1], harmonics: 20, decayS: 1, amplitude: 0.15, seed: 4 });

  for (const format of ['pcm16', 'pcm24', 'f32'] as const) {
    for (const channels of [[left], [left, right]]) {
      for (const frames of [24_000, 23_999]) {
        it(`${format}, ${channels.length} channel(s), ${frames} frames: header, count, peak, INFO`, () => {
          const audio = channels.map((channel) => channel.subarray(0, frames));
          const info = { name: '(neck + ~mid) // bridge', comment: 'neck and middle out of phase in series, parallel with bridge', software: 'coilbench test' };
          const bytes = encodeWav(audio, { sampleRateHz: 44_100, format, info });
          const { wav, parsed, channels: decoded } = readBack(bytes);

          const bytesPerSample = BYTES_PER_SAMPLE[format];
          expect(parsed.fmt.audioFormat).toBe(format === 'f32' ? 3 : 1);
          expect(parsed.fmt.numChannels).toBe(audio.length);
          expect(parsed.fmt.sampleRate).toBe(44_100);
          expect(parsed.fmt.blockAlign).toBe(audio.length * bytesPerSample);
          expect(parsed.fmt.byteRate).toBe(44_100 * audio.length * bytesPerSample);
          expect(parsed.fmt.bitsPerSample).toBe(8 * bytesPerSample);
          expect(parsed.data.chunkSize).toBe(frames * audio.length * bytesPerSample);
          if (format === 'f32') expect(parsed.fact.dwSampleLength).toBe(frames);
          // RIFF size = file length − 8, and the file is word aligned (odd data gets a pad byte).
          expect(new DataView(bytes.buffer).getUint32(4, true)).toBe(bytes.length - 8);
          expect(bytes.length % 2).toBe(0);

          expect(decoded).toHaveLength(audio.length);
          audio.forEach((written, index) => {
            expect(peak(written)).toBeLessThan(1); // below full scale, so nothing is clipped
            expect(peak(written)).toBeGreaterThan(0.1);
            const read = decoded[index] as Float64Array;
            expect(read).toHaveLength(frames);
            if (format === 'f32') {
              // One float32 LSB at the peak: 2^-23 relative.
              expect(Math.abs(peak(read) - peak(written))).toBeLessThanOrEqual(peak(written) * 2 ** -23);
            } else {
              // wavefile returns the stored integers; within one LSB of the ideal scaled peak.
              expect(Math.abs(peak(read) - peak(written) * pcmFullScale(bytesPerSample))).toBeLessThanOrEqual(1);
            }
          });
          expect(wav.getTag('INAM')).toBe(info.name);
          expect(wav.getTag('ICMT')).toBe(info.comment);
          expect(wav.getTag('ISFT')).toBe(info.software);
        });
      }
    }
  }
});

describe('encodeWav layout', () => {
  it('has the 44-byte PCM header and the 58-byte float header (fmt 18 bytes + fact) without INFO', () => {
    // docs/physics.md §9 (derived from the 1991 specification's chunk layout).
    expect(encodeWav(new Float32Array(10), { format: 'pcm16' }).length).toBe(44 + 20);
    expect(encodeWav(new Float32Array(10), { format: 'f32' }).length).toBe(58 + 40);
    const text = new TextDecoder('latin1').decode(encodeWav(new Float32Array(10), { format: 'f32' }).subarray(0, 58));
    expect(text.slice(0, 4)).toBe('RIFF');
    expect(text.slice(8, 16)).toBe('WAVEfmt ');
    expect(text.slice(38, 42)).toBe('fact');
    expect(text.slice(50, 54)).toBe('data');
  });

  it('pads 24-bit mono with an odd sample count and counts the pad only in the RIFF size', () => {
    const bytes = encodeWav(Float32Array.from([0.5, -0.5, 0.25]), { format: 'pcm24' });
    const view = new DataView(bytes.buffer);
    expect(view.getUint32(40, true)).toBe(9); // data chunk size: 3 samples × 3 bytes
    expect(bytes.length).toBe(44 + 10);
    expect(bytes[bytes.length - 1]).toBe(0);
    expect(view.getUint32(4, true)).toBe(bytes.length - 8);
    expect(readBack(bytes).channels[0]).toEqual(Float64Array.from([4_194_304, -4_194_304, 2_097_152]));
  });

  it('pads odd-length INFO text and terminates it with NUL', () => {
    const bytes = encodeWav(new Float32Array(2), { format: 'pcm16', info: { name: 'ab' } });
    const text = new TextDecoder('latin1').decode(bytes);
    const at = text.indexOf('INAM');
    expect(new DataView(bytes.buffer).getUint32(at + 4, true)).toBe(3); // "ab" + NUL
    expect(text.slice(at + 8, at + 12)).toBe('ab\0\0'); // NUL, then the pad byte
    expect(readBack(bytes).wav.getTag('INAM')).toBe('ab');
  });

  it('clips to full scale and rounds half away from zero, symmetrically', () => {
    const fullScale = pcmFullScale(3);
    expect(fullScale).toBe(8_388_607);
    expect(pcmFullScale(2)).toBe(32_767);
    expect(quantizeSample(1.5, fullScale)).toBe(fullScale);
    expect(quantizeSample(-1.5, fullScale)).toBe(-fullScale);
    expect(quantizeSample(0.5 / fullScale, fullScale)).toBe(1);
    expect(quantizeSample(-0.5 / fullScale, fullScale)).toBe(-1);
    expect(quantizeSample(0.49 / fullScale, fullScale)).toBe(0);
    const decoded = readBack(encodeWav(Float32Array.from([2, -2, 1, -1, 0]), { format: 'pcm16' })).channels[0];
    expect(Array.from(decoded ?? [])).toEqual([32_767, -32_767, 32_767, -32_767, 0]);
    const floats = readBack(encodeWav(Float32Array.from([2, -2, 0.5]), { format: 'f32' })).channels[0];
    expect(Array.from(floats ?? [])).toEqual([1, -1, 0.5]);
  });

  it('writes every PCM sample as quantizeSample rounds it, mono and interleaved (read back by wavefile)', () => {
    // Samples whose sign changes at random (the sample loops round without a branch on it), exact half steps
    // (k + 0.5)/fullScale for both widths, −0, values that clip, and an odd count (24-bit mono's last sample and pad).
    let state = 12_345;
    const random = (): number => {
      state = (Math.imul(state, 1_103_515_245) + 12_345) >>> 0; // a linear congruential generator (common practice)
      return state / 2 ** 32;
    };
    for (const format of ['pcm16', 'pcm24'] as const) {
      const fullScale = pcmFullScale(BYTES_PER_SAMPLE[format]);
      const sample = (n: number): number => {
        const kind = n % 5;
        if (kind === 0) return Math.fround(2.4 * (random() - 0.5));
        if (kind === 1) return (Math.floor(2_000 * (random() - 0.5)) + 0.5) / fullScale;
        if (kind === 2) return n % 2 === 0 ? -0 : 0;
        if (kind === 3) return (random() - 0.5) * 4 / fullScale;
        return random() < 0.5 ? -1.25 : 1;
      };
      const mono = Float64Array.from({ length: 1_001 }, (_, n) => sample(n));
      const other = Float64Array.from({ length: 1_001 }, (_, n) => sample(n + 3));
      for (const channels of [[mono], [mono, other], [other, mono, other]]) {
        const decoded = readBack(encodeWav(channels, { format })).channels;
        channels.forEach((channel, c) => {
          // + 0: a file holds integers, where −0 is 0.
          expect(Array.from(decoded[c] ?? [])).toEqual(Array.from(channel, (x) => quantizeSample(x, fullScale) + 0));
        });
      }
    }
  });

  it('gives byte-identical files for the same samples', () => {
    const tone = pluckedTone({ sampleRateHz: 48_000, durationS: 0.2, fundamentalsHz: [220], noteTimesS: [0], harmonics: 10, decayS: 1, amplitude: 0.5, seed: 9 });
    for (const format of ['pcm16', 'pcm24', 'f32'] as const) {
      const options = { format, info: { name: 'neck // bridge' } };
      const first = Buffer.from(encodeWav(Float32Array.from(tone), options));
      const second = Buffer.from(encodeWav(Float64Array.from(tone), options));
      expect(first.length).toBeGreaterThan(1000);
      expect(first.equals(second)).toBe(true);
    }
  });

  it('takes options left out or undefined as the defaults: 48 kHz, 24-bit PCM, no INFO', () => {
    const samples = Float32Array.from([0.1, -0.2, 0.3]);
    const bytes = encodeWav(samples, { sampleRateHz: undefined, format: undefined, info: undefined });
    expect(Buffer.from(bytes).equals(Buffer.from(encodeWav(samples)))).toBe(true);
    const { parsed } = readBack(bytes);
    expect(parsed.fmt.sampleRate).toBe(48_000);
    expect(parsed.fmt.bitsPerSample).toBe(24);
    expect(bytes.length).toBe(44 + 10); // no LIST chunk; 9 data bytes and a pad byte
  });

  it('rejects bad options and samples with the path of the problem', () => {
    const samples = new Float32Array(4);
    expect(() => encodeWav(samples, { sampleRateHz: 44_100.5 })).toThrow(/sampleRateHz: expected a whole sample rate/u);
    expect(() => encodeWav(samples, { format: 'pcm8' as WavFormat })).toThrow(/format: expected one of pcm24, pcm16, f32/u);
    expect(() => encodeWav(samples, { info: { name: 'a\0b' } })).toThrow(/info\.name: expected text without NUL/u);
    expect(() => encodeWav([samples, new Float32Array(3)])).toThrow(/channels\[1\]: expected 4 samples/u);
    expect(() => encodeWav([])).toThrow(InputError);
    expect(() => encodeWav(Float32Array.from([0, Number.NaN]))).toThrow(/channels\[0\]\[1\]: expected a finite sample/u);
  });
});

describe('encodeWavOver: the file made over the samples', () => {
  const tone = pluckedTone({ sampleRateHz: 48_000, durationS: 0.05, fundamentalsHz: [196], noteTimesS: [0], harmonics: 12, decayS: 0.5, amplitude: 0.9, seed: 9 });
  const info = { name: 'neck + ~bridge', comment: 'an odd-length comment.', software: 'coilbench test' };

  /** The samples in a buffer with header room, its bytes outside the samples set to 0xa5 (a reused buffer's leftovers). */
  function held(samples: Float32Array): Float32Array {
    const audio = audioWithHeaderRoom(samples.length);
    new Uint8Array(audio.buffer).fill(0xa5);
    audio.set(samples);
    return audio;
  }

  for (const format of ['pcm16', 'pcm24', 'f32'] as const) {
    for (const length of [tone.length, tone.length - 1]) {
      it(`gives encodeWav's bytes, in the samples' own memory (${format}, ${length % 2 === 0 ? 'even' : 'odd'} sample count)`, () => {
        const samples = tone.subarray(0, length);
        const expected = encodeWav(Float32Array.from(samples), { format, info });
        const audio = held(samples);
        const bytes = encodeWavOver(audio, { format, info });
        expect(bytes.buffer).toBe(audio.buffer);
        // The data starts where the samples started; the header sits in the room before them.
        expect(bytes.byteOffset).toBe(WAV_HEADER_ROOM_BYTES - (expected.length - BYTES_PER_SAMPLE[format] * length - (format === 'pcm24' ? length % 2 : 0)));
        expect(Buffer.from(bytes).equals(Buffer.from(expected))).toBe(true);
      });
    }
  }

  it('makes the file in fresh memory, the samples untouched, without room or with a header past the room', () => {
    const plain = Float32Array.from(tone);
    const bytes = encodeWavOver(plain, { info });
    expect(bytes.buffer).not.toBe(plain.buffer);
    expect(plain).toEqual(tone);
    const audio = held(tone);
    const long = { ...info, comment: 'x'.repeat(WAV_HEADER_ROOM_BYTES) };
    const fresh = encodeWavOver(audio, { info: long });
    expect(fresh.buffer).not.toBe(audio.buffer);
    expect(audio).toEqual(tone);
    expect(Buffer.from(fresh).equals(Buffer.from(encodeWav(tone, { info: long })))).toBe(true);
  });

  it('refuses a sample that is not finite, wherever it is', () => {
    for (const at of [0, tone.length - 1]) {
      const audio = held(tone);
      audio[at] = Number.NaN;
      expect(() => encodeWavOver(audio, { info })).toThrow(InputError);
    }
  });
});

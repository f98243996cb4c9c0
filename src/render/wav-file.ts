/**
 * WAV files (RIFF WAVE), written byte by byte. Defining document: IBM
 * Corporation and Microsoft Corporation, *Multimedia Programming Interface
 * and Data Specifications 1.0*, August 1991 (RIFF, WAVE form). Layout, all
 * little-endian:
 *
 *   "RIFF" u32(file length − 8) "WAVE"
 *   "fmt " u32(16 | 18) u16 format tag, u16 channels, u32 sample rate,
 *          u32 byte rate (= rate × block align), u16 block align
 *          (= channels × bytes per sample), u16 bits per sample
 *          [, u16 cbSize = 0 for float]
 *   "fact" u32(4) u32 sample frames                       (float only)
 *   "LIST" u32 size "INFO" { id u32 size text NUL [pad] } (when info is given)
 *   "data" u32 size, samples interleaved by channel [pad]
 *
 * Format tags: 1 = PCM (16- and 24-bit signed two's complement, 24-bit packed
 * in 3 bytes); 3 = IEEE float (RFC 2361, WAVE codec registry), which as a
 * non-PCM format carries a `fact` chunk with the frame count. Every chunk is
 * padded to an even length with a zero byte not counted in its own size but
 * counted in the RIFF size (24-bit mono with an odd sample count needs it).
 * INFO text is UTF-8 (common practice; the 1991 spec predates it), NUL
 * terminated (ZSTR); INAM = name, ICMT = comment, ISFT = software.
 *
 * Samples: nominal full scale ±1. Every format clips to ±1. PCM scales by
 * 2^(bits−1) − 1 (32767, 8388607) and rounds half away from zero, so x and −x
 * always give opposite integers (−1 → −32767; −32768 is never written).
 * Float stores the clipped value rounded to float32. The same samples and
 * options always give the same bytes (no dates or random fields).
 */
import { InputError } from '../errors/index.js';
import { pcmValue } from './pcm-value.js';
import { JAVASCRIPT_SAMPLE_PASSES, samplePasses } from './sample-passes.js';

export type WavFormat = 'pcm16' | 'pcm24' | 'f32';

export const WAV_FORMATS: readonly WavFormat[] = Object.freeze(['pcm24', 'pcm16', 'f32']);

/** Text for the file's LIST/INFO chunk; empty or missing fields are left out. */
export interface WavInfo {
  /** INAM, the title: coilbench puts the wiring's expression here. */
  readonly name?: string;
  /** ICMT, a comment: the wiring in words, the phrase and chain. */
  readonly comment?: string;
  /** ISFT, the software that wrote the file. */
  readonly software?: string;
}

export interface WavOptions {
  /** Sample rate, Hz: a whole number from 1 to 2³² − 1. Default 48 000. */
  readonly sampleRateHz: number;
  /** Sample coding: 'pcm24' (default), 'pcm16' or 'f32' (IEEE float, 32-bit). */
  readonly format: WavFormat;
  /** LIST/INFO text. Default none. */
  readonly info: WavInfo;
}

export const DEFAULT_WAV_OPTIONS: WavOptions = Object.freeze({ sampleRateHz: 48_000, format: 'pcm24', info: Object.freeze({}) });

/** One channel (mono) or one array per channel, all the same length; nominal full scale ±1. */
export type AudioChannels = Float32Array | Float64Array | readonly (Float32Array | Float64Array)[];

/** Format tags (IBM/Microsoft 1991; RFC 2361). */
export const WAVE_FORMAT_PCM = 1;
export const WAVE_FORMAT_IEEE_FLOAT = 3;

const BITS_PER_BYTE = 8;
const FOURCC_BYTES = 4;
const CHUNK_HEADER_BYTES = 8; // four-character id + u32 size
const PCM_FMT_BYTES = 16;
const FLOAT_FMT_BYTES = 18; // PCM fields + cbSize
const FACT_BYTES = 4;
const MAX_U32 = 0xffff_ffff;
/** Byte offsets of the `fmt ` chunk's fields (IBM/Microsoft 1991, WAVEFORMAT / PCMWAVEFORMAT / WAVEFORMATEX). */
const FMT_FIELD = Object.freeze({ tag: 0, channels: 2, sampleRate: 4, byteRate: 8, blockAlign: 12, bitsPerSample: 14, cbSize: 16 });

interface SampleCoding {
  readonly tag: number;
  readonly bytesPerSample: number;
  readonly fmtBytes: number;
  readonly hasFact: boolean;
}

/** Bytes per sample of 24-bit PCM. */
const PCM24_BYTES = 3;
const CODINGS: Readonly<Record<WavFormat, SampleCoding>> = Object.freeze({
  pcm16: { tag: WAVE_FORMAT_PCM, bytesPerSample: 2, fmtBytes: PCM_FMT_BYTES, hasFact: false },
  pcm24: { tag: WAVE_FORMAT_PCM, bytesPerSample: PCM24_BYTES, fmtBytes: PCM_FMT_BYTES, hasFact: false },
  f32: { tag: WAVE_FORMAT_IEEE_FLOAT, bytesPerSample: 4, fmtBytes: FLOAT_FMT_BYTES, hasFact: true },
});

/** INFO sub-chunk ids (IBM/Microsoft 1991, "INFO List Chunk"). */
const INFO_IDS: readonly (readonly [keyof WavInfo, string])[] = [
  ['name', 'INAM'],
  ['comment', 'ICMT'],
  ['software', 'ISFT'],
];

/** Largest PCM integer for a sample width: 2^(bits−1) − 1. */
export function pcmFullScale(bytesPerSample: number): number {
  return 2 ** (bytesPerSample * BITS_PER_BYTE - 1) - 1;
}

/** Clip to ±1, scale to ±full scale, round half away from zero. */
export function quantizeSample(sample: number, fullScale: number): number {
  const scaled = Math.max(-1, Math.min(1, sample)) * fullScale;
  return scaled < 0 ? -Math.round(-scaled) : Math.round(scaled);
}

function even(byteCount: number): number {
  return byteCount + (byteCount % 2);
}

function channelsOf(audio: AudioChannels): readonly (Float32Array | Float64Array)[] {
  return ArrayBuffer.isView(audio) ? [audio] : audio;
}

function resolveOptions(options: Partial<WavOptions>): WavOptions {
  const merged: WavOptions = {
    sampleRateHz: options.sampleRateHz ?? DEFAULT_WAV_OPTIONS.sampleRateHz,
    format: options.format ?? DEFAULT_WAV_OPTIONS.format,
    info: options.info ?? DEFAULT_WAV_OPTIONS.info,
  };
  if (!Number.isInteger(merged.sampleRateHz) || merged.sampleRateHz < 1 || merged.sampleRateHz > MAX_U32) {
    throw InputError.at('sampleRateHz', 'a whole sample rate in Hz from 1 to 4294967295', merged.sampleRateHz);
  }
  if (!WAV_FORMATS.includes(merged.format)) throw InputError.at('format', `one of ${WAV_FORMATS.join(', ')}`, merged.format);
  for (const [key] of INFO_IDS) {
    const text = merged.info[key];
    if (text !== undefined && (typeof text !== 'string' || text.includes('\0'))) {
      throw InputError.at(`info.${key}`, 'text without NUL characters', text);
    }
  }
  return merged;
}

/** The LIST/INFO chunk's body ("INFO" and the sub-chunks), or null when there is no text. */
function infoBody(info: WavInfo): Uint8Array | null {
  const encoder = new TextEncoder();
  const entries = INFO_IDS.flatMap(([key, id]) => {
    const text = info[key];
    return text ? [{ id, text: encoder.encode(text) }] : [];
  });
  if (entries.length === 0) return null;
  const size = FOURCC_BYTES + entries.reduce((sum, entry) => sum + CHUNK_HEADER_BYTES + even(entry.text.length + 1), 0);
  const body = new Uint8Array(size);
  const view = new DataView(body.buffer);
  writeFourCc(body, 0, 'INFO');
  let offset = FOURCC_BYTES;
  for (const { id, text } of entries) {
    writeFourCc(body, offset, id);
    view.setUint32(offset + FOURCC_BYTES, text.length + 1, true); // ZSTR: the size counts the NUL
    body.set(text, offset + CHUNK_HEADER_BYTES);
    offset += CHUNK_HEADER_BYTES + even(text.length + 1); // NUL and pad bytes are already zero
  }
  return body;
}

function writeFourCc(bytes: Uint8Array, offset: number, id: string): void {
  for (let i = 0; i < FOURCC_BYTES; i += 1) bytes[offset + i] = id.charCodeAt(i);
}

/**
 * Bytes left free before a held audio buffer's samples (audioWithHeaderRoom),
 * so that its WAV file can be made over it (encodeWavOver): a file's header
 * is 44 bytes and its INFO text (about 100–300 bytes for a wiring's name and
 * description); a page is room for any of ours, and a file whose header would
 * not fit is made in fresh memory instead.
 */
export const WAV_HEADER_ROOM_BYTES = 4096;

/** A float32 buffer of `length` samples with WAV_HEADER_ROOM_BYTES free before them in its memory. */
export function audioWithHeaderRoom(length: number): Float32Array {
  return new Float32Array(new ArrayBuffer(WAV_HEADER_ROOM_BYTES + length * Float32Array.BYTES_PER_ELEMENT), WAV_HEADER_ROOM_BYTES, length);
}

/**
 * Encode `audio` as a WAV file: see the file comment for the layout, clipping
 * and rounding. Throws InputError for a bad option, channels of different
 * lengths, a non-finite sample, or a file that would not fit in 4 GiB.
 */
export function encodeWav(audio: AudioChannels, options: Partial<WavOptions> = {}): Uint8Array {
  return encodeInto(audio, options, false);
}

/**
 * The same bytes as encodeWav, made over the samples themselves when `audio`
 * has room before it for the header (audioWithHeaderRoom): the file is a
 * view of the samples' own memory, its data starting where the samples
 * start, and the samples are lost. Each sample is read before any byte at
 * or past it is written (a sample takes 2, 3 or 4 bytes in the file against
 * 4 in the buffer), so the bytes are the same as encodeWav's. A render
 * makes each wiring's file this way once its audio is no longer needed: no
 * fresh memory for the file (0.4 MB a wiring at the demo's length, which the
 * kernel zeroes page by page). Without the room it is encodeWav.
 */
export function encodeWavOver(audio: Float32Array, options: Partial<WavOptions> = {}): Uint8Array {
  return encodeInto(audio, options, true);
}

function encodeInto(audio: AudioChannels, options: Partial<WavOptions>, over: boolean): Uint8Array {
  const { sampleRateHz, format, info } = resolveOptions(options);
  const channels = channelsOf(audio);
  if (channels.length === 0) throw InputError.at('channels', 'at least one channel of samples', []);
  const frames = channels[0]?.length ?? 0;
  channels.forEach((channel, index) => {
    if (channel.length !== frames) throw InputError.at(`channels[${index}]`, `${frames} samples like channel 0`, `${channel.length} samples`);
  });

  const coding = CODINGS[format];
  const blockAlign = channels.length * coding.bytesPerSample;
  const byteRate = sampleRateHz * blockAlign;
  const dataBytes = frames * blockAlign;
  const list = infoBody(info);
  const fileBytes =
    FOURCC_BYTES * 3 + // "RIFF" size "WAVE"
    CHUNK_HEADER_BYTES +
    coding.fmtBytes +
    (coding.hasFact ? CHUNK_HEADER_BYTES + FACT_BYTES : 0) +
    (list ? CHUNK_HEADER_BYTES + list.length : 0) +
    CHUNK_HEADER_BYTES +
    even(dataBytes);
  if (fileBytes - CHUNK_HEADER_BYTES > MAX_U32 || byteRate > MAX_U32) {
    throw InputError.at('channels', 'audio that fits a WAV file (under 4 GiB)', `${frames} frames × ${channels.length} channels`);
  }

  const headerBytes = fileBytes - even(dataBytes);
  // Over the samples: only a mono float32 buffer with room for the header before it (a sample's bytes never pass its own four).
  const inPlace = over && audio instanceof Float32Array && coding.bytesPerSample <= Float32Array.BYTES_PER_ELEMENT && audio.byteOffset >= headerBytes;
  const bytes = inPlace ? new Uint8Array(audio.buffer, audio.byteOffset - headerBytes, fileBytes) : new Uint8Array(fileBytes);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let offset = 0;
  const chunkHeader = (id: string, size: number): void => {
    writeFourCc(bytes, offset, id);
    view.setUint32(offset + FOURCC_BYTES, size, true);
    offset += CHUNK_HEADER_BYTES;
  };

  chunkHeader('RIFF', fileBytes - CHUNK_HEADER_BYTES);
  writeFourCc(bytes, offset, 'WAVE');
  offset += FOURCC_BYTES;

  chunkHeader('fmt ', coding.fmtBytes);
  view.setUint16(offset + FMT_FIELD.tag, coding.tag, true);
  view.setUint16(offset + FMT_FIELD.channels, channels.length, true);
  view.setUint32(offset + FMT_FIELD.sampleRate, sampleRateHz, true);
  view.setUint32(offset + FMT_FIELD.byteRate, byteRate, true);
  view.setUint16(offset + FMT_FIELD.blockAlign, blockAlign, true);
  view.setUint16(offset + FMT_FIELD.bitsPerSample, coding.bytesPerSample * BITS_PER_BYTE, true);
  if (coding.fmtBytes === FLOAT_FMT_BYTES) view.setUint16(offset + FMT_FIELD.cbSize, 0, true); // no extra format bytes
  offset += coding.fmtBytes;

  if (coding.hasFact) {
    chunkHeader('fact', FACT_BYTES);
    view.setUint32(offset, frames, true);
    offset += FACT_BYTES;
  }

  if (list) {
    chunkHeader('LIST', list.length);
    bytes.set(list, offset);
    offset += list.length;
  }

  chunkHeader('data', dataBytes);
  writeSamples(channels, format, bytes, view, offset);
  // A pad byte after odd data: already zero in fresh memory, a sample's byte when made over the samples.
  if (dataBytes % 2 === 1) bytes[fileBytes - 1] = 0;
  return bytes;
}

function writeSamples(
  channels: readonly (Float32Array | Float64Array)[],
  format: WavFormat,
  bytes: Uint8Array,
  view: DataView,
  start: number,
): void {
  const { bytesPerSample } = CODINGS[format];
  const stride = channels.length * bytesPerSample;
  const fullScale = pcmFullScale(bytesPerSample);
  channels.forEach((channel, channelIndex) => {
    const first = start + channelIndex * bytesPerSample;
    // Each writer sums x − x over its samples: NaN when one is not finite, which is then found and reported (the
    // bytes are not used). Mono 24-bit, the form renders take, has a writer of its own.
    const unfinite =
      format === 'f32'
        ? writeFloat32(channel, view, first, stride)
        : format === 'pcm16'
          ? writePcm16(channel, view, first, stride, fullScale)
          : stride === PCM24_BYTES
            ? writeMonoPcm24(channel, bytes, first, fullScale)
            : writePcm24(channel, bytes, first, stride, fullScale);
    if (unfinite !== 0) {
      const n = channel.findIndex((sample) => !Number.isFinite(sample));
      // Made over the samples (encodeWavOver), the bad one may already be written over: the channel is named alone.
      if (n < 0) throw InputError.at(`channels[${channelIndex}]`, 'finite samples', 'a sample that is not finite');
      throw InputError.at(`channels[${channelIndex}][${n}]`, 'a finite sample', channel[n]);
    }
  });
}

/** IEEE float samples, clipped to ±1, at `first`, `first + stride` …; returns Σ (x − x). */
function writeFloat32(channel: Float32Array | Float64Array, view: DataView, first: number, stride: number): number {
  let unfinite = 0;
  for (let n = 0, offset = first; n < channel.length; n += 1, offset += stride) {
    const sample = channel[n] as number;
    unfinite += sample - sample;
    view.setFloat32(offset, sample > 1 ? 1 : sample < -1 ? -1 : sample, true);
  }
  return unfinite;
}

/** 16-bit PCM samples, little-endian two's complement, at `first`, `first + stride` …; returns Σ (x − x). */
function writePcm16(channel: Float32Array | Float64Array, view: DataView, first: number, stride: number, fullScale: number): number {
  let unfinite = 0;
  for (let n = 0, offset = first; n < channel.length; n += 1, offset += stride) {
    const sample = channel[n] as number;
    unfinite += sample - sample;
    view.setInt16(offset, pcmValue(sample, fullScale), true);
  }
  return unfinite;
}

/** 24-bit PCM samples, low byte first (a typed-array store keeps the low 8 bits), at `first`, `first + stride` …; returns Σ (x − x). */
function writePcm24(channel: Float32Array | Float64Array, bytes: Uint8Array, first: number, stride: number, fullScale: number): number {
  let unfinite = 0;
  for (let n = 0, offset = first; n < channel.length; n += 1, offset += stride) {
    const sample = channel[n] as number;
    unfinite += sample - sample;
    const value = pcmValue(sample, fullScale);
    bytes[offset] = value;
    bytes[offset + 1] = value >> BITS_PER_BYTE;
    bytes[offset + 2] = value >> (2 * BITS_PER_BYTE);
  }
  return unfinite;
}

/** Mono 24-bit PCM from `first` (sample-passes.ts: as WebAssembly for float32 samples where the host runs it). Returns Σ (x − x). */
function writeMonoPcm24(channel: Float32Array | Float64Array, bytes: Uint8Array, first: number, fullScale: number): number {
  // One call per branch, so each sees the narrowed type (a call on the union of the two passes needs a Float32Array,
  // which TypeScript's incremental build, rechecking this file alone, reported as an error).
  return channel instanceof Float32Array
    ? samplePasses().writeMonoPcm24(channel, bytes, first, fullScale)
    : JAVASCRIPT_SAMPLE_PASSES.writeMonoPcm24(channel, bytes, first, fullScale);
}

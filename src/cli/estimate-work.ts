/**
 * Big work is announced: before a render or an analysis, an estimate of its
 * time and disk, printed when it passes about 30 s or 1 GB, refused above a
 * limit unless the user says `--yes` (or picks wirings with `--only`), and a
 * check that the disk has the room (fs.statfs).
 *
 * The time figures are rough costs per wiring measured on a loaded 2-core
 * machine (`npm run bench`'s render figures and the property suite's circuit
 * timings); the disk figures follow from the file formats exactly, up to the
 * few kB of reports and netlists.
 */
import { statfsSync } from 'node:fs';
import { dirname } from 'node:path';
import { InputError, WorkError, escapeForMessage } from '../errors/index.js';
import type { Io } from './io.js';
import { formatCount } from '../units/index.js';

/** Longest folder name shown in a message, characters. */
const MAX_SHOWN_PATH = 120;

/**
 * Seconds to render and write one wiring, per second of its audio, by
 * effects chain: the 572 wirings of the two-humbucker sample (1,494 s of
 * audio) on the 2-core machine in a slow hour (the bench's reference 111–124
 * ms, against 41–43 ms at its quietest), rounded up: direct 11.7 s, clean
 * 15.2 s, compressed 21.2 s, drive 26.1 s. Larger renders go faster per
 * wiring (9,997 wirings of five coils: direct 145 s, clean 227 s), so these
 * err long.
 */
const RENDER_SECONDS_PER_AUDIO_SECOND = Object.freeze({ direct: 0.008, clean: 0.011, compressed: 0.015, drive: 0.018 });
/**
 * The effects chains costed above; the render passes its ChainName, so a
 * chain added there without a rate here fails to compile (this module stays
 * free of the render pipeline, which `analyze` does not load).
 */
export type CostedChain = keyof typeof RENDER_SECONDS_PER_AUDIO_SECOND;
/** Seconds of the audio figures per wiring in `analyze` (from the coils' cross-spectra: about 0.7 ms; `npm run bench -- figures`). */
const ANALYZE_AUDIO_SECONDS_PER_WIRING = 0.0007;
/** Seconds per wiring of a render that writes no WAV (figures, circuit figures, response curve, netlist: about 2 ms; `npm run bench -- commands` with BENCH_BIG=1). */
const RENDER_NO_WAV_SECONDS_PER_WIRING = 0.002;
/** Seconds of circuit figures, level and groups per wiring in `analyze --no-audio` (about 1.5 ms: the six-element sample's 228,386 wirings took 326 s of processor time on a loaded 2-core machine; coupled humbucker coils go through the slower nodal solver). */
const ANALYZE_CIRCUIT_SECONDS_PER_WIRING = 0.0015;
/** Work longer than this is announced first, seconds. */
export const ANNOUNCE_SECONDS = 30;
/** Writing more than this is announced first, bytes (1 GB). */
export const ANNOUNCE_BYTES = 1e9;
/** Work longer than this is refused without --yes, seconds (10 minutes). */
export const REFUSE_SECONDS = 600;
/** Writing more than this is refused without --yes, bytes (5 GB). */
export const REFUSE_BYTES = 5e9;
/** Bytes of a WAV header with its INFO list (about; the exact size depends on the names). */
const WAV_HEADER_BYTES = 512;
/** Bytes per parked sample in the scratch folder (float32). */
const SCRATCH_BYTES_PER_SAMPLE = 4;
/** Margin kept free on the disk beyond the estimate (judgement: 5 % and at least 50 MB for the system). */
const FREE_MARGIN_FRACTION = 0.05;
const FREE_MARGIN_MIN_BYTES = 50e6;

export interface WorkEstimate {
  readonly wirings: number;
  readonly seconds: number;
  /** Bytes the finished files take. */
  readonly bytes: number;
  /** Most bytes on disk at once while working (files and scratch audio). */
  readonly peakBytes: number;
}

/** Bytes per sample of each WAV format. */
const BYTES_PER_SAMPLE: Readonly<Record<string, number>> = Object.freeze({ pcm16: 2, pcm24: 3, f32: 4 });

/** A render's work through `chain`: the WAV files (none with --no-wav; the page holds coil signals, not copies of them) and the scratch audio. */
export function estimateRender(wirings: number, audioSeconds: number, sampleRateHz: number, format: string, chain: CostedChain, writeWav = true): WorkEstimate {
  const frames = Math.ceil(audioSeconds * sampleRateHz);
  const wav = WAV_HEADER_BYTES + frames * (BYTES_PER_SAMPLE[format] ?? SCRATCH_BYTES_PER_SAMPLE);
  const bytes = writeWav ? wirings * wav : 0;
  if (!writeWav) return { wirings, seconds: wirings * RENDER_NO_WAV_SECONDS_PER_WIRING, bytes, peakBytes: bytes };
  return { wirings, seconds: wirings * audioSeconds * RENDER_SECONDS_PER_AUDIO_SECOND[chain], bytes, peakBytes: bytes + wirings * frames * SCRATCH_BYTES_PER_SAMPLE };
}

export function estimateAnalyze(wirings: number, audio: boolean): WorkEstimate {
  const perWiring = ANALYZE_CIRCUIT_SECONDS_PER_WIRING + (audio ? ANALYZE_AUDIO_SECONDS_PER_WIRING : 0);
  return { wirings, seconds: wirings * perWiring, bytes: 0, peakBytes: 0 };
}

/** "3.2 GB", "41 MB". */
export function formatBytes(bytes: number): string {
  if (bytes >= 1e9) return `${(bytes / 1e9).toFixed(1)} GB`;
  if (bytes >= 1e6) return `${Math.round(bytes / 1e6)} MB`;
  return `${Math.max(1, Math.round(bytes / 1e3))} kB`;
}

/** "about 20 min", "about 45 s". */
export function formatDuration(seconds: number): string {
  if (seconds >= 3600) return `about ${(seconds / 3600).toFixed(1)} h`;
  if (seconds >= 90) return `about ${Math.round(seconds / 60)} min`;
  return `about ${Math.max(1, Math.round(seconds))} s`;
}

export function isBig(estimate: WorkEstimate): boolean {
  return estimate.seconds > ANNOUNCE_SECONDS || estimate.peakBytes > ANNOUNCE_BYTES;
}

export function isTooBig(estimate: WorkEstimate): boolean {
  return estimate.seconds > REFUSE_SECONDS || estimate.peakBytes > REFUSE_BYTES;
}

/** One line describing the estimate. */
export function describeEstimate(what: string, estimate: WorkEstimate): string {
  const disk = estimate.bytes > 0 ? `, ${formatBytes(estimate.bytes)} of files (${formatBytes(estimate.peakBytes)} on disk while working)` : '';
  return `${what} of ${formatCount(estimate.wirings)} wirings: ${formatDuration(estimate.seconds)} on a 2-core machine (estimate)${disk}`;
}

/** Bytes free for this user on the file system that holds `path` (or its nearest existing parent); undefined when unknown. */
export function freeBytesAt(path: string): number | undefined {
  let place = path;
  for (;;) {
    try {
      const info = statfsSync(place);
      return info.bavail * info.bsize;
    } catch {
      const parent = dirname(place);
      if (parent === place) return undefined;
      place = parent;
    }
  }
}

/** Bytes to have free before starting: the estimate and a margin. */
export function bytesNeeded(estimate: WorkEstimate, freeBytes: number): number {
  return estimate.peakBytes + Math.max(FREE_MARGIN_MIN_BYTES, FREE_MARGIN_FRACTION * freeBytes);
}

/** Announce big work on standard error. */
export function announce(io: Io, line: string): void {
  io.stderr(`coilbench: ${line}\n`);
}

export interface WorkPermission {
  /** The user said --yes. */
  readonly yes: boolean;
  /** The user picked the wirings (--only): the size is what they asked for. */
  readonly picked: boolean;
  /** Where the files go (for the free-space check); undefined when nothing is written. */
  readonly where?: string;
}

/**
 * Announce big work, refuse work past the limit without --yes or --only
 * (InputError, exit 2), and refuse to start when the disk lacks the room
 * (WorkError, exit 1). Returns whether the work was announced as big.
 */
export function checkWorkSize(io: Io, what: string, estimate: WorkEstimate, permission: WorkPermission): boolean {
  const big = isBig(estimate);
  if (isTooBig(estimate) && !permission.yes && !permission.picked) {
    throw new InputError([
      {
        path: '--yes',
        expected: `--yes to start work past ${formatDuration(REFUSE_SECONDS)} or ${formatBytes(REFUSE_BYTES)}, or --only to pick wirings`,
        got: describeEstimate(what, estimate),
      },
    ]);
  }
  if (permission.where !== undefined && estimate.peakBytes > 0) {
    const free = freeBytesAt(permission.where);
    if (free !== undefined && free < bytesNeeded(estimate, free)) {
      throw new WorkError(
        `${escapeForMessage(permission.where, MAX_SHOWN_PATH)}: not enough free disk space: this ${what} needs about ${formatBytes(bytesNeeded(estimate, free))} (${formatBytes(estimate.peakBytes)} while working and a margin), ${formatBytes(free)} available`,
      );
    }
  }
  if (big) announce(io, `${describeEstimate(what, estimate)}; Ctrl-C stops it safely and the same command resumes`);
  return big;
}

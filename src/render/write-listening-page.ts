/**
 * A render folder's listening page: the report, the guitar, the knob
 * settings and each coil's signal for the rendered phrase (the page
 * synthesises every wiring from them), with the bundled page script. The
 * render writes the bytes (render-guitar.ts); they may be made on the
 * analysis thread (render-analysis-thread.ts).
 */
import { measureCoilDrive, measureSpectralBasis } from '../analysis/index.js';
import type { CircuitOverrides, CoilDrive } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { type PageSound, encodeCoilDrive } from '../page/index.js';
import { type ListeningReport, renderListeningPage } from '../report/index.js';
import type { Phrase } from '../string/index.js';
import { RENDER_TAIL_S } from './measure-wiring-audio.js';
import { readPageScript } from './page-script.js';
import type { HumMix } from './render-pass.js';
import { type CoilSignals, renderCoilSignals } from './synthesize-wirings.js';

export interface PageSettings {
  readonly guitar: Guitar;
  readonly phrase: Phrase;
  readonly sampleRateHz: number;
  readonly seed: number;
  readonly overrides: CircuitOverrides;
  readonly hum: HumMix | null;
  /** Ring-out after the last note, s (default: the files' RENDER_TAIL_S). */
  readonly tailS?: number;
  /** The coil drive of the reference phrase, when already measured (else measured here). */
  readonly drive?: CoilDrive;
  /** The coils' signals for this very performance, when already rendered (else rendered here). */
  readonly coils?: CoilSignals;
}

/** What a page needs to sound a guitar through `chain`: each coil's signal for the same performance as the files (phrase, rate, seed, tail). */
export function renderPageSound(settings: PageSettings, chain: string): PageSound {
  const coils = settings.coils ?? renderCoilSignals(settings.guitar, settings.phrase, { sampleRateHz: settings.sampleRateHz, seed: settings.seed, strings: { tailS: settings.tailS ?? RENDER_TAIL_S } });
  return {
    guitar: settings.guitar,
    overrides: settings.overrides,
    hum: settings.hum,
    chain,
    drive: encodeCoilDrive(settings.drive ?? measureCoilDrive(measureSpectralBasis(settings.guitar))),
    coils: { sampleRateHz: coils.sampleRateHz, length: coils.length, delay: coils.delay, fftSize: coils.fftSize, signals: coils.signals.map(encodeSignalNatively) },
  };
}

/**
 * encodeSignal's text (the page's portable base64 of the float32 bytes) made
 * by Node's own encoder: Buffer's base64 is RFC 4648 §4 with padding, the
 * same text, which src/page/base64.test.ts checks on every byte value and
 * tail length. Native code, where the portable loop ran cold once per coil
 * (three coils of 0.5 MB: 26 → 8.5 ms in one process on the 2-core machine).
 */
export function encodeSignalNatively(samples: Float32Array): string {
  return Buffer.from(samples.buffer, samples.byteOffset, samples.byteLength).toString('base64');
}

/** The page's HTML for a report. */
export function renderPageFor(report: ListeningReport, settings: PageSettings): string {
  return renderListeningPage(report, renderPageSound(settings, report.render.chain), readPageScript());
}

/**
 * The page's file as UTF-8 bytes, in an ArrayBuffer of their own (TextEncoder, not a slice of Buffer's shared
 * pool), so a thread that made them can hand them over without a copy (render-analysis-thread.ts).
 */
export function renderPageBytes(report: ListeningReport, settings: PageSettings): Uint8Array {
  return new TextEncoder().encode(renderPageFor(report, settings));
}

/**
 * What the listening page carries, and the one way its coil signals are
 * written and read. The render (Node) fills it; the page script (browser)
 * reads it from `<script type="application/json" id="page-data">`. Its size
 * grows with the number of coils, not of wirings: every wiring is
 * synthesised in the page from the coils' signals.
 */
import type { CircuitOverrides, CoilDrive } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { ComparisonReport, ListeningReport } from '../report/index.js';
import { decodeBase64, encodeBase64 } from './base64.js';

/** Each coil's EMF for the rendered phrase, float32 little-endian, base64. */
export interface PageCoilSignals {
  readonly sampleRateHz: number;
  /** Samples in every wiring's output. */
  readonly length: number;
  /** Samples every coil signal is delayed by. */
  readonly delay: number;
  readonly fftSize: number;
  /** Base64 of each coil's float32 samples (guitar.coils order). */
  readonly signals: readonly string[];
}

/** Mains hum mixed into every wiring, as in the render's files. */
export interface PageHum {
  readonly mainsHz: number;
  readonly emfVolts: number;
}

/** The reference phrase's coil drive (`measureCoilDrive`, src/analysis) as plain numbers, for plotting R(f) as the strings drive it. */
export interface PageCoilDrive {
  readonly coilCount: number;
  readonly pairCount: number;
  readonly frequenciesHz: readonly number[];
  readonly cross: readonly number[];
}

export function encodeCoilDrive(drive: CoilDrive): PageCoilDrive {
  return { coilCount: drive.coilCount, pairCount: drive.pairCount, frequenciesHz: Array.from(drive.frequenciesHz), cross: Array.from(drive.cross) };
}

export function decodeCoilDrive(drive: PageCoilDrive): CoilDrive {
  return { coilCount: drive.coilCount, pairCount: drive.pairCount, frequenciesHz: Float64Array.from(drive.frequenciesHz), cross: Float64Array.from(drive.cross) };
}

export interface PageData {
  /**
   * The report, without its wirings: those are carried apart, in
   * `<script type="application/json" id="page-wirings">` after the page's
   * script, and read once the first wiring is ready to sound (so a page of
   * thousands of wirings sounds before it has read their figures).
   */
  readonly report: ListeningReport;
  /** The wiring Play starts first (the report's first wiring: the list's first row), or null for none. */
  readonly opening: { readonly expression: string; readonly number: number } | null;
  /** The parsed guitar (the page enumerates its wirings and solves its circuit). */
  readonly guitar: Guitar;
  /** Knob and cable settings the render used. */
  readonly overrides: CircuitOverrides;
  readonly hum: PageHum | null;
  readonly coils: PageCoilSignals;
  /** The coil drive the report's figures were read with; absent in pages written before it was carried (the plot then shows the power sum). */
  readonly drive?: PageCoilDrive;
}

/** What the wiring engine needs to sound one guitar: its circuit, knob settings, hum, coil signals and chain. */
export interface PageSound {
  readonly guitar: Guitar;
  readonly overrides: CircuitOverrides;
  readonly hum: PageHum | null;
  readonly coils: PageCoilSignals;
  /** The chain the render used (a ChainName). */
  readonly chain: string;
  /** The coil drive of the reference phrase (the report's figures are read with it). */
  readonly drive?: PageCoilDrive;
}

/**
 * What the comparison page of `compare --render` carries, in
 * `<script type="application/json" id="comparison-data">`: the comparison
 * and each set's sound (sets in `report.sets` order). Its size grows with
 * the coils of every set, not with the wirings.
 */
export interface ComparisonPageData {
  readonly report: ComparisonReport;
  readonly sets: readonly PageSound[];
}

/** Bytes per float32 sample. */
const FLOAT32_BYTES = 4;

/** Samples → base64 of their float32 bytes (little-endian, as every supported host stores them). */
export function encodeSignal(samples: Float32Array): string {
  return encodeBase64(new Uint8Array(samples.buffer, samples.byteOffset, samples.length * FLOAT32_BYTES));
}

/** base64 of float32 bytes → samples. */
export function decodeSignal(base64: string): Float32Array {
  const bytes = decodeBase64(base64);
  return new Float32Array(bytes.buffer, bytes.byteOffset, Math.floor(bytes.length / FLOAT32_BYTES));
}

/**
 * The data a listening page is drawn from, and the shape of report.json in
 * a render folder. Plain JSON: numbers in the units their names say, text
 * exactly as it came from the guitar file (the page escapes it).
 *
 * Contract between the render pipeline (which fills it) and the page (which
 * draws it). Add fields freely; do not rename these.
 */
import type { HumCategory } from '../circuit/index.js';
import type { Topology } from '../wiring/index.js';

export interface ReportCoil {
  readonly id: string;
  /** Pickup housing the coil, if any. */
  readonly pickup: string | null;
  /** "160 mm" or "48→38 mm (bass→treble)". */
  readonly position: string;
  readonly resistanceOhms: number;
  readonly inductanceH: number;
  readonly capacitanceF: number;
  readonly winding: 'cw' | 'ccw';
  readonly magnet: 'north' | 'south';
}

export interface ReportGuitar {
  readonly name: string;
  /** Folder name under renders/. */
  readonly slug: string;
  readonly notes: string | null;
  readonly scaleM: number;
  /** Open strings, lowest first ("E2", …). */
  readonly tuning: readonly string[];
  readonly coils: readonly ReportCoil[];
  /** One line each, plain words: "volume 250 kΩ audio taper, set to 10", "tone …", "treble bleed …". */
  readonly controls: readonly string[];
  readonly cableCapacitanceF: number;
  readonly ampResistanceOhms: number;
  readonly ampCapacitanceF: number;
}

export interface ReportRender {
  /** Phrase name ("strum") or file name. */
  readonly phrase: string;
  /** Effects chain: "direct", "clean", "drive" or "compressed". */
  readonly chain: string;
  readonly sampleRateHz: number;
  readonly durationS: number;
  /** "true": files at true relative level with one common gain; "matched": each file loudness-matched. */
  readonly level: 'true' | 'matched';
  /** The common gain applied to every file in "true" mode, dB. */
  readonly commonGainDb: number;
  /** Mains frequency used for hum figures. */
  readonly mainsHz: number;
  /** Hum mixed into the audio, if any: frequency in Hz, else null. */
  readonly humMixHz: number | null;
  /** WAV sample format. */
  readonly format: 'pcm24' | 'pcm16' | 'f32';
}

export interface ReportWiring {
  /** "w1", "w2", … */
  readonly id: string;
  readonly number: number;
  /** Canonical expression in coilbench notation. */
  readonly expression: string;
  /** Plain-language description. */
  readonly description: string;
  /** Element ids used. */
  readonly coils: readonly string[];
  readonly topology: Topology;
  readonly outOfPhase: readonly string[];
  /** WAV path relative to the report folder ("wav/w9-neck-bridge-series-out.wav"), or null when not written (the page synthesises its sound from coil signals). */
  readonly wav: string | null;
  /** Energy of the reference render relative to the mean of the single-coil wirings, dB. */
  readonly levelDb: number;
  /** ITU-R BS.1770 integrated loudness of the reference render (before any common gain), LUFS. */
  readonly loudnessLufs: number;
  /** Spectral centroid of the reference render, Hz. */
  readonly centroidHz: number;
  /** Frequency of the resonant peak, Hz, or null when the maximum sits at an end of 20 Hz–20 kHz. */
  readonly resonanceHz: number | null;
  /** Height of the peak above the response at 100 Hz, dB. */
  readonly peakDb: number;
  readonly resonanceQ: number | null;
  /** Hum relative to the mean single coil that does not cancel hum, dB, floored at HUM_FLOOR_DB (docs/physics.md §6.1). */
  readonly humDb: number;
  readonly humCancelling: boolean;
  /** Hum in words: cancels, reduces or noisy (docs/physics.md §6.1); absent in reports of older versions. */
  readonly humCategory?: HumCategory | null;
  /** Power-sum response at `ListeningReport.responseFrequenciesHz`, dB relative to its value at 100 Hz. */
  readonly responseDb: readonly number[];
  /** Group of wirings that sound alike (filled by the distinctness analysis), or null. */
  readonly group: number | null;
}

/** Which of the guitar's wirings sound alike (the distinctness analysis, src/analysis). */
export interface ReportGroups {
  /** "47 wirings, 46 audibly distinct groups at these thresholds". */
  readonly summary: string;
  readonly thresholds: { readonly levelDb: number; readonly spectrumDb: number; readonly brightnessPercent: number };
  /** Every group, numbered as `ReportWiring.group`, members as wiring ids in the stable order (all of the guitar's wirings, rendered or not). */
  readonly groups: ReadonlyArray<{ readonly group: number; readonly members: readonly string[]; readonly expressions: readonly string[] }>;
}

/** One position of a switch kit, for a render of a switch plan (`coilbench switch --render`), in position order. */
export interface ReportSwitchPosition {
  /** Kit position, from 1. */
  readonly position: number;
  /** The kit's name for it: "1", or each switch's name and position for a kit of several switches. */
  readonly name: string;
  /** What the page and files show: "position 1: bridge_screw", "position 4: off". */
  readonly label: string;
  /** The wiring it gives (an id of `wirings`), or null when it connects no coil. */
  readonly wiringId: string | null;
  readonly expression: string | null;
}

export interface ListeningReport {
  readonly generator: string;
  readonly guitar: ReportGuitar;
  readonly render: ReportRender;
  /** Log-spaced frequencies for `responseDb`, Hz. */
  readonly responseFrequenciesHz: readonly number[];
  readonly wirings: readonly ReportWiring[];
  /** Groups of alike wirings, when computed. */
  readonly groups?: ReportGroups;
  /** The positions of a switch plan, in position order, when the render is of one. */
  readonly positions?: readonly ReportSwitchPosition[];
}

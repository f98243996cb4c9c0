/**
 * When two wirings sound alike: every difference under a just-noticeable
 * threshold. One options interface, one frozen defaults object, validated
 * once. docs/distinctness.md explains each default and its source.
 *
 * - levelDb, 1 dB: the level difference limen for moderate levels. Jesteadt,
 *   Wier & Green (1977), "Intensity discrimination as a function of
 *   frequency and sensation level", J. Acoust. Soc. Am. 61(1), 169–177:
 *   ΔI/I = 0.463·(I/I0)^(−0.072), i.e. 0.93 dB at 40 dB SL (docs/physics.md §7.2).
 * - spectrumDb, 1 dB: the level-matched excitation-pattern distance
 *   (measure-spectral-profiles.ts). A 1 dB RMS log-spectral distortion is
 *   the accepted limit of perceptually transparent spectral envelopes in
 *   speech coding (K. K. Paliwal, B. S. Atal, "Efficient vector quantization
 *   of LPC parameters at 24 bits/frame", IEEE Trans. Speech Audio Process.
 *   1(1), 3–14, 1993; F. K. Soong, B.-H. Juang, "Optimal quantization of LSP
 *   parameters", same journal 1(1), 15–24, 1993), and a change of about
 *   1 dB in excitation level at any place is what Zwicker's excitation
 *   model of discrimination takes as detectable (E. Zwicker, H. Fastl,
 *   Psychoacoustics: Facts and Models, 2nd ed., Springer, 1999, ch. 7 —
 *   from memory of the chapter).
 * - brightnessPercent, 3 %: centroid difference limens of a few percent —
 *   from memory, unverified (docs/physics.md §7.2: 2–5 %; Kendall's
 *   experiments stepped the centroid by 0.5–0.9 % per comparison).
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';

export interface AlikeThresholds {
  /** Largest level difference still alike, dB; above 0, at most 20. Default 1. */
  readonly levelDb: number;
  /** Largest level-matched spectral distance still alike, dB (RMS over ERB bands); above 0, at most 20. Default 1. */
  readonly spectrumDb: number;
  /** Largest brightness change still alike, percent; above 0, at most 100. Default 3. */
  readonly brightnessPercent: number;
}

export const DEFAULT_ALIKE_THRESHOLDS: Readonly<AlikeThresholds> = Object.freeze({ levelDb: 1, spectrumDb: 1, brightnessPercent: 3 });

/** Upper limits: a "threshold" wider than these would make everything alike (our bounds). */
const MAX_THRESHOLD_DB = 20;
const MAX_THRESHOLD_PERCENT = 100;

/** Merge `thresholds` over the defaults and check each; throws InputError naming each bad one. */
export function resolveAlikeThresholds(thresholds: Partial<AlikeThresholds> = {}): AlikeThresholds {
  const merged: AlikeThresholds = {
    levelDb: thresholds.levelDb ?? DEFAULT_ALIKE_THRESHOLDS.levelDb,
    spectrumDb: thresholds.spectrumDb ?? DEFAULT_ALIKE_THRESHOLDS.spectrumDb,
    brightnessPercent: thresholds.brightnessPercent ?? DEFAULT_ALIKE_THRESHOLDS.brightnessPercent,
  };
  const problems: InputProblem[] = [];
  const check = (value: number, high: number, path: string, unit: string): void => {
    if (!(Number.isFinite(value) && value > 0 && value <= high)) problems.push(problemAt(path, `a threshold above 0 and at most ${high} ${unit}`, value));
  };
  check(merged.levelDb, MAX_THRESHOLD_DB, 'thresholds.levelDb', 'dB');
  check(merged.spectrumDb, MAX_THRESHOLD_DB, 'thresholds.spectrumDb', 'dB');
  check(merged.brightnessPercent, MAX_THRESHOLD_PERCENT, 'thresholds.brightnessPercent', '%');
  if (problems.length > 0) throw new InputError(problems);
  return Object.freeze(merged);
}

/**
 * The sample-level string loop, the one place its difference equations are
 * written (Karplus & Strong 1983; Jaffe & Smith 1983):
 *
 *   d[n] = y[n − N]                               delay line
 *   h[n] = (1 − S)·d[n] + S·d[n − 1]              damping filter Hd (brightness)
 *   a[n] = η·h[n] + h[n − 1] − η·a[n − 1]         tuning allpass (fractional delay)
 *   b_k[n] = α·b_{k−1}[n] + b_{k−1}[n − 1] − α·b_k[n − 1],  b_0 = a,  k = 1…M
 *                                                 stiffness dispersion cascade (none when B = 0)
 *   y[n] = x[n] + ρ·b_M[n]                        excitation plus loop gain (decay)
 *
 * y is the travelling velocity wave arriving at the bridge, W(t): a wave
 * leaving the bridge comes back after one period having been reflected,
 * with sign −1, at both the nut (or fret) and the bridge, so the loop's sign
 * is +1 and all losses are lumped into one filter per trip (Smith, PASP,
 * "Digital Waveguide Models").
 *
 * A string plucked again is damped by the pick or finger: from `dampStart`
 * the note fades to silence over `dampLength` samples with a raised-cosine
 * (cos²) gain, so the old note ends without a click.
 */
import type { StringLoop } from './design-string-loop.js';

export interface StringVoice {
  /** Sample of the pluck (the excitation's first sample). */
  readonly start: number;
  /** Sample after the last one written (the end of the render). */
  readonly stop: number;
  /** Sample where a later pluck of the same string starts damping this note; `Infinity` if none. */
  readonly dampStart: number;
  /** Length of that damping fade, samples. */
  readonly dampLength: number;
}

/**
 * Sections of the dispersion cascade run together in one pass over a block
 * (runFourSections): four recurrences in flight at once, each section's
 * state in local variables. Sections left over run one pass each
 * (runOneSection).
 */
const SECTIONS_PER_PASS = 4;

/**
 * Run one note's loop and add its wave into `out` over [start, stop).
 *
 * The loop runs in blocks of at most N samples (N = the delay line's
 * length). Every delay-line sample a block reads was written at least N
 * samples earlier, so in an earlier block: the block first computes d, h
 * and a for all its samples, then runs the dispersion cascade over the
 * whole block section after section (four at a time, runFourSections), then
 * adds the excitation, writes the line and the output. Each sample still
 * takes the same operations in the same order as the equations above
 * applied sample by sample, so the same numbers to the last bit
 * (run-string-loop.test.ts holds them to that form). Section by section,
 * each section's recurrence runs with its state in local variables instead
 * of loading and storing every section's state at every sample: one note of
 * 125,000 samples with a line of 480 took 11.6 → 6.6–7.4 ms with 16
 * sections, 12.4–12.8 → 4.8–5.0 ms with 10, 8.6–8.8 → 2.4–2.6 ms with 4 and
 * 7.2–7.4 → 2.2 ms with 1 (medians of four warm runs in one process with the
 * command line's V8 setting, src/cli/eager-feedback.ts; two processes, the
 * 2-core machine).
 */
export function runStringLoop(loop: StringLoop, excitation: Float64Array, out: Float64Array, voice: StringVoice): void {
  const { delaySamples, stretch, allpassEta: eta, loopGain } = loop;
  const sections = loop.dispersion.sections;
  const alpha = loop.dispersion.coefficient;
  if (!(delaySamples >= 1)) throw new RangeError(`runStringLoop: the delay line needs at least 1 sample, got ${delaySamples}`);
  // The previous d, h and a (PREVIOUS_DELAYED …), then each section's last input and output: carried from block to block.
  const state = new Float64Array(SECTION_STATE + 2 * sections);
  const line = new Float64Array(delaySamples);
  const block = new Float64Array(delaySamples);
  const fadeEnd = voice.dampStart + voice.dampLength;
  const stop = Math.min(voice.stop, out.length, fadeEnd);
  let index = 0;
  // Only calls in this loop: V8's code compiled for a running loop bails out on code after it that has not run yet
  // (seen with node --trace-deopt when a string with leftover sections followed one without).
  for (let first = voice.start; first < stop; first += delaySamples) {
    const count = Math.min(delaySamples, stop - first);
    readLine(line, index, count, 1 - stretch, stretch, eta, state, block);
    runCascade(block, count, alpha, sections, state);
    index = addLoopOutput(block, count, first, voice, excitation, loopGain, line, index, out);
  }
}

/** Where `state` keeps the previous d, h and a; the sections' inputs and outputs follow from SECTION_STATE. */
const PREVIOUS_DELAYED = 0;
const PREVIOUS_DAMPED = 1;
const PREVIOUS_TUNED = 2;
const SECTION_STATE = 3;

/** d, h and a for the block's samples into `block`: the line's samples from N samples ago, from `index` on around the line. */
function readLine(line: Float64Array, index: number, count: number, keep: number, stretch: number, eta: number, state: Float64Array, block: Float64Array): void {
  const delaySamples = line.length;
  let previousDelayed = state[PREVIOUS_DELAYED] as number;
  let previousDamped = state[PREVIOUS_DAMPED] as number;
  let previousTuned = state[PREVIOUS_TUNED] as number;
  for (let j = 0, at = index; j < count; j += 1) {
    const delayed = line[at] as number;
    const damped = keep * delayed + stretch * previousDelayed;
    const tuned = eta * damped + previousDamped - eta * previousTuned;
    previousDelayed = delayed;
    previousDamped = damped;
    previousTuned = tuned;
    block[j] = tuned;
    at = at + 1 === delaySamples ? 0 : at + 1;
  }
  state[PREVIOUS_DELAYED] = previousDelayed;
  state[PREVIOUS_DAMPED] = previousDamped;
  state[PREVIOUS_TUNED] = previousTuned;
}

/** The dispersion cascade over the block in place, SECTIONS_PER_PASS sections a pass, then the leftover ones one by one. */
function runCascade(block: Float64Array, count: number, alpha: number, sections: number, state: Float64Array): void {
  let section = 0;
  for (; section + SECTIONS_PER_PASS <= sections; section += SECTIONS_PER_PASS) runFourSections(block, count, alpha, state, SECTION_STATE + 2 * section);
  for (; section < sections; section += 1) runOneSection(block, count, alpha, state, SECTION_STATE + 2 * section);
}

/**
 * y = x + ρ·b_M for the block's samples (n = first …), written into the
 * line from `index` and added into `out` (faded from the damping start);
 * returns the line index after the block.
 */
function addLoopOutput(
  block: Float64Array,
  count: number,
  first: number,
  voice: StringVoice,
  excitation: Float64Array,
  loopGain: number,
  line: Float64Array,
  index: number,
  out: Float64Array,
): number {
  // Every value the loop reads in a local: a loop's first calls run in V8's interpreter, where a property read
  // costs as much as the arithmetic (DEVELOPERS.md, "Code the interpreter runs").
  const delaySamples = line.length;
  const excitationLength = excitation.length;
  const { start, dampStart, dampLength } = voice;
  let at = index;
  for (let j = 0; j < count; j += 1) {
    const n = first + j;
    const i = n - start;
    const y = (i < excitationLength ? (excitation[i] as number) : 0) + loopGain * (block[j] as number);
    line[at] = y;
    at = at + 1 === delaySamples ? 0 : at + 1;
    if (n < dampStart) {
      out[n] = (out[n] as number) + y;
    } else {
      const gain = Math.cos((Math.PI / 2) * ((n - dampStart) / dampLength));
      out[n] = (out[n] as number) + y * gain * gain;
    }
  }
  return at;
}

/**
 * Four sections of the cascade over the block in place:
 * b_k[n] = α·b_{k−1}[n] + b_{k−1}[n − 1] − α·b_k[n − 1] for k = s … s + 3,
 * their last inputs and outputs read from and written back to `state` at
 * `at` (input, output pairs).
 */
function runFourSections(block: Float64Array, count: number, alpha: number, state: Float64Array, at: number): void {
  let in0 = state[at] as number;
  let out0 = state[at + 1] as number;
  let in1 = state[at + 2] as number;
  let out1 = state[at + 3] as number;
  let in2 = state[at + 4] as number;
  let out2 = state[at + 5] as number;
  let in3 = state[at + 6] as number;
  let out3 = state[at + 7] as number;
  for (let j = 0; j < count; j += 1) {
    const x = block[j] as number;
    const y0 = alpha * x + in0 - alpha * out0;
    in0 = x;
    out0 = y0;
    const y1 = alpha * y0 + in1 - alpha * out1;
    in1 = y0;
    out1 = y1;
    const y2 = alpha * y1 + in2 - alpha * out2;
    in2 = y1;
    out2 = y2;
    const y3 = alpha * y2 + in3 - alpha * out3;
    in3 = y2;
    out3 = y3;
    block[j] = y3;
  }
  state[at] = in0;
  state[at + 1] = out0;
  state[at + 2] = in1;
  state[at + 3] = out1;
  state[at + 4] = in2;
  state[at + 5] = out2;
  state[at + 6] = in3;
  state[at + 7] = out3;
}

/** One section of the cascade over the block in place (runFourSections' recurrence for one k). */
function runOneSection(block: Float64Array, count: number, alpha: number, state: Float64Array, at: number): void {
  let input = state[at] as number;
  let output = state[at + 1] as number;
  for (let j = 0; j < count; j += 1) {
    const x = block[j] as number;
    const y = alpha * x + input - alpha * output;
    input = x;
    output = y;
    block[j] = y;
  }
  state[at] = input;
  state[at + 1] = output;
}

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

/** Run one note's loop and add its wave into `out` over [start, stop). */
export function runStringLoop(loop: StringLoop, excitation: Float64Array, out: Float64Array, voice: StringVoice): void {
  const { delaySamples, stretch, allpassEta: eta, loopGain } = loop;
  const sections = loop.dispersion.sections;
  const alpha = loop.dispersion.coefficient;
  const sectionInputs = new Float64Array(sections);
  const sectionOutputs = new Float64Array(sections);
  const keep = 1 - stretch;
  const line = new Float64Array(delaySamples);
  const excitationLength = excitation.length;
  const fadeEnd = voice.dampStart + voice.dampLength;
  const stop = Math.min(voice.stop, out.length, fadeEnd);
  let index = 0;
  let previousDelayed = 0;
  let previousDamped = 0;
  let previousTuned = 0;
  for (let n = voice.start; n < stop; n += 1) {
    const i = n - voice.start;
    const delayed = line[index] as number;
    const damped = keep * delayed + stretch * previousDelayed;
    const tuned = eta * damped + previousDamped - eta * previousTuned;
    previousDelayed = delayed;
    previousDamped = damped;
    previousTuned = tuned;
    let dispersed = tuned;
    for (let k = 0; k < sections; k += 1) {
      const output = alpha * dispersed + (sectionInputs[k] as number) - alpha * (sectionOutputs[k] as number);
      sectionInputs[k] = dispersed;
      sectionOutputs[k] = output;
      dispersed = output;
    }
    const y = (i < excitationLength ? (excitation[i] as number) : 0) + loopGain * dispersed;
    line[index] = y;
    index = index + 1 === delaySamples ? 0 : index + 1;
    if (n < voice.dampStart) {
      out[n] = (out[n] as number) + y;
    } else {
      const gain = Math.cos((Math.PI / 2) * ((n - voice.dampStart) / voice.dampLength));
      out[n] = (out[n] as number) + y * gain * gain;
    }
  }
}

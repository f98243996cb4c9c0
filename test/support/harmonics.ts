/**
 * Test helpers that measure a tone the way a spectrum analyser would,
 * independently of the code under test: the amplitude of a sinusoid at a
 * given frequency from a Hann-windowed DTFT, X(f) = Σ w[n]·x[n]·e^(−j2πfn/fs),
 * amplitude = 2·|X| / Σ w[n] (exact for a steady sinusoid away from others).
 */

/** Amplitude of the component at `frequencyHz` in `signal` over [startS, startS + durationS). */
export function toneAmplitude(signal: ArrayLike<number>, sampleRateHz: number, frequencyHz: number, startS: number, durationS: number): number {
  const start = Math.round(startS * sampleRateHz);
  const count = Math.min(Math.round(durationS * sampleRateHz), signal.length - start);
  const omega = (2 * Math.PI * frequencyHz) / sampleRateHz;
  let re = 0;
  let im = 0;
  let windowSum = 0;
  for (let i = 0; i < count; i += 1) {
    const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * (i + 0.5)) / count);
    const x = (signal[start + i] ?? 0) * w;
    re += x * Math.cos(omega * i);
    im -= x * Math.sin(omega * i);
    windowSum += w;
  }
  return (2 * Math.hypot(re, im)) / windowSum;
}

/** Amplitudes of harmonics 1 … count of `fundamentalHz`. */
export function harmonicAmplitudes(
  signal: ArrayLike<number>,
  sampleRateHz: number,
  fundamentalHz: number,
  count: number,
  startS: number,
  durationS: number,
): number[] {
  return Array.from({ length: count }, (_, i) => toneAmplitude(signal, sampleRateHz, (i + 1) * fundamentalHz, startS, durationS));
}

/** Level of a in dB relative to b. */
export function decibels(a: number, b: number): number {
  return 20 * Math.log10(a / b);
}

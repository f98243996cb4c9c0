/**
 * Each coil's EMF spectrum E_i(f), computed once per coil from the strings'
 * waves; the render then needs per wiring only Y(f) = Σ_i T_i(f)·E_i(f).
 *
 * A magnetic pickup senses the string's transverse velocity over its pole
 * pieces (Faraday's law for small motion; Smith, PASP, "Pickup Modeling";
 * docs/physics.md §3). With W_s(t) the travelling velocity wave arriving at the
 * bridge of string s and a rigid bridge (reflection −1), the velocity at
 * distance d from the bridge is
 *
 *   v(d, t) = W(t + d/c) − W(t − d/c)   ⇒   V(f) = 2j·sin(ω·d/c)·W(f)
 *
 * (d'Alembert, derived). Its notches fall at f = k·c/(2d) and, c being fixed
 * by the string's tension, do not move when the string is fretted
 * (docs/physics.md §2). This centred standing-wave form is used on purpose: the
 * equivalent 1 − e^{−jω·2d/c} is this times e^{−jω·d/c}, a delay that
 * differs from coil to coil; it would shift coils at different positions
 * against each other in time and spoil every mix of coils, the out-of-phase
 * cancellations above all. Instead one delay D, common to every coil and
 * string of the guitar, makes the result causal (`pickupDelaySamples`).
 *
 * The coil senses a strip of string of width w (its aperture) centred on d:
 * averaging v over a uniform window multiplies by sinc(π·f·w/c) =
 * sin(π·f·w/c)/(π·f·w/c), first null at c/w (docs/physics.md §3, derived from
 * Tillman's treatment of pickup width). It is real, so it adds no delay.
 * A slanted coil has its own d under each string (`coilPositionAt`).
 *
 *   E_i(f) = sensitivity_i · e^{−jωD} · Σ_s 2j·sin(ω·d_is/c_s)·sinc(π·f·w_i/c_s)·W_s(f)
 *
 * E_i carries no winding or magnet sign: the circuit applies those. Its unit
 * is the string's velocity (m/s) times the coil's relative sensitivity; the
 * common scale of a real EMF (turns, flux gradient) is left to the level
 * normalisation. Strings are assumed to be equally magnetic (plain and wound
 * strings alike) — a simplification. A note fretted so high that its
 * vibrating length L·2^(−m/12) ends before a coil is not modelled apart: the
 * coil senses it as if the string ran on (on common guitars only a neck coil
 * at the top frets).
 */
import { type Guitar, coilPositionAt } from '../guitar/index.js';
import { nextPowerOfTwo, realFft } from '../math/index.js';
import type { StringRender } from '../string/index.js';

/**
 * The delay D, in whole samples, common to every coil's spectrum: the
 * longest time any sensed point lies from the bridge in travel time,
 * max over coils and strings of (d + w/2)/c, rounded up. Each E_i is the
 * pickup signal delayed by D samples.
 */
export function pickupDelaySamples(guitar: Pick<Guitar, 'coils'>, strings: Pick<StringRender, 'waveSpeedsMps' | 'sampleRateHz'>): number {
  const count = strings.waveSpeedsMps.length;
  let longestS = 0;
  for (const coil of guitar.coils) {
    strings.waveSpeedsMps.forEach((c, index) => {
      const reachM = coilPositionAt(coil, index, count) + coil.apertureM / 2;
      longestS = Math.max(longestS, reachM / c);
    });
  }
  return Math.ceil(longestS * strings.sampleRateHz);
}

/**
 * The frame the coil spectra of a render (or of its plan, `planPhrase`) take: the common delay D
 * (pickupDelaySamples) and the FFT size N = nextPowerOfTwo(L + D), so that no render wraps around
 * (computeCoilSpectra below). One place, so a thread that plans the frame before the strings are rendered
 * gets the size the render takes.
 */
export function coilFrame(guitar: Pick<Guitar, 'coils'>, strings: Pick<StringRender, 'length' | 'waveSpeedsMps' | 'sampleRateHz'>): { delay: number; fftSize: number } {
  const delay = pickupDelaySamples(guitar, strings);
  return { delay, fftSize: nextPowerOfTwo(strings.length + delay) };
}

/**
 * One interleaved half spectrum per coil (guitar.coils order) in realFft's
 * layout (bins 0 … N/2, length 2·(N/2 + 1)) for an N = fftSize transform.
 * fftSize must be a power of two of at least strings.length; with at least
 * strings.length + pickupDelaySamples the result is exactly linear (no wrap);
 * otherwise the last D samples wrap to the start (the string render fades
 * out to zero at its end, so they are silent).
 */
export function computeCoilSpectra(guitar: Pick<Guitar, 'coils'>, strings: StringRender, fftSize: number): Float64Array[] {
  if (strings.length > fftSize) throw new RangeError(`FFT size ${fftSize} is shorter than the string render (${strings.length} samples)`);
  const fft = realFft(fftSize);
  const bins = fft.bins;
  const delay = pickupDelaySamples(guitar, strings) % fftSize;
  const binHz = strings.sampleRateHz / fftSize;

  // W_s(f)·e^{−jωD}: each wave delayed by D samples (circularly), transformed once into one reused array and added
  // into every coil's spectrum before the next string's: each coil still takes the strings in order (the same sums),
  // and the strings' spectra are not all held at once (1 MB each at the demo's length, every fresh page of which the
  // kernel must zero on first touch).
  const shifted = new Float64Array(fftSize);
  const wave = new Float64Array(2 * bins);
  const count = strings.waves.length;
  const spectra = guitar.coils.map(() => new Float64Array(2 * bins));
  strings.waves.forEach((samples, index) => {
    shiftCircular(samples, delay, shifted);
    fft.forward(shifted, wave);
    const c = strings.waveSpeedsMps[index] as number;
    guitar.coils.forEach((coil, coilIndex) => {
      const distanceM = coilPositionAt(coil, index, count);
      // Position phase ω_k·d/c with ω_k = 2π·k·binHz; aperture phase π·f_k·w/c.
      const positionStep = (2 * Math.PI * binHz * distanceM) / c;
      const apertureStep = (Math.PI * binHz * coil.apertureM) / c;
      accumulateSensedWave(spectra[coilIndex] as Float64Array, wave, bins, positionStep, apertureStep, 2 * coil.sensitivity);
    });
  });
  return spectra;
}

/** shifted[(n + delay) mod N] = wave[n], zeros elsewhere (N = shifted.length ≥ wave.length): two copies, the part that wraps to the start second. */
function shiftCircular(wave: Float64Array, delay: number, shifted: Float64Array): void {
  const head = Math.min(wave.length, shifted.length - delay);
  shifted.fill(0);
  shifted.set(wave.subarray(0, head), delay);
  shifted.set(wave.subarray(head), 0);
}

/** Steps between exact resets of the rotating phasors (their rounding error grows about linearly with the run). */
const RESYNC_EVERY = 256;

/**
 * spectrum[k] += gain · j·sin(k·positionStep) · sinc(k·apertureStep) · wave[k] over all bins.
 * sin(k·θ) comes from a unit phasor rotated one step per bin and reset from
 * Math.cos/Math.sin every RESYNC_EVERY bins (error near 1e-13, a few
 * multiplications per bin instead of two sines).
 */
function accumulateSensedWave(
  spectrum: Float64Array,
  wave: Float64Array,
  bins: number,
  positionStep: number,
  apertureStep: number,
  gain: number,
): void {
  const positionCos = Math.cos(positionStep);
  const positionSin = Math.sin(positionStep);
  const apertureCos = Math.cos(apertureStep);
  const apertureSin = Math.sin(apertureStep);
  let pRe = 1;
  let pIm = 0;
  let aRe = 1;
  let aIm = 0;
  for (let k = 0; k < bins; k += 1) {
    if (k % RESYNC_EVERY === 0) {
      pRe = Math.cos(k * positionStep);
      pIm = Math.sin(k * positionStep);
      aRe = Math.cos(k * apertureStep);
      aIm = Math.sin(k * apertureStep);
    }
    // sinc(x) = sin(x)/x, 1 at x = 0 (and for a point coil, apertureStep = 0).
    const x = k * apertureStep;
    const aperture = x === 0 ? 1 : aIm / x;
    // j·sin(·)·(Wr + jWi) = sin(·)·(−Wi + jWr).
    const m = gain * pIm * aperture;
    spectrum[2 * k] = (spectrum[2 * k] as number) - m * (wave[2 * k + 1] as number);
    spectrum[2 * k + 1] = (spectrum[2 * k + 1] as number) + m * (wave[2 * k] as number);
    const nextP = pRe * positionCos - pIm * positionSin;
    pIm = pRe * positionSin + pIm * positionCos;
    pRe = nextP;
    const nextA = aRe * apertureCos - aIm * apertureSin;
    aIm = aRe * apertureSin + aIm * apertureCos;
    aRe = nextA;
  }
}

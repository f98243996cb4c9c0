import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type Coil, parseGuitarText } from '../guitar/index.js';
import { nextPowerOfTwo, realFft } from '../math/index.js';
import { type PhraseNote, type StringRender, builtInPhrase, renderPhrase } from '../string/index.js';
import { decibels, harmonicAmplitudes } from '../../test/support/harmonics.js';
import { computeCoilSpectra, pickupDelaySamples } from './compute-coil-spectra.js';

const demo = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8'));
const FS = 48000;

function coil(positionM: number | [number, number], apertureM: number, extra: Partial<Coil> = {}): Coil {
  const [bass, treble] = typeof positionM === 'number' ? [positionM, positionM] : positionM;
  return {
    id: 'test',
    index: 0,
    positionBassM: bass,
    positionTrebleM: treble,
    resistanceOhms: 6000,
    inductanceH: 2.5,
    capacitanceF: 1e-10,
    apertureM,
    winding: 'cw',
    magnet: 'north',
    construction: 'rod magnets',
    turns: 8000,
    turnsSource: 'file',
    lossResistanceOhms: null,
    eddyShare: 0,
    eddyResistanceOhms: 0,
    sensitivity: 1,
    humSensitivity: 1,
    sensitivityGiven: true,
    pickup: undefined,
    notes: undefined,
    ...extra,
  };
}

/** A render whose string `index` carries a unit impulse at sample `at` and the others silence. */
function impulseRender(waveSpeedsMps: number[], index: number, length: number, at = 1000): StringRender {
  const waves = waveSpeedsMps.map(() => new Float64Array(length));
  (waves[index] as Float64Array)[at] = 1;
  return { sampleRateHz: FS, length, waves, waveSpeedsMps };
}

const magnitude = (spectrum: Float64Array, k: number): number => Math.hypot(spectrum[2 * k] ?? 0, spectrum[2 * k + 1] ?? 0);

/** Frequency of the first local minimum of |E| above `fromHz` (bin resolution). */
function firstNotchHz(spectrum: Float64Array, size: number, fromHz: number): number {
  const binHz = FS / size;
  for (let k = Math.ceil(fromHz / binHz) + 1; k < size / 2; k += 1) {
    if (magnitude(spectrum, k) <= magnitude(spectrum, k - 1) && magnitude(spectrum, k) < magnitude(spectrum, k + 1)) return k * binHz;
  }
  return Number.NaN;
}

function pickupSignal(guitarCoils: Coil[], render: StringRender): Float64Array[] {
  const size = nextPowerOfTwo(render.length);
  return computeCoilSpectra({ coils: guitarCoils }, render, size).map((spectrum) => realFft(size).inverse(spectrum));
}

// Flexible strings (B = 0): these checks measure at exact harmonics, which a stiff string's partials leave (docs/physics.md §4.5).
const single = (note: PhraseNote, seconds = 1.5): StringRender => renderPhrase(demo, { name: 'one', notes: [note] }, { tailS: seconds, inharmonicity: 0 });

describe('computeCoilSpectra: position comb (docs/physics.md §2, derived; Smith, PASP, "Pickup Modeling")', () => {
  const quarter = coil(demo.scaleM / 4, 0.02);
  // Plucked 60 mm from the bridge so that no neighbour sits in a pluck notch: the default 130 mm is
  // within 1 % of a fifth of a 648 mm scale and nulls harmonic 5 as well.
  const PLUCK_M = 0.06;
  it.each([1, 2, 3, 4, 5, 6])('a coil at a quarter of the scale puts harmonics 4 and 8 of open string %i ≥ 30 dB below their neighbours', (number) => {
    const index = 6 - number;
    const render = single({ timeS: 0, string: number, fret: 0, velocity: 1, pluckM: PLUCK_M });
    const [signal] = pickupSignal([quarter], render);
    const levels = harmonicAmplitudes(signal ?? new Float64Array(), FS, demo.strings[index]?.openHz ?? 0, 9, 0.2, 1);
    for (const harmonic of [4, 8]) {
      const notch = levels[harmonic - 1] ?? 0;
      expect(decibels(levels[harmonic - 2] ?? 0, notch)).toBeGreaterThan(30);
      expect(decibels(levels[harmonic] ?? 0, notch)).toBeGreaterThan(30);
    }
  });

  it.each([
    [5, 3],
    [12, 2],
  ])('the notch 4·f_open = c/(2d) stays put in hertz when fretted: fret %i nulls harmonic %i of the fretted note', (fret, harmonic) => {
    const render = single({ timeS: 0, string: 6, fret, velocity: 1, pluckM: PLUCK_M });
    const [signal] = pickupSignal([quarter], render);
    const f1 = 82.4069 * 2 ** (fret / 12);
    const levels = harmonicAmplitudes(signal ?? new Float64Array(), FS, f1, 6, 0.2, 1);
    // Equal temperament's fourth is 2^(5/12), not 4/3: at fret 5 harmonic 3 sits 0.37 Hz above the notch.
    expect(Math.abs(harmonic * f1 - 4 * 82.4069)).toBeLessThan(0.4);
    expect(decibels(levels[harmonic - 2] ?? 0, levels[harmonic - 1] ?? 0)).toBeGreaterThan(30);
    expect(decibels(levels[harmonic] ?? 0, levels[harmonic - 1] ?? 0)).toBeGreaterThan(30);
    if (fret === 5) {
      // Had the comb followed the fretted note's harmonic numbers (sin(nπ·d/L) with n counted on
      // the fretted note), harmonic 4 of the fretted note would be nulled instead; it is not.
      expect(Math.abs(decibels(levels[3] ?? 0, levels[4] ?? 0))).toBeLessThan(15);
    }
  });

  // First pickup notch c/(2d), open strings on a 647.7 mm scale (docs/physics.md §2.1 table).
  it.each([
    [0.04, 1334, 5337],
    [0.1, 534, 2135],
    [0.16, 334, 1334],
  ])('a point coil %s m from the bridge: first notch %s Hz on E2 and %s Hz on E4', (positionM, e2Hz, e4Hz) => {
    const speeds = [2 * 0.6477 * 82.4069, 2 * 0.6477 * 329.6276];
    const size = 65536;
    for (const [index, expectedHz] of [
      [0, e2Hz],
      [1, e4Hz],
    ] as const) {
      const [spectrum] = computeCoilSpectra({ coils: [coil(positionM, 0)] }, impulseRender(speeds, index, size), size);
      expect(Math.abs(firstNotchHz(spectrum ?? new Float64Array(), size, 10) - expectedHz)).toBeLessThan(1);
    }
  });

  it('a slanted coil has its own distance under each string (bass 48 mm, treble 38 mm)', () => {
    const speeds = demo.strings.map((string) => 2 * demo.scaleM * string.openHz);
    const size = 65536;
    const slanted = coil([0.048, 0.038], 0);
    const bass = computeCoilSpectra({ coils: [slanted] }, impulseRender(speeds, 0, size), size)[0] ?? new Float64Array();
    const treble = computeCoilSpectra({ coils: [slanted] }, impulseRender(speeds, 5, size), size)[0] ?? new Float64Array();
    const binHz = FS / size;
    expect(Math.abs(firstNotchHz(bass, size, 10) - (speeds[0] ?? 0) / (2 * 0.048))).toBeLessThan(binHz);
    expect(Math.abs(firstNotchHz(treble, size, 10) - (speeds[5] ?? 0) / (2 * 0.038))).toBeLessThan(binHz);
  });
});

describe('computeCoilSpectra: aperture (docs/physics.md §3, uniform window, derived)', () => {
  // 647.7 mm scale; E2 c = 106.75 m/s, E4 c = 427.0 m/s.
  it.each([
    [0.0254, 0, 4203, 1862],
    [0.0635, 0, 1681, 745],
    [0.0254, 1, 16811, 7446],
    [0.0635, 1, 6724, 2979],
  ])('a %s m window on string %i: first null at c/w = %s Hz, −3 dB at %s Hz', (apertureM, index, nullHz, halfPowerHz) => {
    const speeds = [2 * 0.6477 * 82.4069, 2 * 0.6477 * 329.6276];
    const size = 65536;
    const render = impulseRender(speeds, index, size);
    // A point coil and a wide one at the same place: their ratio is the aperture alone.
    const positionM = 0.0123; // position notches far above the range looked at
    const [wide, point] = computeCoilSpectra({ coils: [coil(positionM, apertureM), coil(positionM, 0)] }, render, size);
    const binHz = FS / size;
    const ratio = (hz: number): number => magnitude(wide ?? new Float64Array(), Math.round(hz / binHz)) / magnitude(point ?? new Float64Array(), Math.round(hz / binHz));
    let nullK = 1;
    for (let k = 2; k < size / 2 && ratio(k * binHz) < ratio((k - 1) * binHz); k += 1) nullK = k;
    expect(Math.abs(nullK * binHz - nullHz)).toBeLessThan(1);
    expect(20 * Math.log10(ratio(halfPowerHz))).toBeCloseTo(-3.01, 1);
  });
});

describe('computeCoilSpectra: what the coil senses', () => {
  it('an ideal pluck at 120 mm seen by a point coil at 160 mm has the published harmonic amplitudes (docs/physics.md §2.1: open E2, 647.7 mm)', () => {
    const guitar = { scaleM: 0.6477, strings: [{ index: 0, number: 1, openHz: 82.4069, name: 'E2' }] };
    const render = renderPhrase(
      guitar,
      { name: 'ideal', notes: [{ timeS: 0, string: 1, fret: 0, velocity: 1, pluckM: 0.12 }] },
      { pluckShape: 'ideal', brightness: 1, t60S: 60, tailS: 2, inharmonicity: 0 },
    );
    const [signal] = pickupSignal([coil(0.16, 0)], render);
    const levels = harmonicAmplitudes(signal ?? new Float64Array(), FS, 82.4069, 10, 0.2, 1.5);
    const published = [1.0, 1.1923, 0.6194, 0.0176, 0.0802, 0.1485, 0.224, 0.0242, 0.161, 0.1154];
    levels.forEach((level, i) => expect(level / (levels[0] ?? 1)).toBeCloseTo(published[i] ?? 0, 3));
  });

  it('senses velocity: a wave impulse gives +1 at D − d/c and −1 at D + d/c after the pluck, every coil centred on the same D (no per-coil delay)', () => {
    const size = 8192;
    const c = 100; // m/s; d·fs/c = 24 and 72 samples exactly
    const render = impulseRender([c], 0, size, 1000);
    const near = coil(0.05, 0);
    const far = coil(0.15, 0);
    const delay = pickupDelaySamples({ coils: [near, far] }, render);
    expect(delay).toBe(72); // ceil(0.15 m / 100 m/s · 48000)
    const [a, b] = pickupSignal([near, far], render);
    const expectPulses = (signal: Float64Array | undefined, offset: number): void => {
      expect(signal?.[1000 + delay - offset]).toBeCloseTo(1, 9);
      expect(signal?.[1000 + delay + offset]).toBeCloseTo(-1, 9);
      let rest = 0;
      signal?.forEach((value, n) => {
        if (n !== 1000 + delay - offset && n !== 1000 + delay + offset) rest = Math.max(rest, Math.abs(value));
      });
      expect(rest).toBeLessThan(1e-9);
    };
    expectPulses(a, 24);
    expectPulses(b, 72);
  });

  it('scales with sensitivity and ignores winding and magnet (the circuit applies signs)', () => {
    const render = single({ timeS: 0, string: 5, fret: 0, velocity: 1 }, 0.3);
    const size = nextPowerOfTwo(render.length);
    const [plain, other] = computeCoilSpectra(
      { coils: [coil(0.1, 0.02), coil(0.1, 0.02, { sensitivity: 2, winding: 'ccw', magnet: 'south' })] },
      render,
      size,
    );
    plain?.forEach((value, i) => expect(other?.[i]).toBe(2 * value));
    expect(magnitude(plain ?? new Float64Array(), 0)).toBe(0); // no DC: the pickup senses velocity
  });

  it('gives the same bytes for the same input, one spectrum per coil in declaration order', () => {
    const render = renderPhrase(demo, builtInPhrase('strum'));
    const size = nextPowerOfTwo(render.length);
    const a = computeCoilSpectra(demo, render, size);
    const b = computeCoilSpectra(demo, renderPhrase(demo, builtInPhrase('strum')), size);
    expect(a).toHaveLength(demo.coils.length);
    a.forEach((spectrum, i) => {
      expect(spectrum).toHaveLength(size + 2);
      expect(Buffer.from(spectrum.buffer).equals(Buffer.from((b[i] as Float64Array).buffer))).toBe(true);
    });
    expect(pickupDelaySamples(demo, render)).toBe(77); // ceil((160 + 10) mm / (2 · 648 mm · 82.4069 Hz) · 48 kHz) = ceil(76.4)
  });

  it('matches a direct evaluation of E(f) = s·e^{−jωD}·Σ 2j·sin(ωd/c)·sinc(πfw/c)·W(f) with Math.sin at scattered bins', () => {
    const render = renderPhrase(demo, builtInPhrase('strum'), { tailS: 0.5 });
    const size = nextPowerOfTwo(render.length);
    const delay = pickupDelaySamples(demo, render);
    const spectra = computeCoilSpectra(demo, render, size);
    const fft = realFft(size);
    const waves = render.waves.map((wave) => fft.forward(Float64Array.from({ length: size }, (_, n) => (n >= delay ? (wave[n - delay] ?? 0) : 0))));
    demo.coils.forEach((guitarCoil, i) => {
      for (let k = 1; k < size / 2; k += 997) {
        const f = (k * FS) / size;
        let re = 0;
        let im = 0;
        waves.forEach((wave, s) => {
          const c = render.waveSpeedsMps[s] ?? 1;
          const d = guitarCoil.positionBassM + ((guitarCoil.positionTrebleM - guitarCoil.positionBassM) * s) / 5;
          const x = (Math.PI * f * guitarCoil.apertureM) / c;
          const m = 2 * guitarCoil.sensitivity * Math.sin((2 * Math.PI * f * d) / c) * (Math.sin(x) / x);
          re -= m * (wave[2 * k + 1] ?? 0);
          im += m * (wave[2 * k] ?? 0);
        });
        const scale = Math.hypot(re, im) + 1e-9;
        expect(Math.abs((spectra[i]?.[2 * k] ?? 0) - re) / scale).toBeLessThan(1e-9);
        expect(Math.abs((spectra[i]?.[2 * k + 1] ?? 0) - im) / scale).toBeLessThan(1e-9);
      }
    });
  });

  it('refuses an FFT shorter than the render', () => {
    const render = single({ timeS: 0, string: 1, fret: 0, velocity: 1 }, 0.1);
    expect(() => computeCoilSpectra(demo, render, 1024)).toThrow(RangeError);
  });
});

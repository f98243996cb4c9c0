/**
 * The drive stage: its curve, the harmonics it adds, the aliasing the 4×
 * oversampling keeps away, and the headroom it guarantees.
 */
import { describe, expect, it } from 'vitest';
import { filterCascade, makePluck, makeSine, measureNonHarmonicDb, measurePeak, measureThd } from '../../test/support/tone-measures.js';
import { designBiquad } from './biquad-design.js';
import { type ChainDesign, type Oversample, DRIVE_OUTPUT_DB, designEffectsChain } from './chain-design.js';
import { resolveChainOptions } from './chain-options.js';
import { DRIVE_BIAS, DRIVE_CURVE_POINTS, DRIVE_CURVE_SPAN, designDriveCurve, measureDriveSlopeAtRest, shapeDrive } from './drive-curve.js';
import { renderEffectsChain } from './effects-chain.js';
import { renderChainDesign } from './render-chain-design.js';

const TONE_HZ = 220;

/** Only the drive gain and the clipper of a drive design (no filters), with the given oversampling. */
function clipperOnly(design: ChainDesign, oversample: Oversample): ChainDesign {
  const [gain] = design.stages;
  const shaper = design.stages.find((stage) => stage.kind === 'shaper');
  if (gain === undefined || shaper === undefined || shaper.kind !== 'shaper') throw new Error('drive design without gain or clipper');
  return { ...design, stages: [gain, { ...shaper, oversample }], latencyFrames: oversample === 'none' ? 0 : 128 };
}

describe('the clipper curve', () => {
  it('is silent at rest, saturates at ±1 − tanh(b), and is tabulated on an odd grid through zero', () => {
    const curve = designDriveCurve();
    expect(curve).toHaveLength(DRIVE_CURVE_POINTS);
    expect(curve[(DRIVE_CURVE_POINTS - 1) / 2]).toBe(0);
    expect(curve[0]).toBeCloseTo(-1 - Math.tanh(DRIVE_BIAS), 4);
    expect(curve[DRIVE_CURVE_POINTS - 1]).toBeCloseTo(1 - Math.tanh(DRIVE_BIAS), 4);
    // Point i holds y(span·(2i/(N − 1) − 1)).
    expect(curve[3000]).toBeCloseTo(shapeDrive(DRIVE_CURVE_SPAN * ((2 * 3000) / (DRIVE_CURVE_POINTS - 1) - 1)), 6);
  });
  it('rises monotonically with slope 1 − tanh²(b) at rest', () => {
    const curve = designDriveCurve();
    for (let i = 1; i < curve.length; i += 1) expect(curve[i] ?? 0).toBeGreaterThanOrEqual(curve[i - 1] ?? 0);
    const derivative = (shapeDrive(1e-6) - shapeDrive(-1e-6)) / 2e-6;
    expect(measureDriveSlopeAtRest()).toBeCloseTo(derivative, 8);
  });
});

describe.each([44_100, 48_000])('harmonics and aliasing of a 220 Hz sine at %s Hz', (sampleRateHz) => {
  const settled = Math.round(0.5 * sampleRateHz);

  it('THD rises with the drive gain', async () => {
    const sine = makeSine(TONE_HZ, 0.2, 1.5, sampleRateHz);
    const thd: number[] = [];
    for (const driveDb of [0, 12, 24, 36, 48]) thd.push(measureThd(await renderEffectsChain(sine, sampleRateHz, 'drive', { driveDb }), TONE_HZ, sampleRateHz, settled));
    for (let i = 1; i < thd.length; i += 1) expect(thd[i] ?? 0, `THD at step ${i}: ${thd.join(', ')}`).toBeGreaterThan((thd[i - 1] ?? 0) * 1.2);
    expect(thd[0]).toBeLessThan(0.02); // observed 0.8 %: nearly clean at 0 dB
    expect(thd[3]).toBeGreaterThan(0.25); // observed 31 % at 36 dB
  });

  it('a weakly driven clipper makes the harmonics its Taylor series predicts', async () => {
    // y(u) ≈ y'·u + y''·u²/2 + y'''·u³/6 with y' = 1 − t², y'' = −2t(1 − t²), y''' = −2(1 − t²)(1 − 3t²), t = tanh(b).
    // For u = A·sin θ: H1 = y'·A + y'''·A³/8, H2 = |y''|·A²/4, H3 = |y'''|·A³/24 (u² = A²(1 − cos 2θ)/2,
    // u³ = A³(3 sin θ − sin 3θ)/4). Terms of order five and up change THD by about A², here 1 %.
    const amplitude = 0.1;
    const t = Math.tanh(DRIVE_BIAS);
    const [d1, d2, d3] = [1 - t * t, -2 * t * (1 - t * t), -2 * (1 - t * t) * (1 - 3 * t * t)];
    const h1 = d1 * amplitude + (d3 * amplitude ** 3) / 8;
    const predicted = Math.hypot((Math.abs(d2) * amplitude ** 2) / 4, (Math.abs(d3) * amplitude ** 3) / 24) / h1;
    const design = clipperOnly(designEffectsChain('drive', resolveChainOptions({ driveDb: 0 }), sampleRateHz), '4x');
    const output = await renderChainDesign(makeSine(TONE_HZ, amplitude, 1, sampleRateHz), design);
    const measured = measureThd(output, TONE_HZ, sampleRateHz, settled);
    expect(predicted).toBeCloseTo(0.0075, 4);
    expect(Math.abs(measured / predicted - 1)).toBeLessThan(0.03);
  });

  it('4× oversampling keeps the energy between the harmonics far below them', async () => {
    // 48 dB of drive turns the sine nearly square: partials at 1/n reach past the Nyquist frequency and would fold
    // back between the harmonics (220 Hz does not divide either sample rate, so folded partials miss the harmonics).
    const sine = makeSine(TONE_HZ, 0.2, 1.5, sampleRateHz);
    const design = designEffectsChain('drive', resolveChainOptions({ driveDb: 48 }), sampleRateHz);
    const size = 32_768;
    const chainDb = measureNonHarmonicDb(await renderChainDesign(sine, design), TONE_HZ, sampleRateHz, settled, size);
    const oversampledDb = measureNonHarmonicDb(await renderChainDesign(sine, clipperOnly(design, '4x')), TONE_HZ, sampleRateHz, settled, size);
    const plainDb = measureNonHarmonicDb(await renderChainDesign(sine, clipperOnly(design, 'none')), TONE_HZ, sampleRateHz, settled, size);
    // Observed: whole chain and 4× clipper −88 to −92 dB (the window's sidelobe floor), clipper without oversampling −43 to −46 dB.
    expect(chainDb).toBeLessThan(-75);
    expect(oversampledDb).toBeLessThan(-75);
    expect(plainDb - oversampledDb, 'the measurement sees aliasing when it is there').toBeGreaterThan(25);
  });
});

describe('headroom of the drive chain', () => {
  it('never puts out more than the clipper swing × the filters’ L1 gain × the trim, whatever goes in', async () => {
    const sampleRateHz = 48_000;
    const design = designEffectsChain('drive', resolveChainOptions({ driveDb: 60 }), sampleRateHz);
    // Bounded-input bounded-output: |y| ≤ max|x| · Σ|h[n]| for a linear filter with impulse response h (Oppenheim &
    // Schafer §2.4). After the clipper come the tone stack and cabinet sections, then the output trim.
    const clipperAt = design.stages.findIndex((stage) => stage.kind === 'shaper');
    const after = design.stages.slice(clipperAt + 1).flatMap((stage) => (stage.kind === 'biquad' ? [designBiquad(stage.filter, sampleRateHz)] : []));
    const impulse = new Float64Array(sampleRateHz);
    impulse[0] = 1;
    const l1 = filterCascade(impulse, after).reduce((sum, value) => sum + Math.abs(value), 0);
    const bound = (1 + Math.tanh(DRIVE_BIAS)) * l1 * 10 ** (DRIVE_OUTPUT_DB / 20);
    expect(l1).toBeGreaterThan(3); // observed 3.80
    let loudest = 0;
    for (const peakV of [0.01, 1, 100]) {
      const output = await renderEffectsChain(makePluck(82.41, peakV, 1, sampleRateHz), sampleRateHz, 'drive', { driveDb: 60 });
      loudest = Math.max(loudest, measurePeak(output));
    }
    expect(loudest).toBeLessThan(bound); // observed 0.82 against a bound of 1.09
    expect(loudest).toBeGreaterThan(0.5);
  });
});

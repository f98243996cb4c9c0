/**
 * The small-signal magnitude response of a chain design: what a quiet steady
 * sine gains through it. Biquads by the Audio EQ Cookbook, the clipper by its
 * slope at rest, the compressor by its makeup gain (signals below threshold).
 */
import { designBiquad, measureBiquadMagnitude } from './biquad-design.js';
import type { ChainDesign, ChainStage } from './chain-design.js';
import { measureCompressorMakeupDb } from './compressor-settings.js';
import { decibelsToGain, gainToDecibels } from './decibels.js';

/** Gain of one stage for a quiet sine at `frequencyHz` (plain ratio). */
function stageGain(stage: ChainStage, frequencyHz: number, sampleRateHz: number): number {
  switch (stage.kind) {
    case 'gain':
      return Math.abs(stage.gain);
    case 'biquad':
      return measureBiquadMagnitude(designBiquad(stage.filter, sampleRateHz), frequencyHz, sampleRateHz);
    case 'shaper': {
      // Chord slope of the tabulated curve across the point at rest; node inputs step by 2/(N − 1) per point.
      const middle = (stage.curve.length - 1) / 2;
      const below = stage.curve[middle - 1] ?? 0;
      const above = stage.curve[middle + 1] ?? 0;
      return ((above - below) / 2) * middle;
    }
    case 'compressor':
      return decibelsToGain(measureCompressorMakeupDb(stage.settings));
  }
}

/** Small-signal gain of `design` at each frequency, dB (20·log10 of the amplitude ratio). */
export function measureChainResponse(design: ChainDesign, frequenciesHz: readonly number[]): number[] {
  return frequenciesHz.map((frequencyHz) => {
    let gain = 1;
    for (const stage of design.stages) gain *= stageGain(stage, frequencyHz, design.sampleRateHz);
    return gainToDecibels(gain);
  });
}

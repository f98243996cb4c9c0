/**
 * A listening report with invented figures for any coil ids, for unit tests
 * and the bench (no audio files; every wiring points at wav/<id>.wav).
 */
import type { ListeningReport, ReportWiring } from '../../src/report/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';

/** Log-spaced response frequencies, 20 Hz to 20 kHz. */
function responseFrequencies(points: number): number[] {
  return Array.from({ length: points }, (_, index) => 20 * 1000 ** (index / (points - 1)));
}

export function makeExampleReport(ids: readonly string[], name = 'Page test guitar (invented values)', responsePoints = 5): ListeningReport {
  const frequencies = responseFrequencies(responsePoints);
  const wirings: ReportWiring[] = enumerateWirings(ids.map((id) => ({ id }))).map((wiring) => ({
    id: wiring.id,
    number: wiring.number,
    expression: wiring.expression,
    description: wiring.description,
    coils: wiring.elementIds,
    topology: wiring.topology,
    outOfPhase: wiring.outOfPhase,
    wav: `wav/${wiring.id}.wav`,
    levelDb: -wiring.number / 10,
    loudnessLufs: -20 - wiring.number / 10,
    centroidHz: 500 + wiring.number * 37,
    resonanceHz: 2000 + wiring.number * 50,
    peakDb: 3,
    resonanceQ: 1.5,
    humDb: wiring.outOfPhase.length > 0 ? -30 : 0,
    humCancelling: wiring.outOfPhase.length > 0,
    responseDb: frequencies.map((hz) => -20 * Math.log10(1 + (hz / (2000 + wiring.number * 50)) ** 2) / 2),
    group: null,
  }));
  return {
    generator: 'coilbench test',
    guitar: {
      name,
      slug: 'page-test',
      notes: `notes ${name}`,
      scaleM: 0.648,
      tuning: ['E2', 'A2', 'D3', 'G3', 'B3', 'E4'],
      coils: ids.map((id) => ({ id, pickup: null, position: '100 mm', resistanceOhms: 6000, inductanceH: 2.5, capacitanceF: 1e-10, winding: 'cw', magnet: 'north' })),
      controls: [`volume ${name}`],
      cableCapacitanceF: 5e-10,
      ampResistanceOhms: 1e6,
      ampCapacitanceF: 5e-11,
    },
    render: { phrase: 'strum', chain: 'direct', sampleRateHz: 48000, durationS: 6, level: 'true', commonGainDb: 0, mainsHz: 60, humMixHz: null, format: 'pcm24' },
    responseFrequenciesHz: frequencies,
    wirings,
  };
}

/**
 * The candidates a switch kit chooses among: every wiring with its level,
 * hum cancelling and network, and the distance between two of them in
 * multiples of the just-noticeable difference (the shortlist's measure,
 * src/analysis/measure-wiring-difference.ts).
 */
import { type AlikeThresholds, measureDistinctness, measureWiringDistance } from '../analysis/index.js';
import { type CircuitOverrides, measureCircuitMetrics } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import type { Wiring } from '../wiring/index.js';
import type { ChoiceWiring } from './solve-switch-choice.js';

export interface ChoiceWirings {
  readonly list: readonly ChoiceWiring[];
  /** Distance between wirings a and b (indices into `list`), in just-noticeable differences. */
  readonly distance: (a: number, b: number) => number;
}

export function measureChoiceWirings(guitar: Guitar, wirings: readonly Wiring[], overrides?: CircuitOverrides, thresholds?: Partial<AlikeThresholds>): ChoiceWirings {
  const circuit = measureCircuitMetrics(guitar, wirings, overrides);
  const distinct = measureDistinctness(guitar, wirings, { overrides, thresholds });
  const list = wirings.map((wiring, index) => ({
    rank: wiring.number,
    levelDb: distinct.profiles.levelsDb[index] as number,
    humCancelling: circuit.wirings[index]?.humCancelling ?? false,
    elements: wiring.elements,
    expression: wiring.expression,
    network: wiring.network,
  }));
  const distance = (a: number, b: number): number => measureWiringDistance(distinct.profiles, a, distinct.profiles, b, distinct.thresholds);
  return { list, distance };
}

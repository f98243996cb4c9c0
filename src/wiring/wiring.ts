import type { Network, Topology } from './network.js';

/** One distinct wiring of a guitar, numbered in the stable order described in `enumerate-wirings.ts`. */
export interface Wiring {
  /** "w1", "w2", … */
  readonly id: string;
  /** 1-based position in the stable order. */
  readonly number: number;
  /** Canonical network. */
  readonly network: Network;
  /** Canonical text in coilbench's notation. */
  readonly expression: string;
  /** Element indices used, ascending. */
  readonly elements: readonly number[];
  /** Element ids used, in declaration order. */
  readonly elementIds: readonly string[];
  readonly topology: Topology;
  /** Element ids written with `~` in the canonical text. */
  readonly outOfPhase: readonly string[];
  /** Plain-language description. */
  readonly description: string;
}

/**
 * analyze's figures that need no render of each wiring, wiring by wiring in
 * the stable order and in bounded memory, for guitars too big to hold
 * (six elements: 228,386 wirings):
 *
 * - resonance, peak, Q and hum: the circuit figures (measure-circuit-metrics.ts),
 *   the same numbers as measureCircuitMetrics over every wiring at once;
 * - level and brightness from the band cross-spectra of the reference
 *   phrase (solve-wiring-spectra.ts): levelDb is the energy of the wiring's
 *   reference render relative to the mean single element (Parseval: the
 *   same quantity as the rendered levelDb, within 0.05 dB,
 *   test/distinct-versus-render.test.ts); brightnessHz is the
 *   power-weighted centroid Σ f·|Y|² / Σ |Y|² over 20 Hz–20 kHz (not the
 *   rendered, magnitude-weighted centroidHz; docs/distinctness.md).
 *
 * Work goes subset by subset (wiring/enumerate-wirings.ts plans each one as
 * numbers) and, inside a subset, structure by structure: the phase patterns
 * of a structure share its circuit solution and band tables, which are
 * dropped before the next structure. The subset's figures are then handed
 * out in the stable order. What is held at once: one subset's plan and
 * figures (176,128 wirings for the full set of six) and one structure's
 * tables, whatever the number of wirings.
 *
 * A generator, so a caller can stop, or pause between steps (the command
 * line lets Ctrl-C in there): a `progress` step follows each structure.
 */
import type { CircuitMetricsSolver, CircuitOverrides, WiringCircuitMetrics } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';
import { type Network, type Wiring, networkOfPlan, planWiringSubsets, wiringOfPlan } from '../wiring/index.js';
import type { SpectralBasis } from './measure-spectral-basis.js';
import { prepareWiringSpectra } from './solve-wiring-spectra.js';

export interface WiringFigures {
  readonly wiring: Wiring;
  readonly circuit: WiringCircuitMetrics;
  /** Null when nothing reaches the output (volume at 0). */
  readonly levelDb: number | null;
  readonly brightnessHz: number | null;
}

export type WiringFiguresStep =
  | { readonly kind: 'wiring'; readonly figures: WiringFigures }
  /** `done` wirings of `total` have their figures computed (not all handed out yet). */
  | { readonly kind: 'progress'; readonly done: number; readonly total: number };

export interface WiringFiguresOptions {
  /** The circuit figures' solver (prepareCircuitMetrics, with the drive of measure-coil-drive.ts as analyze passes it). */
  readonly circuit: CircuitMetricsSolver;
  /** The guitar's band cross-spectra for the reference phrase (measure-spectral-basis.ts). */
  readonly basis: SpectralBasis;
  /** Circuit what-ifs: the same as the circuit solver's. */
  readonly overrides: CircuitOverrides | undefined;
  /** Number of wirings, for progress (wiringCountFor). */
  readonly total: number;
}

/** Every wiring's figures in the stable order, with progress steps between structures. Throws InputError for a bad override. */
export function* measureWiringFigures(guitar: Guitar, options: WiringFiguresOptions): Generator<WiringFiguresStep> {
  const ids = guitar.elements.map((element) => element.id);
  const { circuit } = options;
  const spectra = prepareWiringSpectra(guitar, options.basis, options.overrides);
  let done = 0;
  for (const plan of planWiringSubsets(ids)) {
    const count = plan.structureOf.length;
    // The subset's slots grouped by structure (a counting sort keeps each structure's slots in order).
    const structureCount = plan.structures.length;
    const starts = new Int32Array(structureCount + 1);
    for (let slot = 0; slot < count; slot += 1) starts[(plan.structureOf[slot] as number) + 1] = (starts[(plan.structureOf[slot] as number) + 1] as number) + 1;
    for (let s = 0; s < structureCount; s += 1) starts[s + 1] = (starts[s + 1] as number) + (starts[s] as number);
    const bySlot = new Int32Array(count);
    const filled = Int32Array.from(starts.subarray(0, structureCount));
    for (let slot = 0; slot < count; slot += 1) {
      const s = plan.structureOf[slot] as number;
      bySlot[filled[s] as number] = slot;
      filled[s] = (filled[s] as number) + 1;
    }
    const circuitFigures = new Array<WiringCircuitMetrics>(count);
    const levels = new Float64Array(count);
    const brightness = new Float64Array(count);
    for (let s = 0; s < structureCount; s += 1) {
      const slots = bySlot.subarray(starts[s] as number, starts[s + 1] as number);
      const networks: Array<{ network: Network }> = Array.from(slots, (slot) => ({ network: networkOfPlan(plan, slot) }));
      const metrics = circuit.measure(networks);
      networks.forEach(({ network }, k) => {
        const slot = slots[k] as number;
        circuitFigures[slot] = metrics[k] as WiringCircuitMetrics;
        const figures = spectra.figuresOf(network);
        levels[slot] = figures.levelDb;
        brightness[slot] = figures.brightnessHz;
      });
      spectra.forgetShapes();
      done += slots.length;
      yield { kind: 'progress', done, total: options.total };
    }
    for (let slot = 0; slot < count; slot += 1) {
      yield {
        kind: 'wiring',
        figures: {
          wiring: wiringOfPlan(plan, slot, ids),
          circuit: circuitFigures[slot] as WiringCircuitMetrics,
          levelDb: circuit.silent ? null : (levels[slot] as number),
          brightnessHz: circuit.silent ? null : (brightness[slot] as number),
        },
      };
    }
  }
}

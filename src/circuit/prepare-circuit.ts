/**
 * Everything about a guitar's circuit that does not depend on the wiring,
 * computed once per frequency grid: each coil's Thevenin equivalent and the
 * load's admittances. `solveTransfers` then costs a few complex operations
 * per network node and frequency.
 *
 * Complex numbers are interleaved in Float64Arrays (re, im, re, im …), float64
 * throughout.
 */
import type { Coil, Guitar } from '../guitar/index.js';
import { type CircuitLoad, type CircuitOverrides, resolveCircuitLoad } from './circuit-load.js';
import { createCoilPhasors, evaluateCoil } from './coil-model.js';

const TWO_PI = 2 * Math.PI;

/** Reusable buffers so a solve allocates nothing. */
export interface Workspace {
  /** Complex buffers of the grid's length, used as a stack. */
  readonly buffers: Float64Array[];
  top: number;
  /** Coil indices in the order the solver meets them. */
  readonly coilStack: Int32Array;
  /** Coil-stack positions where the parts of parallel groups begin. */
  readonly boundaryStack: number[];
  readonly used: Uint8Array;
  /** A one-frequency copy of the circuit for metrics between grid points, made on first use. */
  probe: PreparedCircuit | null;
  /** One-frequency copies kept at fixed frequencies (100 Hz, mains), by frequency. */
  readonly fixedProbes: Map<number, PreparedCircuit>;
  /** Transfer buffers for the probe (2 numbers per coil). */
  probeTransfers: Float64Array[] | null;
}

export interface PreparedCircuit {
  readonly guitar: Guitar;
  readonly load: CircuitLoad;
  readonly frequenciesHz: Float64Array;
  /**
   * Per coil, the factor k taking its EMF to its open-circuit terminal
   * voltage: the EMF drives the series branch Z_s into the shunt Y_p across
   * the terminals, so k = 1/(1 + Z_s·Y_p) (voltage divider; coil model in
   * coil-model.ts, docs/physics.md §1.1 and §1.6).
   */
  readonly coilSource: readonly Float64Array[];
  /** Per coil, the Thevenin impedance Z = Z_s ∥ 1/Y_p = Z_s·k. */
  readonly coilImpedance: readonly Float64Array[];
  /** Admittance from hot to ground: the tone branch, Y = 1/(Rt + 1/(jωCt)) = jωCt/(1 + jωCt·Rt); zero without one. */
  readonly hotAdmittance: Float64Array;
  /** Admittance from hot to out: 1/R_top plus the treble bleed; null when the volume is fully up (wiper at hot). */
  readonly bridgeAdmittance: Float64Array | null;
  /** Admittance from out to ground: 1/R_bottom + 1/R_amp + jω(C_cable + C_amp). */
  readonly outAdmittance: Float64Array;
  readonly workspace: Workspace;
}

/** Fill the per-frequency arrays of `target` for the given frequencies: the coils' Thevenin pairs, then the load. */
function fillGrid(target: PreparedCircuit, frequenciesHz: ArrayLike<number>): void {
  fillCoils(target, frequenciesHz);
  fillLoad(target, frequenciesHz);
}

/*
 * Each loop over the frequencies is a function of its own: V8 compiles a long
 * loop while it runs (on-stack replacement), and code after the loop in the
 * same function left that compiled code bailing out on every later call
 * (seen with node --trace-deopt; src/math/real-fft.ts).
 */

/** The coils' Thevenin pairs at every frequency. */
function fillCoils(target: PreparedCircuit, frequenciesHz: ArrayLike<number>): void {
  const { guitar } = target;
  const phasors = createCoilPhasors();
  for (let f = 0; f < frequenciesHz.length; f += 1) {
    const omega = TWO_PI * (frequenciesHz[f] as number);
    const re = 2 * f;
    const im = re + 1;
    for (let c = 0; c < guitar.coils.length; c += 1) {
      const coil = guitar.coils[c] as Coil;
      // k = 1/(1 + Z_s·Y_p), Z = Z_s·k (coil-model.ts)
      evaluateCoil(coil, omega, phasors);
      const source = target.coilSource[c] as Float64Array;
      source[re] = phasors.sourceRe;
      source[im] = phasors.sourceIm;
      const impedance = target.coilImpedance[c] as Float64Array;
      impedance[re] = phasors.impedanceRe;
      impedance[im] = phasors.impedanceIm;
    }
  }
}

/** Fill the load's per-frequency admittances of `target` (they follow the knobs; the coils' pairs do not). */
function fillLoad(target: PreparedCircuit, frequenciesHz: ArrayLike<number>): void {
  const { load } = target;
  const bleed = load.trebleBleed;
  const tone = load.tone;
  const outConductance = (load.volume.bottomOhms > 0 ? 1 / load.volume.bottomOhms : 0) + 1 / load.ampResistanceOhms;
  const outCapacitance = load.cableCapacitanceF + load.ampCapacitanceF;
  const topConductance = load.volume.topOhms > 0 ? 1 / load.volume.topOhms : 0;
  for (let f = 0; f < frequenciesHz.length; f += 1) {
    const omega = TWO_PI * (frequenciesHz[f] as number);
    const re = 2 * f;
    const im = re + 1;
    if (tone) {
      // jωC/(1 + jωC·R)
      const b = omega * tone.capacitorF;
      const dr = 1;
      const di = b * tone.resistanceOhms;
      const norm = dr * dr + di * di;
      target.hotAdmittance[re] = (b * di) / norm;
      target.hotAdmittance[im] = (b * dr) / norm;
    } else {
      target.hotAdmittance[re] = 0;
      target.hotAdmittance[im] = 0;
    }
    target.outAdmittance[re] = outConductance;
    target.outAdmittance[im] = omega * outCapacitance;
    const bridge = target.bridgeAdmittance;
    if (bridge) {
      let yr = topConductance;
      let yi = 0;
      if (bleed) {
        const b = omega * bleed.capacitorF;
        if (bleed.arrangement === 'series' && bleed.resistorOhms !== undefined) {
          // capacitor and resistor in series: jωC/(1 + jωC·R)
          const di = b * bleed.resistorOhms;
          const norm = 1 + di * di;
          yr += (b * di) / norm;
          yi += b / norm;
        } else {
          yi += b;
          if (bleed.resistorOhms !== undefined) yr += 1 / bleed.resistorOhms;
        }
      }
      bridge[re] = yr;
      bridge[im] = yi;
    }
  }
}

function makeWorkspace(guitar: Guitar): Workspace {
  return {
    buffers: [],
    top: 0,
    coilStack: new Int32Array(guitar.coils.length),
    boundaryStack: [],
    used: new Uint8Array(guitar.coils.length),
    probe: null,
    fixedProbes: new Map(),
    probeTransfers: null,
  };
}

function allocate(guitar: Guitar, load: CircuitLoad, frequenciesHz: Float64Array): PreparedCircuit {
  const length = 2 * frequenciesHz.length;
  return {
    guitar,
    load,
    frequenciesHz,
    coilSource: guitar.coils.map(() => new Float64Array(length)),
    coilImpedance: guitar.coils.map(() => new Float64Array(length)),
    hotAdmittance: new Float64Array(length),
    bridgeAdmittance: load.volume.topOhms > 0 ? new Float64Array(length) : null,
    outAdmittance: new Float64Array(length),
    workspace: makeWorkspace(guitar),
  };
}

/** Index of the first frequency that is not finite and ≥ 0, or −1. */
function firstBadFrequency(frequenciesHz: Float64Array): number {
  for (let f = 0; f < frequenciesHz.length; f += 1) {
    const frequency = frequenciesHz[f] as number;
    if (!Number.isFinite(frequency) || frequency < 0) return f;
  }
  return -1;
}

/**
 * Prepare a guitar's circuit on a frequency grid (Hz, each ≥ 0 and finite),
 * with the what-if overrides applied. Throws InputError for a bad override.
 */
export function prepareCircuit(guitar: Guitar, frequenciesHz: Float64Array, overrides?: CircuitOverrides): PreparedCircuit {
  const bad = firstBadFrequency(frequenciesHz);
  if (bad >= 0) throw new RangeError(`prepareCircuit: frequencies must be finite and ≥ 0, got ${frequenciesHz[bad]}`);
  const load = resolveCircuitLoad(guitar, overrides);
  const prepared = allocate(guitar, load, Float64Array.from(frequenciesHz));
  fillGrid(prepared, prepared.frequenciesHz);
  return prepared;
}

/**
 * `prepared` with other controls, cable or amplifier (`guitar` shares
 * `prepared.guitar`'s coils array and differs elsewhere, e.g. another tone
 * capacitor; `overrides` are new what-ifs): the coils' Thevenin pairs depend
 * on the coils alone, so they are shared, and only the load's admittances
 * are computed again (a few operations per frequency instead of every
 * coil's model). A guitar with another coils array is prepared from scratch.
 */
export function retuneCircuit(prepared: PreparedCircuit, guitar: Guitar, overrides?: CircuitOverrides): PreparedCircuit {
  if (guitar.coils !== prepared.guitar.coils) return prepareCircuit(guitar, prepared.frequenciesHz, overrides);
  const load = resolveCircuitLoad(guitar, overrides);
  const length = 2 * prepared.frequenciesHz.length;
  const retuned: PreparedCircuit = {
    guitar,
    load,
    frequenciesHz: prepared.frequenciesHz,
    coilSource: prepared.coilSource,
    coilImpedance: prepared.coilImpedance,
    hotAdmittance: new Float64Array(length),
    bridgeAdmittance: load.volume.topOhms > 0 ? new Float64Array(length) : null,
    outAdmittance: new Float64Array(length),
    // The solver's scratch buffers are shared (solves run one at a time); probes belong to one load, so they are not.
    workspace: { ...makeWorkspace(guitar), buffers: prepared.workspace.buffers },
  };
  fillLoad(retuned, retuned.frequenciesHz);
  return retuned;
}

/** The one-frequency copy of `prepared`, retuned to `frequencyHz` (for metrics between grid points). */
export function probeAt(prepared: PreparedCircuit, frequencyHz: number): PreparedCircuit {
  const workspace = prepared.workspace;
  if (workspace.probe === null) {
    workspace.probe = allocate(prepared.guitar, prepared.load, new Float64Array(1));
    workspace.probeTransfers = prepared.guitar.coils.map(() => new Float64Array(2));
  }
  const probe = workspace.probe;
  probe.frequenciesHz[0] = frequencyHz;
  fillGrid(probe, probe.frequenciesHz);
  return probe;
}

/**
 * A one-frequency copy of `prepared` that stays at `frequencyHz` (for figures
 * taken at the same frequency for every wiring: 100 Hz, mains). Solve it with
 * `probeTransfers(prepared)` as the output buffers.
 */
export function fixedProbeAt(prepared: PreparedCircuit, frequencyHz: number): PreparedCircuit {
  const workspace = prepared.workspace;
  const known = workspace.fixedProbes.get(frequencyHz);
  if (known !== undefined) return known;
  if (workspace.probeTransfers === null) workspace.probeTransfers = prepared.guitar.coils.map(() => new Float64Array(2));
  const probe = allocate(prepared.guitar, prepared.load, Float64Array.of(frequencyHz));
  fillGrid(probe, probe.frequenciesHz);
  workspace.fixedProbes.set(frequencyHz, probe);
  return probe;
}

/** Transfer buffers belonging to the probe of `prepared` (valid after `probeAt`). */
export function probeTransfers(prepared: PreparedCircuit): Float64Array[] {
  const buffers = prepared.workspace.probeTransfers;
  if (buffers === null) throw new Error('probeTransfers: call probeAt first');
  return buffers;
}

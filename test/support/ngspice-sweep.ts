/**
 * Reading ngspice's answers for the circuit checks: an AC sweep run through
 * the WebAssembly build (eecircuit-engine), and the rows a `.print` writes in
 * plain `ngspice -b` output.
 */
import type { Simulation } from 'eecircuit-engine';

export interface AcSweep {
  /** Sweep frequencies, Hz. */
  readonly frequencies: Float64Array<ArrayBuffer>;
  /** v(out) at each frequency. */
  readonly output: ReadonlyArray<{ readonly real: number; readonly img: number }>;
}

/** Run `netlist` (an AC sweep printing v(out)) and return its frequencies and output. */
export async function runAcSweep(simulation: Simulation, netlist: string): Promise<AcSweep> {
  simulation.setNetList(netlist);
  const result = await simulation.runSim();
  if (result.dataType !== 'complex') throw new Error(`expected an AC result, got ${result.dataType}`);
  const frequency = result.data.find((vector) => vector.name === 'frequency');
  const output = result.data.find((vector) => vector.name === 'v(out)');
  if (!frequency || !output) throw new Error(`no frequency or v(out) in ${result.variableNames.join(', ')}`);
  return { frequencies: Float64Array.from(frequency.values, (value) => value.real), output: output.values };
}

/** The numeric rows of `ngspice -b` output for a four-column print (index, frequency, dB, degrees). */
export function readPrintRows(stdout: string): number[][] {
  return stdout
    .split('\n')
    .map((line) => line.trim().split(/\s+/u).map(Number))
    .filter((cells) => cells.length === 4 && cells.every(Number.isFinite));
}

/** The wiring's output at grid index `k`: the sum of its coils' interleaved complex transfers (what v(out) is with every coil's source at 1 V). */
export function summedTransferAt(transfers: readonly Float64Array[], k: number): { readonly re: number; readonly im: number } {
  let re = 0;
  let im = 0;
  for (const transfer of transfers) {
    re += transfer[2 * k] as number;
    im += transfer[2 * k + 1] as number;
  }
  return { re, im };
}

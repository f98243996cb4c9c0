/**
 * A run of an effects chain's linear stages (gains and biquads, in order)
 * over a signal, in place: the stages run-chain-design.ts computes in our
 * code. Two forms give the same float32 samples: the JavaScript
 * (float32-audio.ts `renderGain`, biquad-filter.ts `renderBiquad`), held bit
 * for bit to node-web-audio-api 1.0.9 by biquad-filter.test.ts, and
 * WebAssembly compiled from wasm/linear-stages.ts, which does the same
 * operations in the same order (linear-stages.test.ts holds the two to each
 * other, and biquad-filter.test.ts holds both to the library).
 *
 * Why WebAssembly: the clean chain's seven biquad sections ran 11 ms a wiring
 * on the render's own thread, most of a process's first wirings in V8's
 * interpreter and first compiled code (DEVELOPERS.md, "Code the interpreter
 * runs").
 *
 * One instance per thread, its memory holding one signal: copied in once for
 * the whole run of stages and out again after it. Where the host cannot
 * compile WebAssembly the JavaScript runs.
 */
import { type KernelHost, type WasmArena, allocate, formPerThread } from '../math/index.js';
import { designNodeBiquad, renderBiquad } from './biquad-filter.js';
import type { BiquadSpec } from './biquad-design.js';
import { renderGain } from './float32-audio.js';
import { LINEAR_STAGES_WASM } from './linear-stages-wasm.js';

/** A stage our code runs: a constant gain, or a biquad section designed as the node designs it. */
export type LinearStage = { readonly kind: 'gain'; readonly gain: number } | { readonly kind: 'biquad'; readonly filter: BiquadSpec };

/** Runs `stages` in order over `signal` (in place) at `sampleRateHz`. */
export type RunLinearStages = (signal: Float32Array, stages: readonly LinearStage[], sampleRateHz: number) => void;

/** Bytes of a float32 sample. */
const F32_BYTES = 4;

function runInJavaScript(signal: Float32Array, stages: readonly LinearStage[], sampleRateHz: number): void {
  for (const stage of stages) {
    if (stage.kind === 'gain') renderGain(signal, stage.gain, signal);
    else renderBiquad(signal, designNodeBiquad(stage.filter, sampleRateHz), signal);
  }
}

interface LinearExports {
  gain(samples: number, count: number, g: number): void;
  biquad(samples: number, count: number, b0: number, b1: number, b2: number, a1: number, a2: number): void;
}

/** The run of linear stages in the form `host` runs (by default WebAssembly where the host compiles it; one instance per thread). */
export const linearStages: (host?: KernelHost) => RunLinearStages = formPerThread(LINEAR_STAGES_WASM, runInJavaScript, webassemblyForm);

function webassemblyForm(arena: WasmArena<LinearExports>): RunLinearStages {
  const { memory, gain, biquad } = arena.exports;
  // Room for `capacity` samples, grown when a longer signal comes (memory is never given back).
  let capacity = 0;
  let at = 0;
  return (signal, stages, sampleRateHz) => {
    if (signal.length > capacity) {
      capacity = signal.length;
      at = allocate(arena, capacity, F32_BYTES);
    }
    new Float32Array(memory.buffer, at, signal.length).set(signal);
    for (const stage of stages) {
      if (stage.kind === 'gain') {
        gain(at, signal.length, Math.fround(stage.gain));
      } else {
        const { b0, b1, b2, a1, a2 } = designNodeBiquad(stage.filter, sampleRateHz);
        biquad(at, signal.length, b0, b1, b2, a1, a2);
      }
    }
    signal.set(new Float32Array(memory.buffer, at, signal.length));
  };
}

/**
 * The chained-render race under load: many short drive-chain renders at once
 * on two worker threads while two more threads burn the CPU (see
 * test/stress/chain-stress.ts). Every render must succeed, and the outputs
 * must be the ones a quiet single-threaded run gives (a lost or mixed-up
 * buffer changes the checksum). CHAIN_STRESS_RENDERS sets the renders per
 * thread (default 40; the longer run in DEVELOPERS.md uses 1,000).
 */
import { describe, expect, it } from 'vitest';
import { runStress } from './stress/chain-stress-worker.js';
import { DEFAULT_STRESS, runChainStress } from './stress/chain-stress.js';

const RENDERS_PER_THREAD = Number(process.env.CHAIN_STRESS_RENDERS ?? 40);
const STRESS_TIMEOUT_MS = 120_000;

describe('chained renders under load', () => {
  it(
    `${2 * RENDERS_PER_THREAD} drive renders on two threads with the CPU loaded: none fails, every output right`,
    async () => {
      const job = {
        kind: 'render' as const,
        renders: RENDERS_PER_THREAD,
        concurrency: DEFAULT_STRESS.concurrency,
        frames: DEFAULT_STRESS.frames,
        sampleRateHz: DEFAULT_STRESS.sampleRateHz,
        mode: 'new' as const,
      };
      const quiet = await runStress({ ...job, concurrency: 1 });
      const loaded = await runChainStress({ rendersPerThread: RENDERS_PER_THREAD });
      console.log(`chain stress: ${loaded.renders} renders, ${loaded.failures} failed, ${loaded.fromEvent} taken from the complete event`);
      expect(quiet.failures).toBe(0);
      expect(loaded.failures).toBe(0);
      expect(loaded.firstFailure).toBeNull();
      expect(loaded.renders).toBe(2 * RENDERS_PER_THREAD);
      // Each thread renders the same takes as the quiet run: two of its checksums, to rounding of the sum's order.
      expect(loaded.checksum).toBeCloseTo(2 * quiet.checksum, 6);
    },
    STRESS_TIMEOUT_MS,
  );
});

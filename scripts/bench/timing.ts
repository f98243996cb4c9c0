/** Timing helpers for `npm run bench`: figures are printed, never asserted. */
import { performance } from 'node:perf_hooks';

/** Median wall time in milliseconds of `repeats` runs of `work`, after one warm-up run. */
export function medianMs(work: () => unknown, repeats = 5): number {
  work();
  const times: number[] = [];
  for (let i = 0; i < repeats; i += 1) {
    const start = performance.now();
    work();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)] ?? 0;
}

/** Same, for asynchronous work. */
export async function medianMsAsync(work: () => Promise<unknown>, repeats = 3): Promise<number> {
  await work();
  const times: number[] = [];
  for (let i = 0; i < repeats; i += 1) {
    const start = performance.now();
    await work();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)] ?? 0;
}

export function line(label: string, value: string): void {
  console.log(`  ${label.padEnd(58)} ${value}`);
}

export function heading(title: string): void {
  console.log(`\n${title}`);
}

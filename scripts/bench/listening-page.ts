/**
 * The listening page (coil signals in the page, every wiring synthesised in
 * the browser): its size for 3, 4 and 5 coils (47, 572, 9,997 wirings), and,
 * measured in chromium from file://:
 * - open to first sound: from the start of navigation to the moment the
 *   wiring Play starts first is rendered and Play is enabled (the page's
 *   `coilbench-first-sound` mark), with the steps before it (data parsed,
 *   engine made) and the list of every wiring built after it;
 * - choose a wiring or move a knob to hearing it: the page's own path to
 *   the new sound (synthesis, chain, loudness for level matching, audio
 *   buffer; `coilbenchPage.prepare`), timed once the page has warmed up in
 *   its idle time after the first sound (the `coilbench-warm` mark), median
 *   and 95th percentile over 30 changes, each to a wiring or knob value not
 *   heard before; the player then starts it SCHEDULE_AHEAD_S (20 ms) ahead
 *   of the audio clock, which is added to the figures. The page's audio
 *   context is made once, at the first Play (timed apart), before these.
 * Every figure is also given in "ref": its time ÷ a reference computation
 * (20 inverse FFTs of 2^17 points) timed in this process just before, so
 * figures from a busy machine can be compared.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SCHEDULE_AHEAD_S } from '../../src/page/player.js';
import { renderPageFor } from '../../src/render/write-listening-page.js';
import { builtInPhrase } from '../../src/string/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { HAVE_CHROMIUM, launchChromium, openFolderPage } from '../../test/support/browser.js';
import { makeExampleReport } from '../../test/support/example-report.js';
import { referenceMs } from './command.js';
import { fiveCoilGuitar, sample } from './guitars.js';
import { heading, line } from './timing.js';

const BYTES_PER_MB = 1e6;
const MS_PER_S = 1000;
const SAMPLE_RATE_HZ = 48000;
/** Changes timed per page and kind. */
const CHOICES = 30;
const P95 = 0.95;
/** A stride through the wirings that visits many shapes (a prime). */
const STRIDE = 7919;

type View = { prepare(expression: string, changes: object): Promise<number> };

function percentile(values: readonly number[], fraction: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(fraction * sorted.length))] ?? Number.NaN;
}

/** Each change: the wiring to render and the knob changes (distinct values, so nothing is already prepared). */
type Change = (index: number, wirings: readonly string[]) => { expression: string; knobs: object };

const CHANGES: ReadonlyArray<readonly [string, Change]> = [
  ['choose a wiring, direct', (index, list) => ({ expression: list[(index * STRIDE) % list.length] as string, knobs: { chain: 'direct' } })],
  ['choose a wiring, drive', (index, list) => ({ expression: list[(index * STRIDE + 1) % list.length] as string, knobs: { chain: 'drive' } })],
  ['choose a wiring, compressed', (index, list) => ({ expression: list[(index * STRIDE + 2) % list.length] as string, knobs: { chain: 'compressed' } })],
  ['move the volume knob, direct', (index, list) => ({ expression: list[0] as string, knobs: { chain: 'direct', volumeSetting: 9.9 - index * 0.2 } })],
  ['move the tone knob, clean', (index, list) => ({ expression: list[0] as string, knobs: { chain: 'clean', toneSetting: 1 + index * 0.25 } })],
  ['change the cable, direct', (index, list) => ({ expression: list[0] as string, knobs: { chain: 'direct', cableCapacitanceF: (300 + 25 * index) * 1e-12 } })],
  ['change the chain, same wiring', (index, list) => ({ expression: list[0] as string, knobs: { chain: ['clean', 'drive', 'compressed'][index % 3], volumeSetting: 10 - index * 0.01 } })],
];

export async function benchListeningPage(): Promise<void> {
  heading('Listening page (strum at 48 kHz; coil signals in the page; timings in chromium from file://)');
  const browser = HAVE_CHROMIUM ? await launchChromium() : null;
  if (!browser) line('chromium', 'missing: page timings skipped');
  const work = mkdtempSync(join(tmpdir(), 'coilbench-bench-page-'));
  const ref = referenceMs();
  line('reference computation in this process ("ref")', `${ref.toFixed(1)} ms`);
  const both = (ms: number): string => `${ms.toFixed(0)} ms (${(ms / ref).toFixed(1)} ref)`;
  try {
    for (const guitar of [sample('three-single-coil.json'), sample('two-humbucker.json'), fiveCoilGuitar()]) {
      const wirings = enumerateWirings(guitar.elements).map((wiring) => wiring.expression);
      const report = makeExampleReport(guitar.elements.map((element) => element.id), guitar.name, 96);
      const started = performance.now();
      const html = renderPageFor(report, { guitar, phrase: builtInPhrase('strum', guitar.strings.length), sampleRateHz: SAMPLE_RATE_HZ, seed: 1, overrides: {}, hum: null });
      const buildMs = performance.now() - started;
      const mb = Buffer.byteLength(html) / BYTES_PER_MB;
      line(`${guitar.coils.length} coils, ${wirings.length} wirings: page ${mb.toFixed(2)} MB (${(mb / guitar.coils.length).toFixed(2)} MB per coil)`, `written in ${buildMs.toFixed(0)} ms`);
      if (!browser) continue;
      const folder = mkdtempSync(join(work, 'page-'));
      writeFileSync(join(folder, 'index.html'), html);
      const { page } = await openFolderPage(browser, folder);
      await page.waitForFunction(() => 'coilbenchPage' in window, undefined, { timeout: 120_000 });
      // The changes are timed once the page has warmed up in its idle time (warm-up.ts), as a listener finds it a moment after the first sound.
      await page.waitForFunction(() => performance.getEntriesByName('coilbench-warm').length > 0, undefined, { timeout: 120_000 });
      const marks = await page.evaluate(() =>
        Object.fromEntries(['coilbench-data', 'coilbench-engine', 'coilbench-first-sound', 'coilbench-list'].map((name) => [name, performance.getEntriesByName(name)[0]?.startTime ?? Number.NaN])),
      );
      line('  open to first sound (navigation start to Play ready)', both(marks['coilbench-first-sound'] ?? Number.NaN));
      line(
        '    data parsed / engine made / first sound / list built at',
        ['coilbench-data', 'coilbench-engine', 'coilbench-first-sound', 'coilbench-list'].map((name) => `${(marks[name] ?? Number.NaN).toFixed(0)}`).join(' / ') + ' ms',
      );
      // The first Play makes the page's AudioContext (once per page; a browser starts audio only after a gesture),
      // timed apart so that the changes below measure the page's own path.
      const firstPlayMs = await page.evaluate(async (expression) => {
        const view = (window as unknown as { coilbenchPage: View }).coilbenchPage;
        const start = performance.now();
        await view.prepare(expression, {});
        return performance.now() - start;
      }, wirings[0] as string);
      line('  first Play of the opening wiring (audio context made, buffer)', both(firstPlayMs));
      for (const [what, change] of CHANGES) {
        const picks = Array.from({ length: CHOICES }, (_, index) => change(index, wirings));
        const result = await page.evaluate(async (list) => {
          const view = (window as unknown as { coilbenchPage: View }).coilbenchPage;
          performance.clearMeasures();
          const times: number[] = [];
          for (const { expression, knobs } of list) {
            const start = performance.now();
            await view.prepare(expression, knobs);
            times.push(performance.now() - start);
          }
          const steps = ['coilbench-synthesize', 'coilbench-chain', 'coilbench-loudness'].map((name) => {
            const durations = performance.getEntriesByName(name).map((entry) => entry.duration).sort((a, b) => a - b);
            return durations[Math.floor(durations.length / 2)] ?? Number.NaN;
          });
          return { times, steps };
        }, picks);
        const heard = result.times.map((ms) => ms + SCHEDULE_AHEAD_S * MS_PER_S);
        line(
          `  ${what}: to hearing it`,
          `median ${both(percentile(heard, 0.5))}, p95 ${both(percentile(heard, P95))}; steps (median) synthesis ${result.steps[0]?.toFixed(0)}, chain ${result.steps[1]?.toFixed(0)}, loudness ${result.steps[2]?.toFixed(0)} ms`,
        );
      }
      await page.close();
    }
  } finally {
    await browser?.close();
    rmSync(work, { recursive: true, force: true });
  }
}

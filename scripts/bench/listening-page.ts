/**
 * The listening page (coil signals in the page, every wiring synthesised in
 * the browser): its size for 3, 4 and 5 coils (47, 572, 9,997 wirings), and,
 * measured in chromium from file://, the time from opening it to the first
 * wiring rendered and ready to sound, and from choosing a wiring or moving a
 * knob to hearing it (render done), median and 95th percentile.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { renderPageFor } from '../../src/render/write-listening-page.js';
import { builtInPhrase } from '../../src/string/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { HAVE_CHROMIUM, launchChromium, openFolderPage } from '../../test/support/browser.js';
import { makeExampleReport } from '../../test/support/example-report.js';
import { fiveCoilGuitar, sample } from './guitars.js';
import { heading, line } from './timing.js';

const BYTES_PER_MB = 1e6;
const SAMPLE_RATE_HZ = 48000;
/** Choices timed per page and chain. */
const CHOICES = 30;
const P95 = 0.95;

function percentile(values: readonly number[], fraction: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(fraction * sorted.length))] ?? Number.NaN;
}

export async function benchListeningPage(): Promise<void> {
  heading('Listening page (strum at 48 kHz; coil signals in the page; timings in chromium from file://)');
  const browser = HAVE_CHROMIUM ? await launchChromium() : null;
  if (!browser) line('chromium', 'missing: page timings skipped');
  const work = mkdtempSync(join(tmpdir(), 'coilbench-bench-page-'));
  try {
    for (const guitar of [sample('three-single-coil.json'), sample('two-humbucker.json'), fiveCoilGuitar()]) {
      const wirings = enumerateWirings(guitar.elements);
      const report = makeExampleReport(guitar.elements.map((element) => element.id), guitar.name, 96);
      const started = performance.now();
      const html = renderPageFor(report, { guitar, phrase: builtInPhrase('strum', guitar.strings.length), sampleRateHz: SAMPLE_RATE_HZ, seed: 1, overrides: {}, hum: null });
      const buildMs = performance.now() - started;
      const mb = Buffer.byteLength(html) / BYTES_PER_MB;
      line(`${guitar.coils.length} coils, ${wirings.length} wirings: page ${mb.toFixed(2)} MB (${(mb / guitar.coils.length).toFixed(2)} MB per coil)`, `written in ${buildMs.toFixed(0)} ms`);
      if (!browser) continue;
      const folder = mkdtempSync(join(work, 'page-'));
      writeFileSync(join(folder, 'index.html'), html);
      const opened = performance.now();
      const { page } = await openFolderPage(browser, folder);
      await page.waitForFunction(() => 'coilbenchPage' in window);
      const first = wirings[0]?.expression ?? '';
      await page.evaluate(async (expression) => {
        await (window as unknown as { coilbenchPage: { render(e: string, c: object): Promise<unknown> } }).coilbenchPage.render(expression, {});
      }, first);
      line('  open to first wiring ready to sound', `${(performance.now() - opened).toFixed(0)} ms`);
      const picks = Array.from({ length: CHOICES }, (_, index) => wirings[(index * 7919) % wirings.length]?.expression ?? first);
      for (const [what, changes] of [
        ['choose a wiring, direct', (index: number) => ({ chain: 'direct', volumeSetting: 10 - (index % 1) })],
        ['choose a wiring, drive', () => ({ chain: 'drive' })],
        ['move the tone knob, clean', (index: number) => ({ chain: 'clean', toneSetting: 1 + (index % 9) })],
      ] as const) {
        const times = await page.evaluate(
          async ({ list, knobs, sameWiring }) => {
            const view = (window as unknown as { coilbenchPage: { render(e: string, c: object): Promise<unknown> } }).coilbenchPage;
            const result: number[] = [];
            for (const [index, expression] of list.entries()) {
              const start = performance.now();
              await view.render(sameWiring ? (list[0] as string) : expression, knobs[index] as object);
              result.push(performance.now() - start);
            }
            return result;
          },
          { list: picks, knobs: picks.map((_, index) => changes(index)), sameWiring: what.startsWith('move') },
        );
        line(`  ${what}: render to ready`, `median ${percentile(times, 0.5).toFixed(0)} ms, p95 ${percentile(times, P95).toFixed(0)} ms`);
      }
      await page.close();
    }
  } finally {
    await browser?.close();
    rmSync(work, { recursive: true, force: true });
  }
}

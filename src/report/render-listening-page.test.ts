import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { makeExampleReport } from '../../test/support/example-report.js';
import { parseGuitar } from '../guitar/index.js';
import { type PageData, type PageWiringFigures, decodeSignal, decodeWiringFigures, encodeSignal } from '../page/index.js';
import { renderListeningPage } from './render-listening-page.js';

const HOSTILE_NAME = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';
const SCRIPT = "console.log('page script');";

function scriptsOf(html: string): string[] {
  return [...html.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/gu)].map((match) => match[1] ?? '');
}

describe('renderListeningPage', () => {
  const raw = JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8')) as Record<string, unknown>;
  const guitar = parseGuitar({ ...raw, name: HOSTILE_NAME });
  const report = makeExampleReport(guitar.elements.map((element) => element.id), HOSTILE_NAME);
  const signal = Float32Array.from([0.5, -0.25, 1e-9, 3.4e38, -0]);
  const data: Omit<PageData, 'report' | 'opening'> = {
    guitar,
    overrides: {},
    hum: null,
    coils: { sampleRateHz: 48000, length: 5, delay: 0, fftSize: 8, signals: guitar.coils.map(() => encodeSignal(signal)) },
  };
  const html = renderListeningPage(report, data, SCRIPT);

  it('carries the coil signals bit for bit, and the guitar', () => {
    const json = /<script type="application\/json" id="page-data">([\s\S]*?)<\/script>/u.exec(html)?.[1] ?? '';
    const carried = JSON.parse(json) as PageData;
    expect(carried.coils.signals.map((text) => Array.from(decodeSignal(text)))).toEqual(guitar.coils.map(() => Array.from(signal)));
    expect(carried.guitar.name).toBe(HOSTILE_NAME);
    // The wirings' figures come after the page's script, so the first wiring can sound before they are read.
    const wirings = JSON.parse(/<script type="application\/json" id="page-wirings">([\s\S]*?)<\/script>/u.exec(html)?.[1] ?? '{}') as PageWiringFigures;
    expect(decodeWiringFigures(wirings).map((wiring) => wiring.id)).toEqual(report.wirings.map((wiring) => wiring.id));
    expect(carried.report.groups).toBeUndefined();
    expect(carried.report.wirings.length).toBe(0);
    expect(carried.opening).toEqual({ expression: report.wirings[0]?.expression, number: report.wirings[0]?.number });
    expect(html.indexOf('id="page-wirings"')).toBeGreaterThan(html.indexOf(SCRIPT));
  });

  it('shows every string from the guitar file as text, and runs only its own script, pinned by hash', () => {
    expect(html).not.toContain('<img');
    expect(html.match(/<script\b/gu)?.length).toBe(3); // the data, the script, the wirings' figures
    const policy = (/http-equiv="Content-Security-Policy" content="([^"]*)"/u.exec(html)?.[1] ?? '').replaceAll('&#39;', "'").replaceAll('&#x27;', "'");
    const hash = createHash('sha256').update(SCRIPT, 'utf8').digest('base64');
    expect(policy).toContain(`'sha256-${hash}'`);
    expect(policy).toContain("connect-src 'none'");
    // WebAssembly (the FFT kernels) may compile; JavaScript text may not be evaluated (W3C CSP Level 3).
    expect(policy).toContain("'wasm-unsafe-eval'");
    expect(policy).not.toContain("'unsafe-eval'");
    expect(scriptsOf(html)[1]).toBe(SCRIPT);
  });

  it('speaks our own words: blind test, peaks and a glossary with the guitar\'s coil names', () => {
    for (const old of ['Play A', 'Play B', 'Play X', 'X is A', 'X is B', 'warm', 'piercing', 'brittle', 'Lemme', 'written a + b', '~a:']) expect(html).not.toContain(old);
    expect(html).toContain('written neck + bridge');
    expect(html).toContain('written neck // bridge');
    expect(html).toContain('written ~bridge');
    expect(html).toContain('Hear the mystery');
  });

  it('loops a short phrase by default', () => {
    expect(html).toMatch(/id="loop-on" data-action="loop" checked/u);
  });
});

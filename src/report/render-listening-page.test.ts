import { createHash } from 'node:crypto';
import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { makeExampleReport as makeReport } from '../../test/support/example-report.js';
import type { ListeningReport, ReportWiring } from './listening-report.js';
import { pageAudioPath, renderPageAudioScript } from './page-audio-file.js';
import { renderListeningPage } from './render-listening-page.js';

const HOSTILE_NAME = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';

function scriptsOf(html: string): string[] {
  return [...html.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/gu)].map((match) => match[1] ?? '');
}

describe('renderListeningPage', () => {
  const report = makeReport(['neck', 'mid', 'bridge']);
  const html = renderListeningPage(report);

  it('has one row per wiring with the stable hooks', () => {
    expect(html.match(/<tr data-wiring="w\d+">/gu)?.length).toBe(47);
    expect(html.match(/<button type="button" class="play" data-action="play"/gu)?.length).toBe(47);
    for (const action of ['abx-start', 'abx-play-a', 'abx-play-b', 'abx-play-x', 'abx-answer-a', 'abx-answer-b', 'abx-end']) {
      expect(html).toContain(`data-action="${action}"`);
    }
  });

  it('carries the report as JSON that parses back to the same data, response curves to 0.01 dB', () => {
    const json = /<script type="application\/json" id="report-data">([\s\S]*?)<\/script>/u.exec(html)?.[1] ?? '';
    const carried = JSON.parse(json) as ListeningReport;
    expect({ ...carried, wirings: carried.wirings.map((wiring) => ({ ...wiring, responseDb: [] })) }).toEqual({
      ...report,
      wirings: report.wirings.map((wiring) => ({ ...wiring, responseDb: [] })),
    });
    carried.wirings.forEach((wiring, index) => {
      const original = report.wirings[index]?.responseDb ?? [];
      expect(wiring.responseDb.length).toBe(original.length);
      wiring.responseDb.forEach((db, point) => expect(Math.abs(db - (original[point] ?? NaN))).toBeLessThanOrEqual(0.005 + 1e-12));
    });
  });

  it('pins its inline script and style by hash in the Content-Security-Policy', () => {
    const policy = /http-equiv="Content-Security-Policy" content="([^"]*)"/u.exec(html)?.[1]?.replaceAll('&#39;', "'") ?? '';
    const script = scriptsOf(html).at(-1) ?? '';
    const style = /<style>([\s\S]*?)<\/style>/u.exec(html)?.[1] ?? '';
    expect(policy).toContain(`'sha256-${createHash('sha256').update(script).digest('base64')}'`);
    expect(policy).toContain(`style-src 'sha256-${createHash('sha256').update(style).digest('base64')}'`);
    expect(policy).toContain("connect-src 'none'");
    expect(policy).toContain("default-src 'none'");
  });

  it('links and loads nothing outside its folder', () => {
    const references = [...html.matchAll(/\b(?:src|href)="([^"]*)"/gu)].map((match) => match[1] ?? '');
    expect(references.length).toBeGreaterThan(47);
    for (const reference of references) {
      if (reference === 'data:,' || reference.startsWith('#')) continue;
      expect(reference, reference).toMatch(/^wav\/[^/]+\.wav$/u);
    }
  });

  it('parses as script: the inline program compiles', () => {
    const script = scriptsOf(html).at(-1) ?? '';
    expect(() => new Function(script)).not.toThrow();
    expect(script).not.toMatch(/<\/script|<!--/iu);
  });

  it('carries the cautions and the glossary', () => {
    for (const words of ['judge on the real instrument', 'iron in its stand', 'wash your hands', 'Never open an amplifier', 'lethal charge', 'low volume', 'meter']) {
      expect(html).toContain(words);
    }
    for (const term of ['Series', 'Parallel', 'In phase', 'Out of phase', 'Hum cancelling', 'Resonant peak']) expect(html).toContain(`<dt>${term}</dt>`);
  });
});

describe('renderListeningPage with hostile text', () => {
  const report = makeReport(['neck', 'mid"><b>x</b>'], HOSTILE_NAME);
  const html = renderListeningPage(report);

  it('shows every string from the guitar file as text', () => {
    expect(html).not.toContain('<img');
    expect(html).not.toContain('<b>x</b>');
    expect(html).toContain('&lt;script&gt;window.__pwned = 1&lt;/script&gt;&quot;&gt;&lt;img src=x onerror=&quot;window.__pwned = 2&quot;&gt;');
    // Only the page's own two script elements exist.
    expect(html.match(/<script\b/gu)?.length).toBe(2);
    expect(html.match(/<\/script>/gu)?.length).toBe(2);
  });

  it('refuses to link audio outside the folder', () => {
    const outside = makeReport(['neck']);
    const wiring = outside.wirings[0] as ReportWiring;
    const hostile = { ...outside, wirings: [{ ...wiring, wav: 'javascript:alert(1)' }] };
    const page = renderListeningPage(hostile);
    expect(page).not.toContain('href="javascript:');
    expect(page).toMatch(/data-action="play" disabled/u);
  });
});

describe('page audio scripts', () => {
  it('hand the WAV bytes to the page unchanged', () => {
    const bytes = new Uint8Array([82, 73, 70, 70, 0, 255, 128, 7, 60, 47]);
    const calls: [string, string][] = [];
    runInNewContext(renderPageAudioScript('w12', bytes), { coilbenchAudio: (id: string, base64: string) => calls.push([id, base64]) });
    expect(calls.length).toBe(1);
    expect(calls[0]?.[0]).toBe('w12');
    expect([...Buffer.from(calls[0]?.[1] ?? '', 'base64')]).toEqual([...bytes]);
    expect(pageAudioPath('wav/w12-neck.wav')).toBe('wav/w12-neck.wav.js');
  });
});

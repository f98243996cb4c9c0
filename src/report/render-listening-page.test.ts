import { createHash } from 'node:crypto';
import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { enumerateWirings } from '../wiring/index.js';
import type { ListeningReport, ReportWiring } from './listening-report.js';
import { pageAudioPath, renderPageAudioScript } from './page-audio-file.js';
import { renderListeningPage } from './render-listening-page.js';

const HOSTILE_NAME = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';

function makeReport(ids: readonly string[], name = 'Page test guitar (invented values)'): ListeningReport {
  const frequencies = [20, 100, 1000, 5000, 20000];
  const wirings: ReportWiring[] = enumerateWirings(ids.map((id) => ({ id }))).map((wiring) => ({
    id: wiring.id,
    number: wiring.number,
    expression: wiring.expression,
    description: wiring.description,
    coils: wiring.elementIds,
    topology: wiring.topology,
    outOfPhase: wiring.outOfPhase,
    wav: `wav/${wiring.id}.wav`,
    levelDb: -wiring.number / 10,
    loudnessLufs: -20 - wiring.number / 10,
    centroidHz: 500 + wiring.number * 37,
    resonanceHz: 2000 + wiring.number * 50,
    peakDb: 3,
    resonanceQ: 1.5,
    humDb: wiring.outOfPhase.length > 0 ? -30 : 0,
    humCancelling: wiring.outOfPhase.length > 0,
    responseDb: [0, 0, 1, 3, -20],
    group: null,
  }));
  return {
    generator: 'coilbench test',
    guitar: {
      name,
      slug: 'page-test',
      notes: `notes ${name}`,
      scaleM: 0.648,
      tuning: ['E2', 'A2', 'D3', 'G3', 'B3', 'E4'],
      coils: ids.map((id) => ({ id, pickup: null, position: '100 mm', resistanceOhms: 6000, inductanceH: 2.5, capacitanceF: 1e-10, winding: 'cw', magnet: 'north' })),
      controls: [`volume ${name}`],
      cableCapacitanceF: 5e-10,
      ampResistanceOhms: 1e6,
      ampCapacitanceF: 5e-11,
    },
    render: { phrase: 'strum', chain: 'direct', sampleRateHz: 48000, durationS: 6, level: 'true', commonGainDb: 0, mainsHz: 60, humMixHz: null, format: 'pcm24' },
    responseFrequenciesHz: frequencies,
    wirings,
  };
}

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

  it('carries the report as JSON that parses back to the same data', () => {
    const json = /<script type="application\/json" id="report-data">([\s\S]*?)<\/script>/u.exec(html)?.[1] ?? '';
    expect(JSON.parse(json)).toEqual(report);
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

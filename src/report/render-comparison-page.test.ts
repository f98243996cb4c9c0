import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseGuitar } from '../guitar/index.js';
import { type ComparisonPageData, type PageSound, decodeSignal, encodeSignal } from '../page/index.js';
import type { ComparisonEntry, ComparisonReport, ComparisonRow } from './comparison-report.js';
import { renderComparisonPage } from './render-comparison-page.js';

const HOSTILE = '<script>window.__pwned = 1</script>"><img src=x onerror="window.__pwned = 2">';

function makeReport(candidateName: string): ComparisonReport {
  const render = { phrase: 'strum', chain: 'clean', sampleRateHz: 48000, durationS: 2.6, level: 'true' as const, commonGainDb: 6, mainsHz: 60, humMixHz: null, format: 'pcm24' as const };
  const sets = [
    { label: 'A', name: 'Baseline (invented)', folder: 'a', render },
    { label: 'B', name: candidateName, folder: 'b', render: { ...render, commonGainDb: 4 } },
  ];
  const expressions = ['neck', 'bridge', 'neck + ~bridge'];
  const entries: ComparisonEntry[] = sets.flatMap((set, index) =>
    expressions.map((expression, w) => ({
      id: `${set.label}:w${w + 1}`, set: index, wiringId: `w${w + 1}`, expression, wav: `${set.folder}/wav/w${w + 1}.wav`,
      levelDb: index, loudnessLufs: -20 + w, brightnessHz: 500 + 100 * w, resonanceHz: 3000 - 200 * index, humDb: 0, humCancelling: false,
    })),
  );
  const rows: ComparisonRow[] = expressions.map((expression, w) => ({
    key: `w${w + 1}`, number: w + 1, expression, description: `${expression} words`, entries: [`A:w${w + 1}`, `B:w${w + 1}`],
    differences: [{ set: 1, distance: 3 - w, audible: 3 - w >= 1, levelDb: 1, spectrumDb: 0.5 * w, brightnessPercent: -2, resonancePercent: -6.7, humDb: 0 }],
  }));
  return { generator: 'coilbench test', baseline: 'Baseline (invented)', thresholds: { levelDb: 1, spectrumDb: 1, brightnessPercent: 3 }, sets, entries, rows };
}

const scriptsOf = (html: string): string[] => [...html.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/gu)].map((match) => match[1] ?? '');

const SCRIPT = "console.log('comparison script');";

describe('renderComparisonPage', () => {
  const report = makeReport(HOSTILE);
  const raw = JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8')) as Record<string, unknown>;
  const signal = Float32Array.from([0.5, -0.25, 1e-9, 3.4e38, -0]);
  const sounds: PageSound[] = ['Baseline (invented)', HOSTILE].map((name) => {
    const guitar = parseGuitar({ ...raw, name });
    return { guitar, overrides: {}, hum: null, chain: 'clean', coils: { sampleRateHz: 48000, length: 5, delay: 0, fftSize: 8, signals: guitar.coils.map(() => encodeSignal(signal)) } };
  });
  const html = renderComparisonPage(report, sounds, SCRIPT);

  it('has one row per wiring with a play button per set and the blind-test hooks', () => {
    expect(html.match(/<tr data-row="w\d+">/gu)?.length).toBe(3);
    expect(html.match(/<button type="button" data-action="play-set"/gu)?.length).toBe(6);
    for (const action of ['blind-start', 'blind-hear-first', 'blind-hear-second', 'blind-hear-mystery', 'blind-is-first', 'blind-is-second', 'blind-finish', 'blind-row']) {
      expect(html).toContain(`data-action="${action}"`);
    }
    expect(html).toContain('<option value="B:w3">B · w3 neck + ~bridge</option>');
  });

  it('carries the report and every set\'s coil signals bit for bit as JSON', () => {
    const json = /<script type="application\/json" id="comparison-data">([\s\S]*?)<\/script>/u.exec(html)?.[1] ?? '';
    const data = JSON.parse(json) as ComparisonPageData;
    expect(data.report).toEqual(report);
    expect(data.sets.map((set) => set.guitar.name)).toEqual(['Baseline (invented)', HOSTILE]);
    for (const set of data.sets) for (const coil of set.coils.signals) expect([...decodeSignal(coil)]).toEqual([...signal]);
  });

  it('pins its script and style by hash and allows no connections', () => {
    const policy = /http-equiv="Content-Security-Policy" content="([^"]*)"/u.exec(html)?.[1]?.replaceAll('&#39;', "'") ?? '';
    const script = scriptsOf(html).at(-1) ?? '';
    const style = /<style>([\s\S]*?)<\/style>/u.exec(html)?.[1] ?? '';
    expect(policy).toContain(`'sha256-${createHash('sha256').update(script).digest('base64')}'`);
    expect(policy).toContain(`style-src 'sha256-${createHash('sha256').update(style).digest('base64')}'`);
    expect(policy).toContain("connect-src 'none'");
    expect(() => new Function(script)).not.toThrow();
  });

  it('shows hostile names as text and links only inside its folder', () => {
    expect(html).not.toContain('<img');
    expect(html).toContain('&lt;script&gt;window.__pwned = 1&lt;/script&gt;');
    expect(html.match(/<script\b/gu)?.length).toBe(2);
    const references = [...html.matchAll(/\b(?:src|href)="([^"]*)"/gu)].map((match) => match[1] ?? '');
    for (const reference of references) if (reference !== 'data:,' && !reference.startsWith('#')) expect(reference).toMatch(/^[ab]\/index\.html$/u);
  });

  it('carries the cautions and says renders are models', () => {
    for (const words of ['Never open an amplifier', 'wash your hands', 'low volume', 'try a candidate set by ear']) expect(html).toContain(words);
  });
});

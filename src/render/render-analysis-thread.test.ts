import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureFiguresByClass, measureSpectralBasis } from '../analysis/index.js';
import { prepareReferenceFigures, referenceCoilsOf } from './measure-wiring-audio.js';
import { parseGuitarText } from '../guitar/index.js';
import { enumerateWirings } from '../wiring/index.js';
import { prepareRenderAnalysis } from './render-analysis-thread.js';
import type { RenderAnalysisJob } from './render-analysis.js';
import { builtInPhrase } from '../string/index.js';
import { makeExampleReport } from '../../test/support/example-report.js';
import { type PageSettings, renderPageBytes } from './write-listening-page.js';

const guitar = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'humbucker-two-single-coil.json'), 'utf8'));
const wirings = enumerateWirings(guitar.elements).slice(0, 60);
const job: RenderAnalysisJob = {
  guitar,
  overrides: { volumeSetting: 8, cableCapacitanceF: 700e-12 },
  selected: wirings.slice(10, 30).map((wiring) => wiring.network),
  scope: wirings.map((wiring) => ({ network: wiring.network, number: wiring.number })),
};

describe('prepareRenderAnalysis', () => {
  it('gives the same analysis and audio figures on a worker thread as in this thread, to the last bit', async () => {
    const basis = measureSpectralBasis(guitar);
    const here = prepareRenderAnalysis(job, false);
    const there = prepareRenderAnalysis(job, true);
    const figuresOf = wirings.slice(0, 12).map((wiring) => wiring.network);
    // The thread measures from the coil signals it is given (as a render gives them), this one from the basis's coil spectra.
    there.start(basis, figuresOf, referenceCoilsOf(guitar, basis));
    here.start(basis, figuresOf);
    const [own, threaded] = await Promise.all([here.result(), there.result()]);
    // The audio figures are those the render's own first pass measures from the strings rendered afresh.
    expect(own.figures).toEqual(measureFiguresByClass(guitar, prepareReferenceFigures(guitar, job.overrides), figuresOf));
    expect(threaded.figures).toEqual(own.figures);
    expect(threaded.distinct.spectra.basis).toBe(basis);
    expect(threaded.circuit).toEqual(own.circuit);
    expect(threaded.drive).toEqual(own.drive);
    expect(threaded.distinct.groups).toEqual(own.distinct.groups);
    expect(threaded.distinct.thresholds).toEqual(own.distinct.thresholds);
    expect(threaded.distinct.spectra.count).toBe(own.distinct.spectra.count);
    // Only the groups come back: the per-wiring spectra and profiles stay in the thread (DistinctGroups).
    expect(Object.keys(threaded.distinct).sort()).toEqual(['groups', 'spectra', 'thresholds']);
    expect(Object.keys(threaded.distinct.spectra).sort()).toEqual(['basis', 'count']);
    expect(threaded.responsesDb).toEqual(own.responsesDb);
    expect(own.responsesDb).toHaveLength(20);
    expect(own.circuit.wirings).toHaveLength(20);
    expect(own.distinct.groups.groupOf).toHaveLength(60);
  });

  it("makes the listening page's bytes on the thread after its analysis, the same bytes as this thread makes", async () => {
    const basis = measureSpectralBasis(guitar);
    const there = prepareRenderAnalysis(job, true);
    there.start(basis);
    const { drive } = await there.result();
    const report = makeExampleReport(guitar.elements.map((element) => element.id), guitar.name);
    const settings: PageSettings = { guitar, phrase: builtInPhrase('strum', guitar.strings.length), sampleRateHz: 22050, seed: 1, overrides: job.overrides, hum: null, tailS: 0.3, drive };
    const threaded = await there.renderPage(report, settings);
    expect(threaded).toBeInstanceOf(Uint8Array);
    expect(Buffer.from(threaded).equals(Buffer.from(renderPageBytes(report, settings)))).toBe(true);
    expect(new TextDecoder().decode(threaded)).toMatch(/^<!DOCTYPE html>/iu);
    await there.cancel();
  });

  it('passes a bad threshold back as the input error it is', async () => {
    const bad = prepareRenderAnalysis({ ...job, thresholds: { levelDb: -1 } }, true);
    bad.start(measureSpectralBasis(guitar));
    await expect(bad.result()).rejects.toMatchObject({ name: 'InputError' });
  });

  it('stops its thread when cancelled before it was started', async () => {
    const pending = prepareRenderAnalysis(job, true);
    await pending.cancel();
    await expect(pending.result()).rejects.toThrow(/stopped/);
  });
});

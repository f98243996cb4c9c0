/**
 * `analyze`'s groups, `shortlist` and `compare` through the command line:
 * documents, constraints, messages and exit codes. The numbers behind them
 * are checked in src/analysis (against exact per-bin sums, brute force and
 * hand-worked values); here the commands must carry them faithfully.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { testFolder } from './support/temporary-folder.js';
import { captureIo, main } from '../src/cli/index.js';
import { maxOf, minOf } from '../src/math/index.js';

const samples = join(import.meta.dirname, '..', 'samples');

async function run(...argv: string[]) {
  const io = captureIo(samples);
  const status = await main(argv, io);
  return { status, out: io.out(), err: io.err() };
}

interface GroupsRecord {
  summary: string;
  count: number;
  thresholds: { levelDb: number; spectrumDb: number; brightnessPercent: number };
  groups: Array<{ group: number; members: string[]; expressions: string[]; largestDistance: number | null }>;
  closestPairs: Array<{ wirings: string[]; distance: number }>;
}

describe('coilbench analyze: groups of alike wirings', () => {
  it('adds a group to every wiring and a groups summary that lists every wiring once', async () => {
    const { status, out } = await run('analyze', 'humbucker-two-single-coil.json', '--json');
    expect(status).toBe(0);
    const document = JSON.parse(out) as { wirings: Array<{ id: string; group: number }>; groups: GroupsRecord };
    const { groups } = document;
    expect(groups.summary).toBe(`572 wirings, ${groups.count} audibly distinct groups at these thresholds`);
    expect(groups.count).toBe(groups.groups.length);
    expect(groups.count).toBeLessThan(572); // equal neck and mid coils make some wirings alike
    expect(groups.thresholds).toEqual({ levelDb: 1, spectrumDb: 1, brightnessPercent: 3 });
    const listed = groups.groups.flatMap((group) => group.members);
    expect(listed.sort()).toEqual(document.wirings.map((wiring) => wiring.id).sort());
    const groupOf = new Map(document.wirings.map((wiring) => [wiring.id, wiring.group]));
    for (const group of groups.groups) for (const member of group.members) expect(groupOf.get(member)).toBe(group.group);
    expect(groups.closestPairs[0]?.distance).toBeLessThan(1);
  });

  it('prints the summary under the table and in Markdown, and --sort group orders by group', async () => {
    const table = await run('analyze', 'three-single-coil.json');
    expect(table.out).toMatch(/^47 wirings, \d+ audibly distinct groups? at these thresholds \(level 1 dB, spectrum 1 dB, brightness 3 %; strum, direct\):$/mu);
    expect(table.out).toMatch(/^ {2}group 1: w1 neck$/mu);
    expect(table.out).toMatch(/^Closest pairs: w\d+ /mu);
    const markdown = await run('analyze', 'three-single-coil.json', '--markdown');
    expect(markdown.out).toMatch(/^### 47 wirings, \d+ audibly distinct groups?/mu);
    expect(markdown.out).toMatch(/^- group 1: w1 neck$/mu);
    const sorted = JSON.parse((await run('analyze', 'humbucker-two-single-coil.json', '--json', '--sort', 'group')).out) as { wirings: Array<{ group: number }> };
    const order = sorted.wirings.map((wiring) => wiring.group);
    expect(order).toEqual([...order].sort((a, b) => a - b));
  });

  it('wider thresholds make fewer groups; bad thresholds are refused, one line each', async () => {
    const count = async (...extra: string[]): Promise<number> =>
      (JSON.parse((await run('analyze', 'three-single-coil.json', '--json', ...extra)).out) as { groups: GroupsRecord }).groups.count;
    const strict = await count();
    const wide = await count('--level-threshold', '3dB', '--spectrum-threshold', '3', '--brightness-threshold', '10%');
    expect(wide).toBeLessThan(strict);
    const { status, out, err } = await run('analyze', 'three-single-coil.json', '--level-threshold', '0', '--spectrum-threshold', 'loud', '--brightness-threshold', '300%');
    expect(status).toBe(2);
    expect(out).toBe('');
    expect(err.trimEnd().split('\n')).toEqual([
      'coilbench: --level-threshold: expected a level difference above 0 and at most 20 dB, like 1 or 0.5dB, got "0"',
      'coilbench: --spectrum-threshold: expected a spectral distance above 0 and at most 20 dB, like 1 or 2dB, got "loud"',
      'coilbench: --brightness-threshold: expected a percentage above 0 and at most 100, like 3 or 5%, got "300%"',
    ]);
  });
});

describe('render and demo: the groups in the folder', () => {
  it('report.json carries every rendered wiring\'s group and the groups; report.md and the page name them', async () => {
    const folder = testFolder('groups');
    try {
      const { status, err } = await run('render', 'three-single-coil.json', '-o', folder, '--chain', 'direct', '--only', 'w11', '--only', 'w45', '--only', 'w5');
      expect(status, err).toBe(0);
      expect(err).toMatch(/47 wirings, \d+ audibly distinct groups at these thresholds/u);
      const report = JSON.parse(readFileSync(join(folder, 'report.json'), 'utf8')) as {
        wirings: Array<{ id: string; group: number }>;
        groups: { summary: string; groups: Array<{ group: number; members: string[] }> };
      };
      const groupOf = new Map(report.wirings.map((wiring) => [wiring.id, wiring.group]));
      const analyzed = JSON.parse((await run('analyze', 'three-single-coil.json', '--json', '--no-audio')).out) as { wirings: Array<{ id: string; group: number }>; groups: { summary: string } };
      for (const wiring of analyzed.wirings) if (groupOf.has(wiring.id)) expect(groupOf.get(wiring.id)).toBe(wiring.group);
      expect(report.groups.summary).toBe(analyzed.groups.summary);
      expect(report.groups.groups.flatMap((group) => group.members)).toHaveLength(47);
      expect(readFileSync(join(folder, 'report.md'), 'utf8')).toMatch(/^### 47 wirings, \d+ audibly distinct groups?/mu);
      expect(readFileSync(join(folder, 'index.html'), 'utf8')).toContain('Which wirings sound alike');
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
});

interface ShortlistDocument {
  count: number;
  method: string;
  candidates: number;
  minDistance: number | null;
  closestPair: string[] | null;
  constraints: { humCancelling: boolean; levelWindowDb: number | null; include: string[]; coils: string[] | null };
  wirings: Array<{ id: string; expression: string; coils: string[]; levelDb: number; humCancelling: boolean; group: number }>;
  distances: number[][];
}

describe('coilbench shortlist', () => {
  const shortlist = async (...argv: string[]): Promise<ShortlistDocument> => {
    const { status, out, err } = await run('shortlist', ...argv, '--json');
    expect(status, err).toBe(0);
    return JSON.parse(out) as ShortlistDocument;
  };

  it('respects every constraint at once and reports the smallest distance of the set', async () => {
    // In a uniform hum field (--hum-gradient 0) neck + mid cancels hum; in the default gradient it only reduces it (docs/physics.md §6.1).
    const document = await shortlist('humbucker-two-single-coil.json', '--count', '4', '--hum-cancelling', '--hum-gradient', '0', '--level-window', '4', '--include', 'neck + mid', '--coils', 'neck,mid,bridge_screw,bridge_slug');
    expect(document.wirings).toHaveLength(4);
    expect(document.wirings.map((wiring) => wiring.expression)).toContain('neck + mid');
    for (const wiring of document.wirings) expect(wiring.humCancelling).toBe(true);
    const levels = document.wirings.map((wiring) => wiring.levelDb);
    expect(maxOf(levels) - minOf(levels)).toBeLessThanOrEqual(4);
    const smallest = minOf(document.distances.flatMap((row, i) => row.filter((_, j) => j !== i)));
    expect(document.minDistance).toBeCloseTo(smallest, 12);
    expect(document.constraints).toEqual({ humCancelling: true, levelWindowDb: 4, include: ['w5'], coils: ['neck', 'mid', 'bridge_screw', 'bridge_slug'] });
  });

  it('--coils keeps to the coils named', async () => {
    const document = await shortlist('humbucker-two-single-coil.json', '--count', '3', '--coils', 'bridge_screw, bridge_slug');
    for (const wiring of document.wirings) for (const coil of wiring.coils) expect(['bridge_screw', 'bridge_slug']).toContain(coil);
    expect(document.candidates).toBe(6);
  });

  it('prints each chosen wiring with its expression, words and figures, and the differences between them', async () => {
    const { status, out } = await run('shortlist', 'three-single-coil.json', '--count', '3', '--include', 'w1');
    expect(status).toBe(0);
    expect(out).toMatch(/smallest difference in the set: \d+\.\d\d× the just-noticeable difference \(w\d+ and w\d+\); exact search/u);
    expect(out).toMatch(/^\s*w1 {2}neck\s+[+-]\d+\.\d\s+\d+\s+\d+\s+[+-]\d+\s+noisy\s+\d+\s+neck alone$/mu); // hum in whole dB, as analyze prints it
    expect(out).toContain('Differences between them');
    expect(out).toContain('--build-sheet');
  });

  it('without --count chooses five, as for a five-position lever switch, and says so; never more than the guitar has', async () => {
    const three = await run('shortlist', 'three-single-coil.json');
    expect(three.status).toBe(0);
    expect(three.out).toContain('5 of 47 wirings, as different from each other as possible (--count not given: up to 5, as for a five-position lever switch)');
    const solo = JSON.parse((await run('shortlist', 'two-humbucker.json', '--coils', 'neck_screw', '--json')).out) as { count: number };
    expect(solo.count).toBe(1); // only neck_screw alone qualifies: the default is a ceiling, not a demand
  });

  it('--render renders just the chosen wirings into their own folder, with --json naming it', async () => {
    const folder = testFolder('shortlist');
    try {
      const { status, out, err } = await run('shortlist', 'three-single-coil.json', '--count', '3', '--hum-cancelling', '--render', '-o', folder, '--chain', 'direct', '--json');
      expect(status, err).toBe(0);
      const document = JSON.parse(out) as ShortlistDocument & { render: { folder: string; page: string } };
      expect(document.render.folder).toBe(folder);
      const report = JSON.parse(readFileSync(join(folder, 'report.json'), 'utf8')) as { wirings: Array<{ id: string; wav: string }>; render: { chain: string } };
      expect(report.wirings.map((wiring) => wiring.id)).toEqual(document.wirings.map((wiring) => wiring.id));
      expect(report.render.chain).toBe('direct');
      for (const wiring of report.wirings) expect(readFileSync(join(folder, wiring.wav)).subarray(0, 4).toString()).toBe('RIFF');
      const refused = await run('shortlist', 'three-single-coil.json', '--count', '3', '--output', folder);
      expect(refused.status).toBe(2);
      expect(refused.err).toContain('--output: expected --output only with --render');
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it('says which constraint to relax, naming the option, exit 2', async () => {
    const cases: Array<[string[], RegExp]> = [
      [['--count', '12', '--hum-cancelling', '--coils', 'neck,mid'], /^coilbench: --count: expected at most \d+: only \d+ wirings are hum cancelling and use only neck, mid; relax the hum-cancelling constraint or the coils allowed, or ask for fewer, got 12$/mu],
      [['--count', '3', '--hum-cancelling', '--include', 'neck'], /^coilbench: --include neck: expected a hum-cancelling wiring \(it is not; drop it or the hum-cancelling constraint\), got "neck"$/mu],
      [['--count', '6', '--level-window', '0.1'], /^coilbench: --level-window: expected a wider window: no 6 of the 47 wirings lie within 0\.1 dB of each other \(the closest 6 span \d+\.\d dB\); widen the level window to at least that, or ask for fewer, got 0\.1$/mu],
      [['--count', '1', '--include', 'w1', '--include', 'w2'], /^coilbench: --count: expected at least the 2 wirings that must be included, got 1$/mu],
      [['--include', 'neck + treble'], /^coilbench: --include: expected a known coil \(neck, mid, bridge\), got .*treble/mu],
    ];
    for (const [options, message] of cases) {
      const { status, out, err } = await run('shortlist', 'three-single-coil.json', ...options);
      expect(status, options.join(' ')).toBe(2);
      expect(out).toBe('');
      expect(err).toMatch(message);
    }
    const { err } = await run('shortlist', 'three-single-coil.json', '--include', 'neck + treble');
    expect(err).toContain('--include: expected a known coil (neck, mid, bridge)');
  });
});

interface CompareDocument {
  baseline: string;
  comparisons: Array<{
    candidate: string;
    matched: number;
    audible: number;
    wirings: Array<{
      id: string;
      expression: string;
      candidateExpression: string;
      resonanceHz: { a: number | null; b: number | null; changePercent: number | null; aboveThreshold: boolean };
      levelDb: { changeDb: number };
      spectrumDb: { value: number };
      distance: number;
      audible: boolean;
    }>;
  }>;
}

describe('coilbench compare', () => {
  it('a file against itself: zero differences everywhere', async () => {
    const { status, out } = await run('compare', 'three-single-coil.json', 'three-single-coil.json', '--json');
    expect(status).toBe(0);
    const document = JSON.parse(out) as CompareDocument;
    const comparison = document.comparisons[0];
    expect(comparison?.matched).toBe(47);
    expect(comparison?.audible).toBe(0);
    for (const wiring of comparison?.wirings ?? []) {
      expect(wiring.distance).toBe(0);
      expect(wiring.levelDb.changeDb).toBe(0);
      expect(wiring.spectrumDb.value).toBe(0);
      expect(wiring.resonanceHz.changePercent ?? 0).toBe(0);
    }
  });

  it('the bundled candidate set and a longer cable, against the demo, biggest changes first', async () => {
    const folder = testFolder('compare');
    const demo = JSON.parse(readFileSync(join(samples, 'three-single-coil.json'), 'utf8')) as Record<string, unknown>;
    writeFileSync(join(folder, 'cable.json'), JSON.stringify({ ...demo, name: 'Demo with a 1.2 nF cable (invented)', cable: { capacitance: '1200p' } }));
    const { status, out } = await run('compare', 'three-single-coil.json', 'three-single-coil-alt.json', join(folder, 'cable.json'), '--json');
    expect(status).toBe(0);
    const document = JSON.parse(out) as CompareDocument;
    expect(document.comparisons.map((comparison) => comparison.matched)).toEqual([47, 47]);
    for (const wiring of document.comparisons[1]?.wirings ?? []) {
      if (wiring.resonanceHz.a !== null && wiring.resonanceHz.b !== null) expect(wiring.resonanceHz.b).toBeLessThan(wiring.resonanceHz.a);
    }
    const text = await run('compare', 'three-single-coil.json', 'three-single-coil-alt.json');
    expect(text.out).toContain('B: Tidewater with the hotter candidate coils');
    const distances = [...text.out.matchAll(/ (\d+\.\d\d)×(?: {2}yes)?$/gmu)].map((match) => Number(match[1]));
    expect(distances.length).toBe(47);
    expect(distances).toEqual([...distances].sort((a, b) => b - a));
  });

  it('--render writes each set in its own folder and the comparison page beside them; --json names the page', async () => {
    const folder = testFolder('compare-render');
    try {
      const { status, out, err } = await run('compare', 'two-lead-humbucker.json', 'two-lead-humbucker.json', '--render', '-o', folder, '--chain', 'direct', '--json');
      expect(status, err).toBe(0);
      const document = JSON.parse(out) as CompareDocument & { render: { folder: string; page: string } };
      expect(document.render).toEqual({ folder, page: join(folder, 'index.html') });
      const report = JSON.parse(readFileSync(join(folder, 'comparison.json'), 'utf8')) as {
        sets: Array<{ label: string; folder: string }>;
        entries: Array<{ id: string; wav: string; levelDb: number }>;
        rows: Array<{ entries: string[]; differences: Array<{ distance: number }> }>;
      };
      expect(report.sets.map((set) => [set.label, set.folder])).toEqual([['A', 'a'], ['B', 'b']]);
      expect(report.rows).toHaveLength(6);
      for (const entry of report.entries) {
        expect(readFileSync(join(folder, entry.wav)).subarray(0, 4).toString('latin1')).toBe('RIFF'); // each set's WAV files, for players outside the page
        expect(existsSync(join(folder, `${entry.wav}.js`))).toBe(false); // the page carries coil signals, not copies of the files
      }
      // the page carries each set's coil signals, one per coil of its guitar
      const page = readFileSync(join(folder, 'index.html'), 'utf8');
      const data = JSON.parse(/<script type="application\/json" id="comparison-data">([\s\S]*?)<\/script>/u.exec(page)?.[1] ?? '{}') as { sets: Array<{ guitar: { coils: unknown[] }; coils: { signals: string[] } }> };
      expect(data.sets).toHaveLength(2);
      for (const set of data.sets) expect(set.coils.signals.length).toBe(set.guitar.coils.length);
      expect(data.sets[0]?.coils.signals.length).toBeGreaterThan(1);
      // the same guitar twice: the same levels and no difference anywhere
      const level = new Map(report.entries.map((entry) => [entry.id, entry.levelDb]));
      for (const row of report.rows) {
        expect(level.get(row.entries[1] ?? '')).toBe(level.get(row.entries[0] ?? ''));
        expect(row.differences[0]?.distance).toBe(0);
      }
      for (const set of ['a', 'b']) expect(readFileSync(join(folder, set, 'index.html'), 'utf8')).toContain('coilbench listening page');
      expect(readFileSync(join(folder, 'index.html'), 'utf8')).toContain('coilbench comparison page');
      const refused = await run('compare', 'two-lead-humbucker.json', 'two-lead-humbucker.json', '--chain', 'direct');
      expect(refused.status).toBe(2);
      expect(refused.err).toContain('--chain: expected --chain only with --render');
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it('--map renames coil ids; without it the message says to use it', async () => {
    const folder = testFolder('map');
    const demo = JSON.parse(readFileSync(join(samples, 'three-single-coil.json'), 'utf8')) as { coils: Array<Record<string, unknown>> };
    const renamed = { ...demo, coils: demo.coils.map((coil, index) => ({ ...coil, id: ['front', 'centre', 'back'][index] })) };
    writeFileSync(join(folder, 'renamed.json'), JSON.stringify(renamed));
    const refused = await run('compare', 'three-single-coil.json', join(folder, 'renamed.json'));
    expect(refused.status).toBe(2);
    expect(refused.err).toContain('expected elements that match neck, mid, bridge one to one (rename with --map first=second,…), got "front, centre, back"');
    const { status, out } = await run('compare', 'three-single-coil.json', join(folder, 'renamed.json'), '--map', 'neck=front,mid=centre,bridge=back', '--json');
    expect(status).toBe(0);
    const wiring = (JSON.parse(out) as CompareDocument).comparisons[0]?.wirings[4];
    expect([wiring?.expression, wiring?.candidateExpression]).toEqual(['neck + ~mid', 'front + ~centre']);
    expect(wiring?.distance).toBe(0);
  });
});

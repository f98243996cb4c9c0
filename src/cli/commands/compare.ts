import { join, relative, resolve } from 'node:path';
import type { Command } from 'commander';
import {
  type FigurePair,
  type GuitarComparison,
  RESONANCE_CHANGE_PERCENT,
  measureGuitarComparison,
} from '../../analysis/index.js';
import { type RenderOutcome, claimOutputFolder, defaultOutputRoot, outputFolder, renderGuitar, writeComparisonPage, writeFileAtomic } from '../../render/index.js';
import {
  type ComparisonEntry,
  type ComparisonReport,
  type ComparisonRow,
  type ComparisonSetReport,
} from '../../report/index.js';
import type { Wiring } from '../../wiring/index.js';
import { createProgress } from '../progress.js';
import { COILBENCH_VERSION } from '../version.js';
import { listRenderedFiles, parseRenderOptions, renderInputs, shownPath } from './render.js';
import { InputError, type InputProblem, problemAt } from '../../errors/index.js';
import type { Guitar } from '../../guitar/index.js';
import { type AlikeOptionText, addAlikeOptions, describeThresholds, parseAlikeOptions } from '../alike-options.js';
import { type CircuitOptionText, addCircuitOptions, parseCircuitOptions } from '../circuit-options.js';
import { formatTable } from '../format-table.js';
import { collectOption } from '../collect-option.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';
import { maxOf, appendAll } from '../../math/index.js';
import { guardOutputs } from '../guard-outputs.js';

interface CompareOptions extends CircuitOptionText, AlikeOptionText {
  readonly map: string[];
  readonly json?: boolean;
  readonly render?: boolean;
  readonly output?: string;
  readonly chain?: string;
  readonly phrase?: string;
  readonly force?: boolean;
}

/** Mark of a difference at or above its threshold in the table. */
const ABOVE = '*';

/** "neck=front, mid=centre" → Map; problems appended. */
function parseMap(text: string, problems: InputProblem[]): Map<string, string> {
  const map = new Map<string, string>();
  for (const entry of text.split(',').map((part) => part.trim()).filter((part) => part !== '')) {
    const match = /^([A-Za-z][A-Za-z0-9_.-]*)\s*=\s*([A-Za-z][A-Za-z0-9_.-]*)$/u.exec(entry);
    if (!match) problems.push(problemAt('--map', 'renamings like neck=front,mid=centre (first guitar\'s id = other guitar\'s id)', entry));
    else if (map.has(match[1] as string)) problems.push(problemAt('--map', 'each id renamed once', entry));
    else map.set(match[1] as string, match[2] as string);
  }
  return map;
}

const signed = (value: number | null, digits: number, unit = ''): string => (value === null ? '-' : `${value >= 0 ? '+' : ''}${value.toFixed(digits)}${unit}`);
const mark = (above: boolean): string => (above ? ABOVE : '');
const fixed = (value: number | null, digits: number): string => (value === null ? '-' : value.toFixed(digits));

function figureRecord(figure: FigurePair, changeName: string): Record<string, unknown> {
  return { a: figure.a, b: figure.b, [changeName]: figure.change, aboveThreshold: figure.aboveThreshold };
}

/** The `--json` record of one candidate against the baseline. */
function comparisonRecord(comparison: GuitarComparison): Record<string, unknown> {
  const { base, candidate } = comparison;
  return {
    candidate: candidate.guitar.name,
    matched: comparison.wirings.length,
    audible: comparison.wirings.filter((wiring) => wiring.audible).length,
    unmatched: comparison.unmatched.map((index) => base.wirings[index]?.id),
    wirings: comparison.wirings.map((wiring) => ({
      id: base.wirings[wiring.indexA]?.id,
      expression: base.wirings[wiring.indexA]?.expression,
      candidateId: candidate.wirings[wiring.indexB]?.id,
      candidateExpression: candidate.wirings[wiring.indexB]?.expression,
      resonanceHz: figureRecord(wiring.resonanceHz, 'changePercent'),
      levelDb: figureRecord(wiring.levelDb, 'changeDb'),
      brightnessHz: figureRecord(wiring.brightnessHz, 'changePercent'),
      humDb: { ...figureRecord(wiring.humDb, 'changeDb'), humCancelling: wiring.humDb.humCancelling },
      spectrumDb: { value: wiring.spectrumDb, aboveThreshold: wiring.spectrumAboveThreshold },
      distance: wiring.distance,
      audible: wiring.audible,
    })),
  };
}

/** Median of a list (null when empty). */
function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 === 1 ? (sorted[middle] as number) : ((sorted[middle - 1] as number) + (sorted[middle] as number)) / 2;
}

function renderComparisonText(comparison: GuitarComparison, label: string): string {
  const { base, candidate, wirings } = comparison;
  const lines: string[] = [];
  const audible = wirings.filter((wiring) => wiring.audible).length;
  lines.push(`${label}: ${candidate.guitar.name}`);
  lines.push(`  ${wirings.length} wirings matched; ${audible} sound different from A (distance 1× or more)${comparison.unmatched.length > 0 ? `; ${comparison.unmatched.length} of A's have no match` : ''}.`);
  const count = (pick: (wiring: (typeof wirings)[number]) => boolean): number => wirings.filter(pick).length;
  const medianOf = (pick: (wiring: (typeof wirings)[number]) => number | null): string => {
    const value = median(wirings.map(pick).filter((entry): entry is number => entry !== null));
    return value === null ? '-' : signed(value, 1);
  };
  lines.push(
    `  Above threshold: resonance ${count((w) => w.resonanceHz.aboveThreshold)}, level ${count((w) => w.levelDb.aboveThreshold)}, ` +
      `spectrum ${count((w) => w.spectrumAboveThreshold)}, brightness ${count((w) => w.brightnessHz.aboveThreshold)}, hum ${count((w) => w.humDb.aboveThreshold)}. ` +
      `Median change: resonance ${medianOf((w) => w.resonanceHz.change)} %, level ${medianOf((w) => w.levelDb.change)} dB, brightness ${medianOf((w) => w.brightnessHz.change)} %.`,
  );
  lines.push('  Biggest changes first:');
  lines.push('');
  const ordered = [...wirings].sort((x, y) => y.distance - x.distance || x.indexA - y.indexA);
  const table = formatTable(ordered, [
    { title: '#', value: (w) => base.wirings[w.indexA]?.id ?? '?', align: 'right' },
    { title: 'wiring', value: (w) => base.wirings[w.indexA]?.expression ?? '?' },
    { title: 'resonance Hz A→B', value: (w) => `${fixed(w.resonanceHz.a, 0)}→${fixed(w.resonanceHz.b, 0)}`, align: 'right' },
    { title: '%', value: (w) => `${signed(w.resonanceHz.change, 1)}${mark(w.resonanceHz.aboveThreshold)}`, align: 'right' },
    { title: 'level dB', value: (w) => `${signed(w.levelDb.change, 1)}${mark(w.levelDb.aboveThreshold)}`, align: 'right' },
    { title: 'brightness %', value: (w) => `${signed(w.brightnessHz.change, 1)}${mark(w.brightnessHz.aboveThreshold)}`, align: 'right' },
    { title: 'spectrum dB', value: (w) => `${w.spectrumDb.toFixed(1)}${mark(w.spectrumAboveThreshold)}`, align: 'right' },
    {
      title: 'hum dB',
      value: (w) => `${signed(w.humDb.change, 0)}${w.humDb.humCancelling[0] !== w.humDb.humCancelling[1] ? (w.humDb.humCancelling[1] ? ' now cancels' : ' no longer cancels') : ''}${mark(w.humDb.aboveThreshold)}`,
      align: 'right',
    },
    { title: 'distance', value: (w) => `${w.distance.toFixed(2)}×`, align: 'right' },
    { title: 'heard', value: (w) => (w.audible ? 'yes' : '') },
  ]);
  appendAll(lines, table.trimEnd().split('\n').map((line) => `  ${line}`));
  return `${lines.join('\n')}\n`;
}

export function registerCompare(program: Command, io: Io): void {
  const command = program
    .command('compare')
    .description('how candidate pickup sets change every wiring, against the first guitar file')
    .argument('<guitarA>', 'baseline guitar file (JSON)')
    .argument('<guitarB>', 'candidate guitar file (JSON)')
    .argument('[more...]', 'more candidates, each compared with the baseline')
    .option('--map <renamings>', 'coil ids that differ, first=other,… (once for every candidate, or once per candidate in order)', collectOption, [])
    .option('--json', 'print one JSON document on stdout')
    .option('--render', 'render every matched wiring on every set, and a comparison page to switch between sets while playing (default folder renders/<guitar>-compared)')
    .option('-o, --output <dir>', 'folder for --render')
    .option('--force', 'with --render: write into a folder coilbench did not make, replacing only the files coilbench writes')
    .option('--chain <chain>', 'effects chain for --render: direct, clean, drive or compressed (default clean)')
    .option('--phrase <phrase>', 'what the strings play for --render: open-strings, strum, riff or a phrase file (default strum)');
  addAlikeOptions(addCircuitOptions(command)).action(async (fileA: string, fileB: string, more: string[], options: CompareOptions) => {
    const files = [fileB, ...more];
    const problems: InputProblem[] = [];
    const guitars: Guitar[] = [];
    for (const file of [fileA, ...files]) {
      try {
        guitars.push(readGuitarFile(file, io.cwd));
      } catch (error) {
        if (!(error instanceof InputError)) throw error;
        appendAll(problems, error.problems);
      }
    }
    if (problems.length > 0) throw new InputError(problems);
    const [base, ...candidates] = guitars as [Guitar, ...Guitar[]];
    const overrides = parseCircuitOptions(options, base, problems);
    const thresholds = parseAlikeOptions(options, problems);
    const maps = options.map.map((text) => parseMap(text, problems));
    if (!options.render) {
      for (const [flag, value] of [['--output', options.output], ['--chain', options.chain], ['--phrase', options.phrase]] as const) {
        if (value !== undefined) problems.push(problemAt(flag, `${flag} only with --render`, value));
      }
    }
    if (maps.length > 1 && maps.length !== candidates.length) {
      problems.push(problemAt('--map', `one --map for every candidate, or ${candidates.length} (one per candidate, in order)`, `${maps.length} --map options`));
    }
    if (problems.length > 0) throw new InputError(problems);

    const comparisons = candidates.map((candidate, index) =>
      measureGuitarComparison(base, candidate, {
        thresholds,
        overrides,
        rename: maps.length === 0 ? new Map() : ((maps.length === 1 ? maps[0] : maps[index]) as Map<string, string>),
        renamePath: `${files[index] ?? ''} (--map)`,
      }),
    );
    const first = comparisons[0] as GuitarComparison;
    if (options.json) {
      const document: Record<string, unknown> = {
        baseline: base.name,
        thresholds: first.thresholds,
        resonancePercent: RESONANCE_CHANGE_PERCENT,
        phrase: first.base.spectra.basis.phraseName,
        comparisons: comparisons.map(comparisonRecord),
      };
      if (options.render) {
        const page = await renderComparison(base, comparisons, [fileA, ...files], options, io);
        document.render = { folder: page.root, page: page.page };
      }
      io.stdout(`${JSON.stringify(document, null, 2)}\n`);
      return;
    }
    io.stdout(`A (baseline): ${base.name}\n`);
    io.stdout(
      `Thresholds: ${describeThresholds(first.thresholds)}; resonance ${RESONANCE_CHANGE_PERCENT} % (a rule of thumb; only between peaks ${first.thresholds.levelDb} dB or more above 100 Hz). ${ABOVE} = at or above its threshold.\n` +
        'Every figure of B is on A\'s scale: level against A\'s mean single coil, hum against A\'s mean single-coil hum.\n\n',
    );
    comparisons.forEach((comparison, index) => {
      io.stdout(renderComparisonText(comparison, String.fromCharCode('B'.charCodeAt(0) + index)));
      io.stdout('\n');
    });
    io.stdout(
      'distance: the largest of the level, spectrum and brightness differences over its threshold (1× = just noticeable). ' +
        'brightness %: the change of the power-weighted band centroid that decides "alike" (docs/distinctness.md), not of the centroid Hz that analyze prints. ' +
        'Figures come from models of the pickups, not measurements: a candidate set is worth trying by ear before you buy and fit it.\n',
    );
    if (options.render) {
      const page = await renderComparison(base, comparisons, [fileA, ...files], options, io);
      const where = relative(io.cwd, page.root) || '.';
      io.stderr(`coilbench: open ${where}/index.html in a browser to switch between the sets while playing; start at a low volume. Each set's own listening page is in its folder.\n`);
      io.stdout(`${where}/index.html\n`);
    }
  });
}

/** Folder of set `index` inside the comparison folder: a, b, c, … */
const setFolder = (index: number): string => String.fromCharCode('a'.charCodeAt(0) + index);
const setLabel = (index: number): string => String.fromCharCode('A'.charCodeAt(0) + index);

/**
 * Render every matched wiring on every set (each set in its own folder,
 * with its own listening page) and write the comparison page beside them.
 */
async function renderComparison(base: Guitar, comparisons: readonly GuitarComparison[], files: readonly string[], options: CompareOptions, io: Io) {
  const first = comparisons[0] as GuitarComparison;
  const root = resolve(io.cwd, options.output ?? defaultOutputRoot('.', `${base.name} compared`));
  const rowsA = first.base.wirings.filter((_, indexA) => comparisons.every((comparison) => comparison.wirings.some((wiring) => wiring.indexA === indexA)));
  const sets: Array<{ guitar: Guitar; all: readonly Wiring[]; selected: Wiring[] }> = [
    { guitar: base, all: first.base.wirings, selected: [...rowsA] },
    ...comparisons.map((comparison) => {
      const byA = new Map(comparison.wirings.map((wiring) => [wiring.indexA, wiring.indexB]));
      const selected = rowsA.map((wiring) => comparison.candidate.wirings[byA.get(wiring.number - 1) ?? -1] as Wiring);
      return { guitar: comparison.candidate.guitar, all: comparison.candidate.wirings, selected: [...selected].sort((a, b) => a.number - b.number) };
    }),
  ];
  const entries = ['comparison.json', 'index.html', ...sets.map((_, index) => `${setFolder(index)}/`)];
  guardOutputs([...renderInputs(files[0] ?? '', options.phrase), ...files.slice(1)], [{ option: options.output === undefined ? 'output folder' : '--output', path: root, kind: 'folder', entries }], io.cwd);
  // Every set's options are checked before the folder is claimed or anything is written.
  const parsedSets = sets.map((set) =>
    parseRenderOptions(
      { chain: options.chain, phrase: options.phrase, volume: options.volume, tone: options.tone, cable: options.cable, mains: options.mains, output: options.output },
      set.guitar,
      set.all,
      io,
    ),
  );
  const claim = claimOutputFolder({
    root,
    shownAs: shownPath(io, root),
    force: options.force === true,
    namedAfterGuitar: options.output === undefined,
    ownNames: ['index.html', 'comparison.json', ...sets.map((_, index) => setFolder(index))],
    purpose: {
      guitar: `${base.name} compared`,
      guitarFile: files.join(', '),
      generator: `coilbench ${COILBENCH_VERSION}`,
      settings: { chain: parsedSets[0]?.chain, phrase: parsedSets[0]?.phrase.name, sets: files },
    },
    note: (line) => io.stderr(`coilbench: ${line}\n`),
  });
  const progress = createProgress(io);
  const outcomes: RenderOutcome[] = [];
  const sounds: Array<Parameters<typeof writeComparisonPage>[2][number]> = [];
  try {
    for (const [index, set] of sets.entries()) {
      const parsed = parsedSets[index] as (typeof parsedSets)[number];
      io.stderr(`coilbench: rendering ${setLabel(index)} (${files[index] ?? set.guitar.name}): ${set.selected.length} wirings\n`);
      outcomes.push(
        await renderGuitar(
          {
            guitar: set.guitar,
            all: set.all,
            selected: set.selected,
            phrase: parsed.phrase,
            chain: parsed.chain,
            sampleRateHz: parsed.sampleRateHz,
            format: parsed.format,
            level: 'true',
            hum: null,
            overrides: parsed.overrides,
            seed: parsed.seed,
            folder: outputFolder(join(root, setFolder(index))),
            generator: `coilbench ${COILBENCH_VERSION}`,
            thresholds: first.thresholds,
          },
          { onStage: (stage, total) => progress.stage(stage, total), onStep: (done, total) => progress.step(done, total) },
        ),
      );
      sounds.push({ guitar: set.guitar, phrase: parsed.phrase, sampleRateHz: parsed.sampleRateHz, seed: parsed.seed, overrides: parsed.overrides, hum: null, chain: parsed.chain });
    }
    progress.finish();
    const report = comparisonReport(comparisons, sets, outcomes);
    const folder = outputFolder(root);
    await writeFileAtomic(join(root, 'comparison.json'), `${JSON.stringify(report, null, 2)}\n`);
    await writeComparisonPage(folder.page, report, sounds);
    claim.finish(
      outcomes.flatMap((outcome, index) =>
        listRenderedFiles(outputFolder(join(root, setFolder(index))), outcome).map((path) => `${setFolder(index)}/${path}`),
      ),
    );
    return { root, page: folder.page };
  } catch (error) {
    claim.abandon();
    throw error;
  }
}

/** The data of the comparison page: entries per set (figures on the baseline's scale) and rows, biggest change first. */
function comparisonReport(
  comparisons: readonly GuitarComparison[],
  sets: ReadonlyArray<{ guitar: Guitar; selected: readonly Wiring[] }>,
  outcomes: readonly RenderOutcome[],
): ComparisonReport {
  const first = comparisons[0] as GuitarComparison;
  const setReports: ComparisonSetReport[] = sets.map((set, index) => ({
    label: setLabel(index),
    name: set.guitar.name,
    folder: setFolder(index),
    render: (outcomes[index] as RenderOutcome).report.render,
  }));
  const entries: ComparisonEntry[] = [];
  const entryIds = new Map<string, string>();
  sets.forEach((set, index) => {
    const outcome = outcomes[index] as RenderOutcome;
    const compared = index === 0 ? first.base : (comparisons[index - 1] as GuitarComparison).candidate;
    const humOf = new Map<number, number | null>();
    if (index === 0) first.wirings.forEach((wiring) => humOf.set(wiring.indexA, wiring.humDb.a));
    else (comparisons[index - 1] as GuitarComparison).wirings.forEach((wiring) => humOf.set(wiring.indexB, wiring.humDb.b));
    for (const row of outcome.rows) {
      const position = row.wiring.number - 1;
      const id = `${setLabel(index)}:${row.wiring.id}`;
      entryIds.set(`${index}:${position}`, id);
      entries.push({
        id,
        set: index,
        wiringId: row.wiring.id,
        expression: row.wiring.expression,
        wav: `${setFolder(index)}/${row.wav}`,
        levelDb: compared.profiles.levelsDb[position] as number,
        loudnessLufs: row.loudnessLufs,
        brightnessHz: compared.profiles.brightnessHz[position] as number,
        resonanceHz: row.circuit.resonanceHz,
        humDb: humOf.get(position) ?? null,
        humCancelling: row.circuit.humCancelling,
      });
    }
  });
  const rows: ComparisonRow[] = [];
  for (const wiringA of sets[0]?.selected ?? []) {
    const indexA = wiringA.number - 1;
    const matches = comparisons.map((comparison) => comparison.wirings.find((wiring) => wiring.indexA === indexA));
    const ids = [entryIds.get(`0:${indexA}`), ...matches.map((match, c) => (match ? entryIds.get(`${c + 1}:${match.indexB}`) : undefined))];
    if (ids.some((id) => id === undefined)) continue;
    rows.push({
      key: wiringA.id,
      number: wiringA.number,
      expression: wiringA.expression,
      description: wiringA.description,
      entries: ids as string[],
      differences: matches.map((match, c) => ({
        set: c + 1,
        distance: match?.distance ?? 0,
        audible: match?.audible ?? false,
        levelDb: match?.levelDb.change ?? null,
        spectrumDb: match?.spectrumDb ?? 0,
        brightnessPercent: match?.brightnessHz.change ?? null,
        resonancePercent: match?.resonanceHz.change ?? null,
        humDb: match?.humDb.change ?? null,
      })),
    });
  }
  const largest = (row: ComparisonRow): number => maxOf(row.differences.map((difference) => difference.distance));
  rows.sort((a, b) => largest(b) - largest(a) || a.number - b.number);
  return {
    generator: `coilbench ${COILBENCH_VERSION}`,
    baseline: first.base.guitar.name,
    thresholds: first.thresholds,
    sets: setReports,
    entries,
    rows,
  };
}

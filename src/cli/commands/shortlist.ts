import type { Command } from 'commander';
import {
  type Distinctness,
  type Shortlist,
  measureCoilDrive,
  measureDistinctness,
  measureSpectralBasis,
  measureWiringDistance,
  solveShortlist,
} from '../../analysis/index.js';
import { type WiringCircuitMetrics, measureCircuitMetrics } from '../../circuit/index.js';
import { InputError, type InputProblem, problemAt } from '../../errors/index.js';
import type { Guitar } from '../../guitar/index.js';
import { type Wiring, enumerateWirings, findWiring, vocabularyOf } from '../../wiring/index.js';
import { type AlikeOptionText, addAlikeOptions, describeThresholds, parseAlikeOptions } from '../alike-options.js';
import { type CircuitOptionText, addCircuitOptions, parseCircuitOptions } from '../circuit-options.js';
import { formatTable } from '../format-table.js';
import { formatHumDb } from '../metric-columns.js';
import { collectOption } from '../collect-option.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';
import { defaultOutputRoot, measureWiringAudio } from '../../render/index.js';
import { reportRender, runRender } from './render.js';
import { wiringRecord } from './wirings.js';
import { appendAll } from '../../math/index.js';

interface ShortlistOptions extends CircuitOptionText, AlikeOptionText {
  readonly count?: string;
  readonly humCancelling?: boolean;
  readonly levelWindow?: string;
  readonly include: string[];
  readonly coils?: string;
  readonly json?: boolean;
  readonly render?: boolean;
  readonly output?: string;
  readonly force?: boolean;
  readonly chain?: string;
  readonly phrase?: string;
}

/** Largest shortlist asked for: a rotary switch has at most a dozen positions (common practice). */
const MAX_COUNT = 12;
/** Wirings chosen when --count is not given: the positions of a five-position lever switch, the commonest selector (common practice). */
const DEFAULT_COUNT = 5;
/** Widest level window accepted, dB (our choice: far wider than any real spread of wirings). */
const MAX_WINDOW_DB = 60;

/** `--level-window 3` or `4.5dB`: a level spread in dB, or null when not given; a bad value is appended to `problems`. */
export function parseLevelWindow(text: string | undefined, problems: InputProblem[]): number | null {
  if (text === undefined) return null;
  const number = text.trim().replace(/\s*db$/iu, '');
  const value = Number(number);
  if (!/^\d*\.?\d+$/u.test(number) || value > MAX_WINDOW_DB) {
    problems.push(problemAt('--level-window', `a level spread in dB from 0 to ${MAX_WINDOW_DB}, like 3 or 4.5dB`, text));
    return null;
  }
  return value;
}

const CAUTION =
  'These are models: listen to each on the real instrument before you build. To wire one, `coilbench netlist <guitar> <wiring> --build-sheet` ' +
  'gives the connections and the cautions (iron stand, ventilation, wash your hands, check with a meter before closing up, never open an amplifier).';

export interface ShortlistPlan {
  readonly count: number;
  /** True when --count was not given: `count` is then a ceiling. */
  readonly countDefaulted: boolean;
  readonly humCancelling: boolean;
  readonly levelWindowDb: number | null;
  readonly include: readonly Wiring[];
  /** Element indices allowed, or null. */
  readonly elements: readonly number[] | null;
}

/** Read the shortlist's own options; problems are appended, one per bad option. */
function parsePlan(options: ShortlistOptions, guitar: Guitar, wirings: readonly Wiring[], problems: InputProblem[]): ShortlistPlan {
  let count = 0;
  if (options.count === undefined) count = Math.min(DEFAULT_COUNT, wirings.length);
  else {
    const value = Number(options.count.trim());
    if (!/^\s*\d+\s*$/u.test(options.count) || value < 1 || value > MAX_COUNT) problems.push(problemAt('--count', `a whole number from 1 to ${MAX_COUNT}`, options.count));
    else count = value;
  }
  const levelWindowDb = parseLevelWindow(options.levelWindow, problems);
  const ids = guitar.elements.map((element) => element.id);
  let elements: number[] | null = null;
  if (options.coils !== undefined) {
    const names = options.coils.split(/[\s,]+/u).filter((name) => name !== '');
    elements = [];
    if (names.length === 0) problems.push(problemAt('--coils', `coil names separated by commas, like ${ids.slice(0, 2).join(',')}`, options.coils));
    for (const name of names) {
      const index = ids.indexOf(name);
      if (index < 0) problems.push(problemAt('--coils', `names of this guitar's wiring elements (${ids.join(', ')})`, name));
      else if (!elements.includes(index)) elements.push(index);
    }
    elements.sort((a, b) => a - b);
  }
  const include: Wiring[] = [];
  const vocabulary = vocabularyOf(guitar);
  for (const text of options.include) {
    try {
      include.push(findWiring(text, wirings, vocabulary, '--include'));
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
    }
  }
  return { count, countDefaulted: options.count === undefined, humCancelling: options.humCancelling === true, levelWindowDb, include, elements };
}

/** Solve the shortlist, with the core's constraint names turned into the options a user typed. */
export function solvePlannedShortlist(
  guitar: Guitar,
  wirings: readonly Wiring[],
  circuit: readonly WiringCircuitMetrics[],
  distinct: Distinctness,
  plan: ShortlistPlan,
): Shortlist {
  const { profiles, thresholds } = distinct;
  const list = wirings.map((wiring, index) => ({
    rank: wiring.number,
    levelDb: profiles.levelsDb[index] as number,
    humCancelling: (circuit[index] as WiringCircuitMetrics).humCancelling,
    elements: wiring.elements,
    expression: wiring.expression,
  }));
  const includeIndices = plan.include.map((wiring) => wiring.number - 1);
  try {
    return solveShortlist(list, (a, b) => measureWiringDistance(profiles, a, profiles, b, thresholds), {
      count: plan.count,
      upTo: plan.countDefaulted,
      humCancelling: plan.humCancelling,
      elements: plan.elements,
      elementIds: guitar.elements.map((element) => element.id),
      include: includeIndices,
      levelWindowDb: plan.levelWindowDb,
    });
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    throw new InputError(
      error.problems.map((problem) => {
        const included = /^include\[(\d+)\]$/u.exec(problem.path);
        const path = included
          ? `--include ${plan.include[Number(included[1])]?.expression ?? ''}`
          : ({ count: '--count', humCancelling: '--hum-cancelling', elements: '--coils', levelWindowDb: '--level-window' } as Record<string, string>)[problem.path] ?? problem.path;
        return { ...problem, path };
      }),
    );
  }
}

const signed = (value: number, digits: number): string => `${value >= 0 ? '+' : ''}${value.toFixed(digits)}`;
const times = (value: number): string => (Number.isFinite(value) ? `${value.toFixed(2)}×` : '-');

/** "hum cancelling; within 3 dB; including w4; coils neck, bridge" or "none". */
function describeConstraints(plan: ShortlistPlan, guitar: Guitar): string {
  const parts: string[] = [];
  if (plan.humCancelling) parts.push('hum cancelling only');
  if (plan.levelWindowDb !== null) parts.push(`all within ${plan.levelWindowDb} dB of each other`);
  if (plan.include.length > 0) parts.push(`including ${plan.include.map((wiring) => `${wiring.id} ${wiring.expression}`).join(', ')}`);
  if (plan.elements !== null) parts.push(`only ${plan.elements.map((index) => guitar.elements[index]?.id ?? '?').join(', ')}`);
  return parts.length > 0 ? parts.join('; ') : 'none';
}

/** The closest pair of the chosen set (wiring indices). */
function closestPair(shortlist: Shortlist, distinct: Distinctness): [number, number] | null {
  let best: [number, number] | null = null;
  let smallest = Number.POSITIVE_INFINITY;
  const { members } = shortlist;
  for (let i = 0; i < members.length; i += 1) {
    for (let j = i + 1; j < members.length; j += 1) {
      const distance = measureWiringDistance(distinct.profiles, members[i] as number, distinct.profiles, members[j] as number, distinct.thresholds);
      if (distance < smallest) {
        smallest = distance;
        best = [members[i] as number, members[j] as number];
      }
    }
  }
  return best;
}

export function registerShortlist(program: Command, io: Io): void {
  const command = program
    .command('shortlist')
    .description('the few wirings most different from each other, for a real switch, under your constraints')
    .argument('<guitar>', 'guitar file (JSON)')
    .option('--count <K>', `how many wirings (1 to ${MAX_COUNT}), e.g. the positions of your switch (default ${DEFAULT_COUNT}, a five-position lever)`)
    .option('--hum-cancelling', 'only wirings that cancel hum')
    .option('--level-window <dB>', 'every chosen wiring within this many dB of every other')
    .option('--include <wiring>', 'a wiring that must be in the list, like "neck + mid" or w4 (repeat for more)', collectOption, [])
    .option('--coils <ids>', 'only wirings of these coils, separated by commas')
    .option('--json', 'print one JSON document on stdout')
    .option('--render', 'render just these wirings, with their listening page (default folder renders/<guitar>-shortlist)')
    .option('-o, --output <dir>', 'folder for --render')
    .option('--force', 'with --render: write into a folder coilbench did not make, replacing only the files coilbench writes')
    .option('--chain <chain>', 'effects chain for --render: direct, clean, drive or compressed (default clean)')
    .option('--phrase <phrase>', 'what the strings play for --render: open-strings, strum, riff or a phrase file (default strum)');
  addAlikeOptions(addCircuitOptions(command)).action(async (file: string, options: ShortlistOptions) => {
    const guitar = readGuitarFile(file, io.cwd);
    const wirings = enumerateWirings(guitar.elements);
    const problems: InputProblem[] = [];
    const overrides = parseCircuitOptions(options, guitar, problems);
    const thresholds = parseAlikeOptions(options, problems);
    const plan = parsePlan(options, guitar, wirings, problems);
    if (!options.render) {
      for (const [flag, value] of [['--output', options.output], ['--chain', options.chain], ['--phrase', options.phrase]] as const) {
        if (value !== undefined) problems.push(problemAt(flag, `${flag} only with --render`, value));
      }
    }
    if (problems.length > 0) throw new InputError(problems);

    const basis = measureSpectralBasis(guitar);
    const circuit = measureCircuitMetrics(guitar, wirings, overrides, { drive: measureCoilDrive(basis) });
    const distinct = measureDistinctness(guitar, wirings, { overrides, thresholds, reuseBasis: basis });
    const shortlist = solvePlannedShortlist(guitar, wirings, circuit.wirings, distinct, plan);
    const pair = closestPair(shortlist, distinct);
    const { profiles } = distinct;
    // Brightness is the one figure analyze, reports and the page give: the centroid of the strum render
    // (docs/design.md, centroidHz), measured for the chosen wirings only (and the single coils levels refer to).
    const chosen = shortlist.members.map((index) => wirings[index] as Wiring);
    const audio = measureWiringAudio(guitar, wirings, chosen, overrides);
    const rowOf = (index: number) => {
      const wiring = wirings[index] as Wiring;
      const figures = circuit.wirings[index] as WiringCircuitMetrics;
      return {
        wiring,
        levelDb: profiles.levelsDb[index] as number,
        centroidHz: audio.get(wiring.id)?.centroidHz ?? Number.NaN,
        figures,
        group: distinct.groups.groupOf[index] ?? 0,
      };
    };
    const rows = shortlist.members.map(rowOf);
    const distances = shortlist.members.map((a) => shortlist.members.map((b) => (a === b ? 0 : measureWiringDistance(profiles, a, profiles, b, distinct.thresholds))));

    if (options.json) {
      const document = {
        guitar: guitar.name,
        count: shortlist.members.length,
        constraints: {
          humCancelling: plan.humCancelling,
          levelWindowDb: plan.levelWindowDb,
          include: plan.include.map((wiring) => wiring.id),
          coils: plan.elements === null ? null : plan.elements.map((index) => guitar.elements[index]?.id),
        },
        thresholds: distinct.thresholds,
        method: shortlist.method,
        candidates: shortlist.candidateCount,
        minDistance: Number.isFinite(shortlist.minDistance) ? shortlist.minDistance : null,
        closestPair: pair ? pair.map((index) => wirings[index]?.id) : null,
        levelRangeDb: shortlist.levelRangeDb,
        wirings: rows.map((row) => ({
          ...wiringRecord(row.wiring),
          levelDb: row.levelDb,
          centroidHz: row.centroidHz,
          ...row.figures,
          group: row.group,
        })),
        distances,
      };
      const rendered = options.render ? await renderShortlist(file, guitar, options, rows.map((row) => row.wiring.id), io) : null;
      io.stdout(`${JSON.stringify(rendered ? { ...document, render: { folder: rendered.root, page: `${rendered.root}/index.html` } } : document, null, 2)}\n`);
      return;
    }

    const lines: string[] = [];
    const defaulted = plan.countDefaulted ? ` (--count not given: up to ${plan.count}, as for a five-position lever switch)` : '';
    lines.push(`${guitar.name}: ${shortlist.members.length} of ${wirings.length} wirings, as different from each other as possible${defaulted}`);
    lines.push(`constraints: ${describeConstraints(plan, guitar)} (${shortlist.candidateCount} wirings qualify)`);
    const method = shortlist.method === 'exact' ? 'exact search (branch and bound)' : 'greedy farthest-point with swaps (a heuristic: the best set may be a little better)';
    const closest = pair ? ` (${wirings[pair[0]]?.id} and ${wirings[pair[1]]?.id})` : '';
    lines.push(`smallest difference in the set: ${times(shortlist.minDistance)} the just-noticeable difference${closest}; ${method}`);
    lines.push(`thresholds: ${describeThresholds(distinct.thresholds)}`);
    lines.push('');
    io.stdout(`${lines.join('\n')}\n`);
    io.stdout(
      formatTable(rows, [
        { title: '#', value: (row) => row.wiring.id, align: 'right' },
        { title: 'wiring', value: (row) => row.wiring.expression },
        { title: 'level dB', value: (row) => signed(row.levelDb, 1), align: 'right' },
        { title: 'centroid Hz', value: (row) => row.centroidHz.toFixed(0), align: 'right' },
        { title: 'resonance Hz', value: (row) => (row.figures.resonanceHz === null ? '-' : row.figures.resonanceHz.toFixed(0)), align: 'right' },
        { title: 'hum dB', value: (row) => formatHumDb(row.figures.humDb), align: 'right' },
        { title: 'hum', value: (row) => row.figures.humCategory ?? '-' },
        { title: 'group', value: (row) => String(row.group), align: 'right' },
        { title: 'in words', value: (row) => row.wiring.description },
      ]),
    );
    if (rows.length > 1) {
      io.stdout('\nDifferences between them (× just noticeable):\n');
      io.stdout(
        formatTable(
          rows.map((row, i) => ({ row, i })),
          [
            { title: '', value: ({ row }) => row.wiring.id, align: 'right' },
            ...rows.map((column, j) => ({ title: column.wiring.id, value: ({ i }: { i: number }) => (i === j ? '-' : (distances[i]?.[j] ?? 0).toFixed(1)), align: 'right' as const })),
          ],
        ),
      );
    }
    if (shortlist.minDistance < 1) {
      io.stdout(`\nNote: some of these sound alike at these thresholds; fewer than ${shortlist.members.length} audibly different wirings meet the constraints.\n`);
    }
    io.stdout(`\nlevel: relative to the mean single coil; centroid: the spectral centroid of the strum, as in \`coilbench analyze\` (higher is brighter); group: as in \`coilbench analyze\`.\n${CAUTION}\n`);
    if (options.render) {
      const rendered = await renderShortlist(file, guitar, options, rows.map((row) => row.wiring.id), io);
      reportRender(io, rendered.root, rendered.outcome, rendered.seconds);
    }
  });
}

/** Render the chosen wirings into their own folder (a listening page of just these). */
async function renderShortlist(file: string, guitar: Guitar, options: ShortlistOptions, ids: readonly string[], io: Io) {
  const { output, force, chain, phrase, volume, tone, cable, mains, levelThreshold, spectrumThreshold, brightnessThreshold } = options;
  return runRender(
    file,
    guitar,
    { output, force, chain, phrase, volume, tone, cable, mains, levelThreshold, spectrumThreshold, brightnessThreshold, only: [...ids] },
    io,
    defaultOutputRoot('.', `${guitar.name} shortlist`),
  );
}

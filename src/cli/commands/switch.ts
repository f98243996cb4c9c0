/**
 * `coilbench switch <guitar> --wiring … [--switch …]`: can this switch
 * hardware give these wirings, position by position, and how are its lugs
 * wired? `--choose`: the most distinct wirings it can give, and how other
 * pole counts compare. Every plan is checked by simulation before it is
 * shown.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { renderGraphNetlist } from '../../circuit/index.js';
import { InputError, type InputProblem, WorkError, problemAt } from '../../errors/index.js';
import { type Guitar, parseJsonText } from '../../guitar/index.js';
import { defaultOutputRoot, writeFileAtomicSync } from '../../render/index.js';
import { type ReportSwitchPosition, escapeMarkdown } from '../../report/index.js';
import {
  type PositionWish,
  type SwitchKit,
  type SwitchPlan,
  type SwitchPlanResult,
  describeKit,
  describeKitPosition,
  describeReading,
  describeWish,
  enumerateKitPositions,
  parseSwitchTexts,
  parseSwitchingSection,
  readPlanPositions,
  renderSwitchDrawing,
  renderSwitchSheet,
  solveSwitchChoice,
  solveSwitchRequest,
  verifySwitchPlan,
  withMorePoles,
  type SwitchDefinition,
  MAX_POLES,
  measureChoiceWirings,
} from '../../switching/index.js';
import { type Wiring, enumerateWirings, findWiring, vocabularyOf } from '../../wiring/index.js';
import { type AlikeOptionText, addAlikeOptions, parseAlikeOptions } from '../alike-options.js';
import { type CircuitOptionText, addCircuitOptions, parseCircuitOptions } from '../circuit-options.js';
import { collectOption } from '../collect-option.js';
import { formatTable } from '../format-table.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';
import { reportRender, runRender } from './render.js';
import { parseLevelWindow } from './shortlist.js';
import { appendAll } from '../../math/index.js';

interface SwitchOptions extends CircuitOptionText, AlikeOptionText {
  readonly switch: string[];
  readonly wiring: string[];
  readonly choose?: boolean;
  readonly humCancelling?: boolean;
  readonly levelWindow?: string;
  readonly include: string[];
  readonly svg?: string;
  readonly netlists?: string;
  readonly searchLimit?: string;
  readonly json?: boolean;
  readonly render?: boolean;
  readonly output?: string;
  readonly chain?: string;
  readonly phrase?: string;
}

/** Search steps allowed per plan search by default (about 10–30 s on a slow machine at the worst; a step is one net tried on one lug or lead). */
const DEFAULT_SEARCH_STEPS = 2_000_000;
const MAX_SEARCH_STEPS = 1_000_000_000;
/** Plan searches per threshold tried by --choose before settling for the best found (our choice: a few seconds per kit). */
const PLAN_SEARCH_LIMIT = 40;
/** Steps per plan search inside --choose by default (our choice: most sets of a small kit settle in far fewer; --search-limit raises it). */
const CHOICE_SEARCH_STEPS = 5_000;

/** The kit: --switch options, else the guitar file's `switching` section. */
function readKit(file: string, options: SwitchOptions, io: Io): SwitchKit {
  if (options.switch.length > 0) return parseSwitchTexts(options.switch);
  const raw = parseJsonText(readFileSync(resolve(io.cwd, file), 'utf8'), file) as Record<string, unknown>;
  const kit = parseSwitchingSection(raw['switching']);
  if (kit === null) throw InputError.at('--switch', 'a switch (like lever-5-position-2-pole), or a "switching" section in the guitar file', undefined);
  return kit;
}

function parseWishes(texts: readonly string[], guitar: Guitar, wirings: readonly Wiring[], problems: InputProblem[]): PositionWish[] {
  const vocabulary = vocabularyOf(guitar);
  return texts.map((text, k): PositionWish => {
    const trimmed = text.trim();
    if (trimmed === 'off') return { kind: 'off' };
    if (trimmed === 'free' || trimmed === '-') return { kind: 'free' };
    try {
      const wiring = findWiring(trimmed, wirings, vocabulary, `--wiring (position ${k + 1})`);
      return { kind: 'wiring', network: wiring.network, expression: wiring.expression };
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
      return { kind: 'free' };
    }
  });
}

function parseSteps(text: string | undefined, problems: InputProblem[]): number {
  if (text === undefined) return DEFAULT_SEARCH_STEPS;
  const value = Number(text);
  if (!/^\s*\d+\s*$/u.test(text) || value < 1 || value > MAX_SEARCH_STEPS) {
    problems.push(problemAt('--search-limit', `a number of search steps from 1 to ${MAX_SEARCH_STEPS}`, text));
    return DEFAULT_SEARCH_STEPS;
  }
  return value;
}

export function registerSwitch(program: Command, io: Io): void {
  const command = program
    .command('switch')
    .description('plan the lug wiring of a switch for the wirings you want on its positions, or choose the most distinct wirings it can give')
    .argument('<guitar>', 'guitar file (JSON)')
    .option('--switch <switch>', 'a switch: lever-5-position-2-pole, toggle-2-position-2-pole, push-pull-2-pole, rotary-6-position-2-pole, or "2-pole: 1 / 1,2 / 2" (repeat for a kit; default: the guitar file\'s switching section)', collectOption, [])
    .option('--wiring <wiring>', 'the wiring wanted in the next position, like "neck + ~bridge", w9, off or free (repeat, in position order)', collectOption, [])
    .option('--choose', 'choose the most distinct wirings the switch can give, and compare pole counts')
    .option('--hum-cancelling', 'with --choose: only wirings that cancel hum')
    .option('--level-window <dB>', 'with --choose: every chosen wiring within this many dB of every other')
    .option('--include <wiring>', 'with --choose: a wiring that must be among them (repeat for more)', collectOption, [])
    .option('--svg <file>', 'also write the drawing of the lugs to this SVG file')
    .option('--netlists <dir>', 'also write one SPICE netlist per position into this folder (ngspice -b runs each)')
    .option('--search-limit <steps>', `search steps per plan before giving up unproven (default ${DEFAULT_SEARCH_STEPS})`)
    .option('--json', 'print one JSON document on stdout')
    .option('--render', 'render the positions\' wirings with their listening page (default folder renders/<guitar>-switch)')
    .option('-o, --output <dir>', 'folder for --render')
    .option('--chain <chain>', 'effects chain for --render')
    .option('--phrase <phrase>', 'what the strings play for --render');
  addAlikeOptions(addCircuitOptions(command)).action(async (file: string, options: SwitchOptions) => {
    const guitar = readGuitarFile(file, io.cwd);
    const wirings = enumerateWirings(guitar.elements);
    const problems: InputProblem[] = [];
    const overrides = parseCircuitOptions(options, guitar, problems);
    const thresholds = parseAlikeOptions(options, problems);
    const stepBudget = parseSteps(options.searchLimit, problems);
    let kit: SwitchKit | null = null;
    try {
      kit = readKit(file, options, io);
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
    }
    const wishes = parseWishes(options.wiring, guitar, wirings, problems);
    if (options.choose && wishes.length > 0) problems.push(problemAt('--wiring', 'either --wiring … or --choose, not both', options.wiring.join(' ')));
    if (!options.choose && wishes.length === 0) problems.push(problemAt('--wiring', 'the wanted wiring of each position (repeat --wiring), or --choose', undefined));
    if (!options.choose) {
      for (const [flag, value] of [['--hum-cancelling', options.humCancelling], ['--level-window', options.levelWindow], ['--include', options.include.length > 0 ? options.include : undefined]] as const) {
        if (value !== undefined) problems.push(problemAt(flag, `${flag} only with --choose`, value));
      }
    }
    if (!options.render) {
      for (const [flag, value] of [['--output', options.output], ['--chain', options.chain], ['--phrase', options.phrase]] as const) {
        if (value !== undefined) problems.push(problemAt(flag, `${flag} only with --render`, value));
      }
    }
    if (problems.length > 0 || kit === null) throw new InputError(problems);

    if (options.choose) {
      await runChoose(file, guitar, kit, wirings, options, overrides, thresholds, stepBudget, io);
      return;
    }
    const allowShorted = guitar.pickups.every((pickup) => pickup.coupling === 0);
    const request = solveSwitchRequest(kit, guitar.elements.length, wishes, { stepBudget, allowShorted });
    if (request.result.status !== 'found' || request.result.plan === null) {
      refuse(guitar, kit, wishes, request, io);
      return;
    }
    await showPlan(file, guitar, request.result.plan, wishes, request.result, options, overrides, io);
  });
}

function refuse(guitar: Guitar, kit: SwitchKit, wishes: readonly PositionWish[], request: ReturnType<typeof solveSwitchRequest>, io: Io): never {
  const lines: string[] = [];
  const positions = enumerateKitPositions(kit);
  const label = (index: number): string => (positions[index] ? describeKitPosition(kit, positions[index]) : String(index + 1));
  if (request.change) {
    lines.push(`Smallest change that gives every position: ${request.change.description}. Kit then: ${describeKit(request.change.kit)}.`);
    lines.push(`Run again with that kit (--switch for each switch) for its lug wiring.`);
  } else if (request.tried.length > 0) {
    lines.push(`None of these changes gives every position either: ${request.tried.map((tried) => `${tried.description} (${tried.status === 'unknown' ? 'not proven' : 'no'})`).join('; ')}.`);
  }
  if (lines.length > 0) io.stderr(`${lines.map((line) => `coilbench: ${line}`).join('\n')}\n`);
  if (request.result.status === 'unknown' && request.unreachable.every((item) => item.why === 'unproven')) {
    throw new WorkError(
      `no plan found within ${request.result.steps} search steps: not proven impossible. Raise --search-limit, or free a position (--wiring free)`,
    );
  }
  if (request.tooMany) {
    throw InputError.at('--wiring', `at most ${request.tooMany.positions} wirings, one per position of ${kit.switches.map((definition) => definition.name).join(' and ')}`, `${request.tooMany.wishes} wirings`);
  }
  const problems: InputProblem[] = [];
  const containment = request.result.containment;
  if (containment) {
    problems.push(
      problemAt(
        `--wiring (position ${label(containment.outer)})`,
        `a wiring that keeps every joint of position ${label(containment.inner)} (${describeWish(wishes[containment.inner])}): this switch closes in position ${label(containment.outer)} every contact it closes in position ${label(containment.inner)}`,
        describeWish(wishes[containment.outer]),
      ),
    );
  }
  for (const item of request.unreachable) {
    if (containment && item.index === containment.outer) continue;
    const why =
      item.why === 'alone'
        ? `a wiring this switch can give in position ${label(item.index)} (not even with every other position free)`
        : item.why === 'together'
          ? `a wiring this switch can give in position ${label(item.index)} together with the positions before it (each alone is possible)`
          : `a wiring found within the search limit for position ${label(item.index)} (not proven impossible)`;
    problems.push(problemAt(`--wiring (position ${label(item.index)})`, why, describeWish(wishes[item.index])));
  }
  if (problems.length === 0) problems.push(problemAt('--wiring', `wirings ${describeKit(kit)} can give together`, wishes.map(describeWish).join(', ')));
  throw new InputError(problems);
}

async function showPlan(
  file: string,
  guitar: Guitar,
  plan: SwitchPlan,
  wishes: readonly PositionWish[],
  result: SwitchPlanResult,
  options: SwitchOptions,
  overrides: ReturnType<typeof parseCircuitOptions>,
  io: Io,
): Promise<void> {
  const positions = readPlanPositions(guitar, plan);
  const verification = verifySwitchPlan(guitar, positions, wishes, overrides);
  const failed = verification.filter((check) => !check.passed);
  if (failed.length > 0) {
    throw new WorkError(`the plan failed its simulation check in position ${failed.map((check) => check.index + 1).join(', ')}; please report this`);
  }
  const drawing = renderSwitchDrawing(guitar, plan);
  const sheet = renderSwitchSheet(guitar, plan, positions, wishes, verification);
  if (options.svg !== undefined) writeFileAtomicSync(resolve(io.cwd, options.svg), drawing);
  if (options.netlists !== undefined) {
    const folder = resolve(io.cwd, options.netlists);
    mkdirSync(folder, { recursive: true });
    positions.forEach((position, index) => {
      const label = `position ${describeKitPosition(plan.kit, position.position)}: ${describeReading(guitar, position.reading)}`;
      writeFileAtomicSync(resolve(folder, `position-${index + 1}.cir`), renderGraphNetlist(guitar, position.circuit, label, overrides));
    });
  }
  let rendered: Awaited<ReturnType<typeof renderPositions>> | null = null;
  if (options.render) rendered = await renderPositions(file, guitar, plan, positions, options, sheet, drawing, io);
  if (options.json) {
    const ids = guitar.elements.map((element) => element.id);
    io.stdout(
      `${JSON.stringify(
        {
          guitar: guitar.name,
          kit: plan.kit,
          searchSteps: result.steps,
          positions: positions.map((position, index) => ({
            position: index + 1,
            label: describeKitPosition(plan.kit, position.position),
            wanted: describeWish(wishes[index]),
            connects: describeReading(guitar, position.reading),
            verification: verification.find((check) => check.index === index) ?? null,
          })),
          lugs: plan.lugNets,
          leads: plan.itemNets,
          elements: ids,
          svg: drawing,
          render: rendered ? { folder: rendered.root, page: `${rendered.root}/index.html` } : null,
        },
        null,
        2,
      )}\n`,
    );
    return;
  }
  io.stdout(sheet);
  io.stdout(`Search: a plan found in ${result.steps} steps (exact search; docs/switching.md).\n`);
  if (options.svg !== undefined) io.stdout(`Drawing written to ${options.svg}\n`);
  if (options.netlists !== undefined) io.stdout(`Netlists written to ${options.netlists}/position-N.cir\n`);
  if (rendered) reportRender(io, rendered.root, rendered.outcome, rendered.seconds);
}

/** Render the wirings the positions give, in position order, with the plan beside them. */
async function renderPositions(
  file: string,
  guitar: Guitar,
  plan: SwitchPlan,
  positions: ReturnType<typeof readPlanPositions>,
  options: SwitchOptions,
  sheet: string,
  drawing: string,
  io: Io,
) {
  const wirings = enumerateWirings(guitar.elements);
  const vocabulary = vocabularyOf(guitar);
  const ids: string[] = [];
  const several = plan.kit.switches.length > 1;
  const labelled: ReportSwitchPosition[] = positions.map((position) => {
    const number = position.position.index + 1;
    const name = describeKitPosition(plan.kit, position.position);
    const text = describeReading(guitar, position.reading);
    const where = several ? `position ${number} (${name})` : `position ${number}`;
    if (position.reading.kind !== 'wiring') return { position: number, name, label: `${where}: ${text}`, wiringId: null, expression: null };
    const wiring = findWiring(text, wirings, vocabulary, 'position');
    if (!ids.includes(wiring.id)) ids.push(wiring.id);
    return { position: number, name, label: `${where}: ${wiring.expression}`, wiringId: wiring.id, expression: wiring.expression };
  });
  if (ids.length === 0) throw InputError.at('--render', 'a plan with at least one position that connects coils', 'every position off');
  const { output, chain, phrase, volume, tone, cable, mains, levelThreshold, spectrumThreshold, brightnessThreshold } = options;
  const rendered = await runRender(
    file,
    guitar,
    { output, chain, phrase, volume, tone, cable, mains, levelThreshold, spectrumThreshold, brightnessThreshold, only: ids },
    io,
    defaultOutputRoot('.', `${guitar.name} switch`),
    labelled,
  );
  const fileOf = new Map(rendered.outcome.rows.map((row) => [row.wiring.id, row.wav]));
  const lines = ['# Switch positions', '', 'In position order; each file is the render of the wiring that position gives.', '', '| position | wiring | wiring number | file |', '|---|---|---|---|'];
  for (const position of labelled) {
    const wav = position.wiringId === null ? null : (fileOf.get(position.wiringId) ?? null);
    lines.push(`| ${escapeMarkdown(position.label)} | ${escapeMarkdown(position.expression ?? 'off')} | ${position.wiringId ?? '-'} | ${wav === null ? '-' : escapeMarkdown(wav)} |`);
  }
  writeFileAtomicSync(resolve(rendered.root, 'switch-positions.md'), `${lines.join('\n')}\n`);
  writeFileAtomicSync(resolve(rendered.root, 'switch-plan.txt'), sheet);
  writeFileAtomicSync(resolve(rendered.root, 'switch-plan.svg'), drawing);
  return rendered;
}

/** Kits to compare with the given one: its first switch with 1, 2 and 4 poles (the pole counts levers are commonly sold with; common practice). */
function comparisonKits(kit: SwitchKit): SwitchKit[] {
  const first = kit.switches[0] as SwitchDefinition;
  const kits: SwitchKit[] = [kit];
  const COMPARED_POLES = [1, 2, 4];
  for (const poles of COMPARED_POLES) {
    if (poles === first.poles || poles > MAX_POLES) continue;
    kits.push(withMorePoles(kit, 0, poles - first.poles));
  }
  return kits;
}

async function runChoose(
  file: string,
  guitar: Guitar,
  kit: SwitchKit,
  wirings: readonly Wiring[],
  options: SwitchOptions,
  overrides: ReturnType<typeof parseCircuitOptions>,
  thresholds: ReturnType<typeof parseAlikeOptions>,
  stepBudget: number,
  io: Io,
): Promise<void> {
  const problems: InputProblem[] = [];
  const levelWindowDb = parseLevelWindow(options.levelWindow, problems);
  const vocabulary = vocabularyOf(guitar);
  const include: number[] = [];
  for (const text of options.include) {
    try {
      include.push(findWiring(text, wirings, vocabulary, '--include').number - 1);
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
    }
  }
  if (problems.length > 0) throw new InputError(problems);
  const { list, distance } = measureChoiceWirings(guitar, wirings, overrides, thresholds);
  const request = { humCancelling: options.humCancelling === true, include, levelWindowDb, planSearchLimit: PLAN_SEARCH_LIMIT };
  const kits = comparisonKits(kit);
  const choiceSteps = options.searchLimit === undefined ? CHOICE_SEARCH_STEPS : stepBudget;
  const allowShorted = guitar.pickups.every((pickup) => pickup.coupling === 0);
  const choices = kits.map((candidate) => solveSwitchChoice(candidate, guitar, list, distance, request, { stepBudget: choiceSteps, allowShorted }));
  const mine = choices[0] as ReturnType<typeof solveSwitchChoice>;
  const rows = kits.map((candidate, k) => {
    const choice = choices[k] as ReturnType<typeof solveSwitchChoice>;
    return {
      kit: describeKit(candidate),
      chosen: choice.assignment === null ? 'none found' : String(new Set(choice.assignment).size),
      minDistance: choice.assignment === null ? '-' : Number.isFinite(choice.minDistance) ? `${choice.minDistance.toFixed(2)}×` : '-',
      proven: choice.proven ? 'proven' : 'best found (search limit reached)',
    };
  });
  if (mine.assignment === null || mine.result?.plan == null) {
    throw new WorkError(`no set of wirings found that ${describeKit(kit)} gives under these constraints${mine.proven ? '' : ' within the search limit'}`);
  }
  const wishes = mine.assignment.map((w): PositionWish => ({ kind: 'wiring', network: (wirings[w] as Wiring).network, expression: (wirings[w] as Wiring).expression }));
  if (!options.json) {
    io.stdout(`${guitar.name}: the most distinct wirings ${describeKit(kit)} gives together, one per position\n`);
    io.stdout(
      `smallest difference between two positions: ${Number.isFinite(mine.minDistance) ? `${mine.minDistance.toFixed(2)}×` : '-'} the just-noticeable difference; ` +
        `${mine.proven ? 'proven the largest possible (exact search)' : 'the best found: a search limit was reached, so a better set may exist'}.\n`,
    );
    io.stdout('Any one wiring can be wired fixed; what a switch limits is which wirings it gives together.\n\nKits compared (same constraints):\n');
    io.stdout(
      formatTable(rows, [
        { title: 'kit', value: (row) => row.kit },
        { title: 'different wirings', value: (row) => row.chosen, align: 'right' },
        { title: 'smallest difference (× just noticeable)', value: (row) => row.minDistance, align: 'right' },
        { title: 'search', value: (row) => row.proven },
      ]),
    );
    io.stdout('\n');
  }
  await showPlan(file, guitar, mine.result.plan, wishes, mine.result, options, overrides, io);
}

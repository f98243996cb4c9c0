import { existsSync } from 'node:fs';
import { join, relative, resolve, sep } from 'node:path';
import type { Command } from 'commander';
import { InputError, type InputProblem, oneOfChoices, problemAt } from '../../errors/index.js';
import type { Guitar } from '../../guitar/index.js';
import {
  CHAIN_NAMES,
  type ChainName,
  type HumMix,
  type OutputFolder,
  type RenderOutcome,
  WAV_FORMATS,
  type WavFormat,
  REFERENCE_PHRASE,
  claimOutputFolder,
  RENDER_TAIL_S,
  defaultOutputRoot,
  describeChain,
  outputFolder,
  ownNamesOf,
  netlistFileName,
  renderGuitar,
  writeFileAtomic,
} from '../../render/index.js';
import { resolveCircuitLoad } from '../../circuit/index.js';
import {
  BUILT_IN_PHRASES,
  type BuiltInPhraseName,
  DEFAULT_STRING_OPTIONS,
  type Phrase,
  builtInPhrase,
  checkPhraseFits,
  checkPhraseFitsGuitar,
  parsePhrase,
} from '../../string/index.js';
import { QuantityError, parseQuantity } from '../../units/index.js';
import { type Wiring, enumerateWirings, findWiring, vocabularyOf } from '../../wiring/index.js';
import { type AlikeOptionText, addAlikeOptions, parseAlikeOptions } from '../alike-options.js';
import { type CircuitOptionText, addCircuitOptions, parseCircuitOptions } from '../circuit-options.js';
import { groupHeadline, renderGroupSummary } from '../group-summary.js';
import { collectOption } from '../collect-option.js';
import type { Io } from '../io.js';
import { renderCsv, renderMarkdownTable } from '../metric-columns.js';
import { createProgress } from '../progress.js';
import { readGuitarFile } from '../read-guitar.js';
import { guardOutputs } from '../guard-outputs.js';
import { readInputText } from '../read-input-file.js';
import { checkWorkSize, estimateRender } from '../estimate-work.js';
import { COILBENCH_VERSION } from '../version.js';
import { appendAll } from '../../math/index.js';
import { type ReportSwitchPosition, escapeMarkdown } from '../../report/index.js';

/** Sample rates a file may be written at, Hz (common practice for audio files). */
export const SAMPLE_RATES_HZ: readonly number[] = Object.freeze([44_100, 48_000, 88_200, 96_000]);
/** Default peak EMF a mains field induces in a nominal coil when hum is mixed in, volts (from memory: a single coil near stage lighting picks up hum some 30–40 dB below a strummed chord). */
export const DEFAULT_HUM_EMF_V = 0.005;
/** Largest hum EMF accepted, volts (a plausibility bound). */
const MAX_HUM_EMF_V = 1;
/** Default sample rate of the files, Hz (the reference render's rate). */
export const DEFAULT_SAMPLE_RATE_HZ = 48_000;
/** Default effects chain: an amplifier-like clean sound, since raw pickup signals mislead on small speakers (common practice). */
export const DEFAULT_CHAIN: ChainName = 'clean';

export interface RenderOptionText extends CircuitOptionText, AlikeOptionText {
  readonly output?: string;
  readonly phrase?: string;
  readonly chain?: string;
  readonly only?: string[];
  readonly rate?: string;
  readonly format?: string;
  readonly level?: string;
  readonly hum?: string;
  readonly humLevel?: string;
  readonly seed?: string;
  readonly force?: boolean;
  /** Start work past the size limit without asking (src/cli/estimate-work.ts). */
  readonly yes?: boolean;
  /** False with --no-wav. */
  readonly wav?: boolean;
}

export function addRenderOptions(command: Command): Command {
  return addAlikeOptions(addCircuitOptions(
    command
      .option('-o, --output <dir>', 'output folder (default renders/<guitar name>)')
      .option('--phrase <phrase>', `what the strings play: ${BUILT_IN_PHRASES.join(', ')} or a phrase file (default strum)`)
      .option('--chain <chain>', `effects chain: ${CHAIN_NAMES.join(', ')} (default ${DEFAULT_CHAIN})`)
      .option('--only <wiring>', 'render only this wiring (an expression like "neck + ~bridge" or a number like w9); repeatable', collectOption)
      .option('--rate <hz>', `sample rate of the files: ${SAMPLE_RATES_HZ.join(', ')} (default ${DEFAULT_SAMPLE_RATE_HZ})`)
      .option('--format <format>', `sample format: ${WAV_FORMATS.join(', ')} (default pcm24)`)
      .option('--level <mode>', 'true: one common gain, levels as the circuit makes them (default); matched: every file at one loudness')
      .option('--hum <hz>', 'mix mains hum at 50 or 60 Hz into every file, through each wiring\'s own hum pickup')
      .option('--hum-level <volts>', `peak hum EMF in a nominal coil with --hum, like "5mV" (default ${DEFAULT_HUM_EMF_V * 1000} mV)`)
      .option('--seed <n>', 'seed of the pluck noise (default 1)')
      .option('--force', 'write into a folder coilbench did not make, replacing only the files coilbench writes (index.html, report.*, wirings.csv, wav/, netlists/)')
      .option('--no-wav', 'write only the listening page, netlists and reports (the page plays every wiring without the WAV files)')
      .option('--yes', 'start even when the render is estimated past 10 minutes or 5 GB'),
  ));
}

export interface ParsedRenderOptions {
  readonly phrase: Phrase;
  readonly chain: ChainName;
  readonly sampleRateHz: number;
  readonly format: WavFormat;
  readonly level: 'true' | 'matched';
  readonly hum: HumMix | null;
  readonly seed: number;
  readonly selected: readonly Wiring[];
  readonly overrides: ReturnType<typeof parseCircuitOptions>;
  readonly thresholds: ReturnType<typeof parseAlikeOptions>;
}

function readPhrase(text: string | undefined, guitar: Guitar, io: Io, problems: InputProblem[]): Phrase | undefined {
  const name = text ?? 'strum';
  if ((BUILT_IN_PHRASES as readonly string[]).includes(name)) return builtInPhrase(name as BuiltInPhraseName, guitar.strings.length);
  const path = resolve(io.cwd, name);
  if (!existsSync(path)) {
    problems.push(problemAt('--phrase', `one of ${BUILT_IN_PHRASES.join(', ')} or an existing phrase file`, name));
    return undefined;
  }
  try {
    const phrase = parsePhrase(readInputText(name, io.cwd, 'phrase file (JSON)'), name, guitar.strings.length);
    checkPhraseFitsGuitar(phrase, guitar, DEFAULT_STRING_OPTIONS.pluckM); // every pluck on its string, before anything is written
    return phrase;
  } catch (error) {
    if (error instanceof InputError) {
      appendAll(problems, error.problems);
      return undefined;
    }
    throw error;
  }
}

/**
 * What would make a render refuse part-way, checked before anything is
 * written: the volume at 0 (every file silent), a note the strings cannot
 * play (the file phrase, and the reference strum every render measures),
 * a cable or knob the circuit does not take.
 */
function refusalsBeforeWriting(guitar: Guitar, phrase: Phrase, overrides: ReturnType<typeof parseCircuitOptions>): InputProblem[] {
  const problems: InputProblem[] = [];
  const collect = (check: () => void): void => {
    try {
      check();
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      for (const problem of error.problems) problems.push(problem);
    }
  };
  collect(() => {
    if (resolveCircuitLoad(guitar, overrides).silent) {
      problems.push(
        problemAt(
          overrides.volumeSetting === undefined ? 'controls.volume.setting' : '--volume',
          'a volume setting above 0 to render (at 0 the wiper shorts the output and every wiring is silent; `analyze` still gives the circuit figures)',
          0,
        ),
      );
    }
  });
  collect(() => checkPhraseFits(guitar, phrase));
  if (phrase.name !== REFERENCE_PHRASE) collect(() => checkPhraseFits(guitar, builtInPhrase(REFERENCE_PHRASE, guitar.strings.length)));
  return problems;
}

/** Validate every render option at once; throws InputError listing each problem. */
export function parseRenderOptions(options: RenderOptionText, guitar: Guitar, all: readonly Wiring[], io: Io): ParsedRenderOptions {
  const problems: InputProblem[] = [];
  const overrides = parseCircuitOptions(options, guitar, problems);
  const thresholds = parseAlikeOptions(options, problems);
  const phrase = readPhrase(options.phrase, guitar, io, problems);
  const chain = (options.chain ?? DEFAULT_CHAIN) as ChainName;
  if (!CHAIN_NAMES.includes(chain)) problems.push(problemAt('--chain', oneOfChoices(options.chain, CHAIN_NAMES), options.chain));
  const sampleRateHz = options.rate === undefined ? DEFAULT_SAMPLE_RATE_HZ : Number(options.rate.replace(/\s*hz$/iu, ''));
  if (!SAMPLE_RATES_HZ.includes(sampleRateHz)) problems.push(problemAt('--rate', `one of ${SAMPLE_RATES_HZ.join(', ')} (Hz)`, options.rate));
  const format = (options.format ?? 'pcm24') as WavFormat;
  if (!WAV_FORMATS.includes(format)) problems.push(problemAt('--format', oneOfChoices(options.format, WAV_FORMATS), options.format));
  const level = options.level ?? 'true';
  if (level !== 'true' && level !== 'matched') problems.push(problemAt('--level', '"true" or "matched"', options.level));
  let hum: HumMix | null = null;
  if (options.hum !== undefined) {
    const mains = options.hum.trim().replace(/\s*hz$/iu, '');
    let emfVolts = DEFAULT_HUM_EMF_V;
    if (options.humLevel !== undefined) {
      try {
        emfVolts = parseQuantity(options.humLevel, 'voltage');
        if (!(emfVolts > 0 && emfVolts <= MAX_HUM_EMF_V)) throw new QuantityError(`a peak hum EMF above 0 and at most ${MAX_HUM_EMF_V} V, like "5mV"`);
      } catch (error) {
        if (!(error instanceof QuantityError)) throw error;
        problems.push(problemAt('--hum-level', error.expected, options.humLevel));
      }
    }
    if (mains === '50' || mains === '60') hum = { mainsHz: Number(mains) as 50 | 60, emfVolts };
    else problems.push(problemAt('--hum', '50 or 60 (hertz)', options.hum));
  } else if (options.humLevel !== undefined) {
    problems.push(problemAt('--hum-level', '--hum 50 or --hum 60 with it', options.humLevel));
  }
  const seed = options.seed === undefined ? 1 : Number(options.seed);
  if (!(Number.isInteger(seed) && seed >= 0 && seed < 2 ** 32)) problems.push(problemAt('--seed', 'a whole number from 0 to 4294967295', options.seed));
  const vocabulary = vocabularyOf(guitar);
  const selected: Wiring[] = [];
  for (const text of options.only ?? []) {
    try {
      const wiring = findWiring(text, all, vocabulary, '--only');
      if (!selected.includes(wiring)) selected.push(wiring);
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
    }
  }
  if (options.output !== undefined && options.output.trim() === '') {
    problems.push(problemAt('--output', 'a folder name (-o . is the working folder)', options.output));
  }
  if (problems.length === 0) appendAll(problems, refusalsBeforeWriting(guitar, phrase as Phrase, overrides));
  if (problems.length > 0) throw new InputError(problems);
  selected.sort((a, b) => a.number - b.number);
  return {
    phrase: phrase as Phrase,
    chain,
    sampleRateHz,
    format,
    level: level as 'true' | 'matched',
    hum,
    seed,
    selected: selected.length > 0 ? selected : all,
    overrides,
    thresholds,
  };
}

/** The files a render reads: the guitar file, and the phrase file when the phrase is not a built-in one. */
export function renderInputs(file: string, phrase: string | undefined): string[] {
  return phrase === undefined || (BUILT_IN_PHRASES as readonly string[]).includes(phrase) ? [file] : [file, phrase];
}

/** Render a guitar file's wirings into a folder and write the reports; returns the outcome for the summary. */
export async function runRender(
  file: string,
  guitar: Guitar,
  options: RenderOptionText,
  io: Io,
  defaultRoot?: string,
  positions?: readonly ReportSwitchPosition[],
): Promise<{ outcome: RenderOutcome; root: string; seconds: number }> {
  const all = enumerateWirings(guitar.elements);
  const parsed = parseRenderOptions(options, guitar, all, io);
  const root = resolve(io.cwd, options.output ?? defaultRoot ?? defaultOutputRoot('.', guitar.name));
  guardOutputs(renderInputs(file, options.phrase), [{ option: options.output === undefined ? 'output folder' : '--output', path: options.output ?? root, kind: 'folder' }], io.cwd);
  const lastNoteS = parsed.phrase.notes.reduce((latest, note) => Math.max(latest, note.timeS), 0);
  const estimate = estimateRender(parsed.selected.length, lastNoteS + RENDER_TAIL_S, parsed.sampleRateHz, parsed.format, parsed.chain, options.wav !== false);
  const big = checkWorkSize(io, 'render', estimate, { yes: options.yes === true, picked: (options.only?.length ?? 0) > 0, where: root });
  const folder = outputFolder(root);
  const claim = claimOutputFolder({
    root,
    shownAs: shownPath(io, root),
    force: options.force === true,
    namedAfterGuitar: options.output === undefined,
    ownNames: ownNamesOf({ ...folder }),
    purpose: {
      guitar: guitar.name,
      guitarFile: file,
      generator: `coilbench ${COILBENCH_VERSION}`,
      settings: renderSettingsRecord(parsed),
    },
    note: (line) => io.stderr(`coilbench: ${line}\n`),
  });
  try {
    const result = await renderIntoFolder(file, guitar, parsed, folder, all, io, options.wav !== false, big, positions);
    claim.finish(listRenderedFiles(folder, result.outcome));
    return { ...result, root };
  } catch (error) {
    claim.abandon();
    throw error;
  }
}

/** The settings a folder's marker records. */
function renderSettingsRecord(parsed: ParsedRenderOptions): Record<string, unknown> {
  return {
    phrase: parsed.phrase.name,
    chain: parsed.chain,
    sampleRateHz: parsed.sampleRateHz,
    format: parsed.format,
    level: parsed.level,
    hum: parsed.hum,
    seed: parsed.seed,
    overrides: parsed.overrides,
    wirings: parsed.selected.length,
  };
}

/** The files of a finished render inside wav/ and netlists/, relative to its folder ("/"-separated). */
export function listRenderedFiles(folder: OutputFolder, outcome: RenderOutcome): string[] {
  const files: string[] = [];
  for (const row of outcome.rows) {
    if (row.wav !== null) files.push(row.wav);
    files.push(relative(folder.root, join(folder.netlistFolder, netlistFileName(row.wiring))).split(sep).join('/'));
  }
  return files;
}

/** How a folder is named in messages: relative to the working folder when inside it. */
export function shownPath(io: Io, root: string): string {
  const nearby = relative(io.cwd, root);
  return nearby === '' ? '.' : nearby.startsWith('..') ? root : nearby;
}

async function renderIntoFolder(
  file: string,
  guitar: Guitar,
  parsed: ParsedRenderOptions,
  folder: OutputFolder,
  all: readonly Wiring[],
  io: Io,
  writeWav: boolean,
  big: boolean,
  positions: readonly ReportSwitchPosition[] | undefined,
): Promise<{ outcome: RenderOutcome; seconds: number }> {
  const progress = createProgress(io, undefined, { plainLines: big });
  const started = performance.now();
  const outcome = await renderGuitar(
    {
      guitar,
      all,
      selected: parsed.selected,
      phrase: parsed.phrase,
      chain: parsed.chain,
      sampleRateHz: parsed.sampleRateHz,
      format: parsed.format,
      level: parsed.level,
      hum: parsed.hum,
      overrides: parsed.overrides,
      seed: parsed.seed,
      folder,
      generator: `coilbench ${COILBENCH_VERSION}`,
      thresholds: parsed.thresholds,
      writeWav,
      ...(positions === undefined ? {} : { positions }),
    },
    { onStage: (stage, total) => progress.stage(stage, total), onStep: (done, total) => progress.step(done, total) },
  );
  const groupOf = new Map(outcome.scope.map((wiring, index) => [wiring.id, outcome.distinct.groups.groupOf[index] ?? null]));
  const tableRows = outcome.rows.map((row) => ({
    wiring: row.wiring,
    circuit: row.circuit,
    audio: { levelDb: row.levelDb, loudnessLufs: row.loudnessLufs, centroidHz: row.centroidHz },
    group: groupOf.get(row.wiring.id) ?? null,
  }));
  await writeFileAtomic(folder.wiringsCsv, renderCsv(tableRows));
  const heading = `# ${escapeMarkdown(guitar.name)}\n\n${describeRenderedCount(outcome.rows.length, all.length)} from ${escapeMarkdown(file)}: phrase ${escapeMarkdown(parsed.phrase.name)}, ${describeChain(parsed.chain)}.\n\n`;
  const caution =
    '\nRenders are models of the circuit and strings: make the final choice by ear on the real instrument. Start playback at a low volume. ' +
    'When you solder, use an iron stand, ventilate and wash your hands afterwards, check continuity with a meter before closing up, and never open an amplifier (its capacitors can hold a lethal charge).\n';
  const groups = `\n${renderGroupSummary(outcome.scope, outcome.distinct, true)}`;
  await writeFileAtomic(folder.reportMarkdown, `${heading}${renderMarkdownTable(tableRows)}${groups}${caution}`);
  progress.finish();
  const seconds = (performance.now() - started) / 1000;
  return { outcome, seconds };
}

/** "47 wirings rendered", or "5 of 47 wirings rendered (groups over all 47)" when only some were. */
export function describeRenderedCount(rendered: number, all: number): string {
  const noun = (count: number): string => `${count} wiring${count === 1 ? '' : 's'}`;
  return rendered === all ? `${noun(rendered)} rendered` : `${rendered} of ${noun(all)} rendered (groups over all ${all})`;
}

/** The summary line and where to look. */
export function reportRender(io: Io, root: string, outcome: RenderOutcome, seconds: number): void {
  const where = shownPath(io, root);
  const count = outcome.rows.length;
  const level =
    outcome.commonGainDb !== null
      ? `true relative level, common gain ${outcome.commonGainDb >= 0 ? '+' : ''}${outcome.commonGainDb.toFixed(1)} dB`
      : `loudness matched at ${outcome.matchedLoudnessLufs?.toFixed(1) ?? '?'} LUFS`;
  const speed = outcome.written > 0 && seconds > 0 ? `, ${(outcome.audioSeconds / seconds).toFixed(0)}× real time` : '';
  if (outcome.rows.every((row) => row.wav === null)) io.stderr(`coilbench: ${count} wirings on the listening page, no WAV files (--no-wav; ${seconds.toFixed(1)} s)\n`);
  else io.stderr(`coilbench: ${describeRenderedCount(count, outcome.distinct.spectra.count)} in ${where}/wav: ${outcome.written} written, ${outcome.skipped} unchanged (${level}; ${seconds.toFixed(1)} s${speed})\n`);
  io.stderr(`coilbench: ${groupHeadline(outcome.distinct.spectra.count, outcome.distinct)}; see "Which wirings sound alike" on the page and in report.md\n`);
  io.stdout(`${where}/index.html\n`);
  io.stderr(`coilbench: open ${where}/index.html in a browser to listen; start at a low volume. Reports: report.md, wirings.csv, report.json; netlists in ${where}/netlists\n`);
}

export function registerRender(program: Command, io: Io): void {
  addRenderOptions(
    program
      .command('render')
      .description('render every wiring (or --only some) into WAV files, reports, netlists and a listening page')
      .argument('<guitar>', 'guitar file (JSON)'),
  ).action(async (file: string, options: RenderOptionText) => {
    const guitar = readGuitarFile(file, io.cwd);
    const { outcome, root, seconds } = await runRender(file, guitar, options, io);
    reportRender(io, root, outcome, seconds);
  });
}

import { dirname, resolve } from 'node:path';
import type { Command } from 'commander';
import {
  type CircuitLoad,
  AUDIO_BAND_HIGH_HZ,
  AUDIO_BAND_LOW_HZ,
  HUM_CANCELLING_DB,
  HUM_FLOOR_DB,
  HUM_REDUCING_DB,
  type CircuitAnalysis,
  prepareCircuitMetrics,
} from '../../circuit/index.js';
import { measureCoilDrive, measureDistinctnessSteps, measureSpectralBasis } from '../../analysis/index.js';
import { InputError, type InputProblem, oneOfChoices, problemAt } from '../../errors/index.js';
import { formatCount, formatEngineering } from '../../units/index.js';
import { iterateWirings, type Wiring } from '../../wiring/index.js';
import { type AlikeOptionText, addAlikeOptions, parseAlikeOptions } from '../alike-options.js';
import { type CircuitOptionText, addCircuitOptions, parseCircuitOptions } from '../circuit-options.js';
import { formatTable } from '../format-table.js';
import { groupsRecord, renderGroupSummary } from '../group-summary.js';
import type { Io } from '../io.js';
import {
  type AnalyzedWiring,
  METRIC_COLUMNS,
  renderCsv,
  renderMarkdownTable,
  sortNames,
  sortRows,
} from '../metric-columns.js';
import { createProgress } from '../progress.js';
import { readGuitarFile } from '../read-guitar.js';
import { findOutputProblems } from '../guard-outputs.js';
import { checkWorkSize, estimateAnalyze } from '../estimate-work.js';
import { wiringCountFor } from '../../guitar/index.js';
import { type AudioMetrics, REFERENCE_PHRASE, figuresThreadPays, measureFiguresOnThread, measureGraphAudio, measureWiringAudio, referLevels } from '../../render/measuring/index.js';
import { createPause, removeStaleTempFiles, runStepsPausing, writeFileAtomicSync } from '../../render/measuring/index.js';
import { wiringRecord } from './wirings.js';
import { collectOption } from '../collect-option.js';
import { networkRow, parseNetworkOptions } from '../network-option.js';
import { appendAll } from '../../math/index.js';
import { writeJson } from '../../report/text/index.js';
import { MAX_WIRINGS_IN_MEMORY, streamAnalysis, streamedAnalysisProblems } from '../stream-analysis.js';

interface AnalyzeOptions extends CircuitOptionText, AlikeOptionText {
  /** false with --no-audio: skip the figures that need each wiring's render. */
  readonly audio?: boolean;
  readonly json?: boolean;
  readonly csv?: string;
  readonly markdown?: boolean;
  readonly sort?: string;
  /** Start work past the size limit without asking. */
  readonly yes?: boolean;
  /** Connection lists (`--network`, repeatable), analysed after the enumerated wirings. */
  readonly network?: readonly string[];
}

const SILENT_NOTE = 'the volume at 0 shorts the output to ground: nothing reaches the amplifier, so every wiring is silent and has no figures';

/** The load actually used, for `--json` (`settings`). */
export function settingsRecord(load: CircuitLoad, points: number): Record<string, unknown> {
  const { volume, tone, trebleBleed } = load;
  return {
    volume: {
      potOhms: volume.potOhms,
      setting: volume.setting,
      taper: volume.taper,
      audioMidpoint: volume.audioMidpoint,
      wiperFraction: volume.wiperFraction,
    },
    tone: tone
      ? {
          potOhms: tone.potOhms,
          setting: tone.setting,
          taper: tone.taper,
          audioMidpoint: tone.audioMidpoint,
          resistanceOhms: tone.resistanceOhms,
          capacitorF: tone.capacitorF,
        }
      : null,
    trebleBleed: trebleBleed
      ? { capacitorF: trebleBleed.capacitorF, resistorOhms: trebleBleed.resistorOhms ?? null, arrangement: trebleBleed.arrangement }
      : null,
    cableCapacitanceF: load.cableCapacitanceF,
    ampResistanceOhms: load.ampResistanceOhms,
    ampCapacitanceF: load.ampCapacitanceF,
    mainsHz: load.mainsHz,
    bandHz: [AUDIO_BAND_LOW_HZ, AUDIO_BAND_HIGH_HZ],
    gridPoints: points,
  };
}

/** One line describing the load in words. */
export function describeLoad(load: CircuitLoad): string {
  const { volume, tone, trebleBleed } = load;
  const parts = [`volume ${formatEngineering(volume.potOhms, 'Ω')} ${volume.taper} at ${volume.setting}`];
  parts.push(tone ? `tone ${formatEngineering(tone.potOhms, 'Ω')} + ${formatEngineering(tone.capacitorF, 'F')} at ${tone.setting}` : 'no tone control');
  if (trebleBleed) parts.push(`treble bleed ${formatEngineering(trebleBleed.capacitorF, 'F')}${trebleBleed.resistorOhms ? ` ${trebleBleed.arrangement} ${formatEngineering(trebleBleed.resistorOhms, 'Ω')}` : ''}`);
  parts.push(`cable ${formatEngineering(load.cableCapacitanceF, 'F')}`);
  parts.push(`amp ${formatEngineering(load.ampResistanceOhms, 'Ω')} with ${formatEngineering(load.ampCapacitanceF, 'F')}`);
  parts.push(`hum at ${load.mainsHz} Hz in a field changing ${load.humGradientPerM} % per cm along the strings`);
  return parts.join(', ');
}

const FOOTNOTES = [
  'resonance: frequency of the loaded peak, 20 Hz-20 kHz ("-" when the response only falls or only rises); peak: its height above 100 Hz;',
  'Q: resonance over its -3 dB bandwidth ("-" when a -3 dB point is outside the band);',
  `hum dB: mains hum relative to the mean single coil that does not cancel hum, in a field with a gradient (never below ${HUM_FLOOR_DB} dB: the model cannot claim more); hum: cancels (${HUM_CANCELLING_DB} dB or less), reduces (${HUM_REDUCING_DB} dB or less) or noisy.`,
  `level: energy of the "${REFERENCE_PHRASE}" phrase through the wiring relative to the mean single coil; LUFS: its ITU-R BS.1770 loudness; centroid: its spectral centroid (higher is brighter).`,
  'A model of the circuit, not a measurement: choose by ear on the real instrument.',
];

const NETWORK_FOOTNOTE = 'n1, n2, ...: the --network connection lists, solved by nodal analysis with the same controls, drive and hum field as the wirings; they are not put in groups.';

export function registerAnalyze(program: Command, io: Io): void {
  const command = program
    .command('analyze')
    .description('every wiring with its loaded resonance, peak, Q, hum, level, brightness and group of alike wirings')
    .argument('<guitar>', 'guitar file (JSON)')
    .option('--json', 'print one JSON document on stdout')
    .option('--csv <file>', 'also write the table as CSV to FILE')
    .option('--markdown', 'print a Markdown table')
    .option('--sort <column>', `order rows by ${sortNames().join('|')} (default id)`)
    .option('--no-audio', 'skip level, loudness and brightness (the figures of the reference phrase)')
    .option('--yes', 'start even when the analysis is estimated past 10 minutes')
    .option(
      '--network <connections>',
      'also analyse this connection of coil leads, e.g. a bridge network, written joint by joint: "neck.finish = hot, neck.start = ground" (repeatable; rows n1, n2, … after the wirings)',
      collectOption,
    );
  addAlikeOptions(addCircuitOptions(command)).action(async (file: string, options: AnalyzeOptions) => {
    const guitar = readGuitarFile(file, io.cwd);
    const problems: InputProblem[] = [];
    const overrides = parseCircuitOptions(options, guitar, problems);
    const thresholds = parseAlikeOptions(options, problems);
    if (options.sort !== undefined && !sortNames().includes(options.sort)) {
      problems.push(problemAt('--sort', oneOfChoices(options.sort, sortNames()), options.sort));
    }
    if (options.json && options.markdown) problems.push(problemAt('--markdown', 'either --json or --markdown, not both', '--json --markdown'));
    if (options.csv !== undefined && options.csv.trim() === '') problems.push(problemAt('--csv', 'a file name', options.csv));
    else if (options.csv !== undefined) appendAll(problems, findOutputProblems([file], [{ option: '--csv', path: options.csv, kind: 'file' }], io.cwd));
    const networks = parseNetworkOptions(guitar, options.network ?? [], problems);
    const total = wiringCountFor(guitar.elements.length);
    const streamed = total > MAX_WIRINGS_IN_MEMORY;
    if (streamed) appendAll(problems, streamedAnalysisProblems(options.audio !== false, options.sort, total));
    if (streamed && networks.length > 0) {
      problems.push(problemAt('--network', `a guitar of at most ${formatCount(MAX_WIRINGS_IN_MEMORY)} wirings (above that analyze streams its rows and takes no connection lists yet)`, `${formatCount(total)} wirings`));
    }
    if (problems.length > 0) throw new InputError(problems);

    const estimate = estimateAnalyze(total, options.audio !== false);
    const big = checkWorkSize(io, options.audio === false ? 'analysis (no audio)' : 'analysis', estimate, { yes: options.yes === true, picked: false });
    if (streamed) {
      const basis = measureSpectralBasis(guitar);
      const circuit = prepareCircuitMetrics(guitar, overrides, { drive: measureCoilDrive(basis) });
      await streamAnalysis({
        io,
        guitar,
        circuit,
        basis,
        overrides,
        total,
        csv: options.csv,
        format: options.json ? 'json' : options.markdown ? 'markdown' : 'table',
        big,
        settings: settingsRecord(circuit.load, circuit.points),
        settingsLine: describeLoad(circuit.load),
        footnotes: FOOTNOTES,
        silentNote: SILENT_NOTE,
      });
      return;
    }
    // Every long step pauses now and then, so Ctrl-C and SIGTERM are answered during the work (pause-for-signals.ts).
    const pause = createPause();
    const wirings: Wiring[] = [];
    for (const wiring of iterateWirings(guitar.elements)) {
      wirings.push(wiring);
      await pause();
    }
    // Many wirings: their audio figures start on a second thread now, while this one measures the circuits.
    const threaded = options.audio !== false && figuresThreadPays(wirings.length);
    const progress = createProgress(io, undefined, { plainLines: big });
    const onStep = (done: number, total: number): void => progress.step(done, total);
    // The thread loads its code while the strings render here, then measures from this basis's coil spectra.
    const pending = threaded ? measureFiguresOnThread(guitar, wirings, overrides, onStep) : null;
    const basis = measureSpectralBasis(guitar);
    pending?.start(basis);
    // The thread reports its progress from now on, while this one measures the circuits and the groups.
    if (pending) progress.stage('measuring', wirings.length);
    await pause();
    const solver = prepareCircuitMetrics(guitar, overrides, { drive: measureCoilDrive(basis) });
    const analysis: CircuitAnalysis = { load: solver.load, silent: solver.silent, points: solver.points, wirings: await runStepsPausing(solver.measureSteps(wirings), pause) };
    let audio: ReadonlyMap<string, AudioMetrics> | undefined;
    const measuresAudio = options.audio !== false && !analysis.silent;
    if (measuresAudio && !pending) progress.stage('measuring', wirings.length);
    // The groups, here while the thread (if any) measures the audio figures: waiting for the thread first left this
    // core idle for the thread's last half (five coils, 9,997 wirings: 8.8 s idle of 20.9 s in a CPU profile).
    const distinct = await runStepsPausing(measureDistinctnessSteps(guitar, wirings, { overrides, thresholds, reuseBasis: basis }), pause);
    if (measuresAudio) {
      // Then this core takes the phase classes the thread has not reached, so neither waits while work is left.
      await pending?.help(basis, pause);
      audio = pending ? referLevels(wirings, await pending.result()) : measureWiringAudio(guitar, wirings, wirings, overrides, onStep, basis);
      progress.finish();
    }
    const unsorted: AnalyzedWiring[] = wirings.map((wiring, index) => ({
      wiring,
      circuit: analysis.wirings[index] as AnalyzedWiring['circuit'],
      audio: audio?.get(wiring.id) ?? null,
      group: distinct.groups.groupOf[index] ?? null,
    }));
    if (networks.length > 0) {
      const graphs = networks.map((network) => network.graph);
      const circuits = solver.measureGraphs(graphs);
      const sounds = options.audio !== false && !analysis.silent ? measureGraphAudio(guitar, wirings, graphs, overrides, basis) : null;
      networks.forEach((network, index) => {
        unsorted.push({
          wiring: networkRow(guitar, network, wirings.length + index + 1, index + 1),
          circuit: circuits[index] as AnalyzedWiring['circuit'],
          audio: sounds?.[index] ?? null,
          group: null,
        });
      });
    }
    const rows = sortRows(unsorted, options.sort ?? 'id');

    if (options.csv !== undefined) {
      const path = resolve(io.cwd, options.csv);
      await removeStaleTempFiles(dirname(path)); // what a killed earlier run may have left
      writeFileAtomicSync(path, renderCsv(rows));
      io.stderr(`coilbench: wrote ${options.csv} (${rows.length} wirings)\n`);
    }
    if (analysis.silent) io.stderr(`coilbench: note: ${SILENT_NOTE}\n`);
    if (options.json) {
      const document: Record<string, unknown> = {
        guitar: guitar.name,
        settings: settingsRecord(analysis.load, analysis.points),
        count: rows.length,
        silent: analysis.silent,
        wirings: rows.map((row) => ({
          ...wiringRecord(row.wiring),
          ...row.circuit,
          levelDb: row.audio?.levelDb ?? null,
          loudnessLufs: row.audio?.loudnessLufs ?? null,
          centroidHz: row.audio?.centroidHz ?? null,
          group: row.group,
        })),
        groups: groupsRecord(wirings, distinct),
      };
      if (analysis.silent) document.note = SILENT_NOTE;
      writeJson(document, io.stdout); // in chunks: a few MB for 9,997 wirings never held as one string
      return;
    }
    const listed = networks.length === 0 ? '' : ` and ${networks.length} connection list${networks.length === 1 ? '' : 's'}`;
    const heading = `${guitar.name}: ${wirings.length} wirings${listed}`;
    const footnotes = networks.length === 0 ? FOOTNOTES : [...FOOTNOTES.slice(0, -1), NETWORK_FOOTNOTE, ...FOOTNOTES.slice(-1)];
    const settings = describeLoad(analysis.load);
    if (options.markdown) {
      const silentLine = analysis.silent ? `\n**Silent:** ${SILENT_NOTE}.\n` : '';
      io.stdout(`## ${heading}\n\n${settings}.\n${silentLine}\n${renderMarkdownTable(rows)}\n${footnotes.join(' ')}\n\n${renderGroupSummary(wirings, distinct, true)}`);
      return;
    }
    io.stdout(`${heading}\n${settings}\n`);
    if (analysis.silent) io.stdout(`Silent: ${SILENT_NOTE}.\n`);
    io.stdout('\n');
    io.stdout(
      formatTable(
        rows,
        METRIC_COLUMNS.filter((column) => column.table).map((column) => ({ title: column.title, value: column.text, align: column.align })),
      ),
    );
    io.stdout(`\n${footnotes.join('\n')}\n\n${renderGroupSummary(wirings, distinct, false)}`);
  });
}

/**
 * The listening page: one self-contained HTML document drawn from a
 * listening report. Pure: no I/O. Text from the guitar file is escaped; the
 * report rides along as JSON in a `<script type="application/json">` with
 * every `<` escaped; style and script are inline and pinned by hash in a
 * Content-Security-Policy that allows scripts only from the page itself and
 * its folder and no connections at all, so the page makes no request outside
 * its folder. Audio comes from `wav/<name>.wav.js` beside the page (see
 * page-audio-file.ts); plots are inline SVG drawn by the page script from the
 * report's numbers.
 */
import { renderPageHead } from './render-page-head.js';
import { RECOMMENDED_ABX_TRIALS } from './abx-settings.js';
import { escapeHtml, serializeJsonForScript } from './escape-html.js';
import type { ListeningReport } from './listening-report.js';
import { PAGE_BLIND_SCRIPT } from './page-blind-script.js';
import { renderGroupsSection } from './page-groups.js';
import { PAGE_LOADER_SCRIPT } from './page-loader-script.js';
import { PAGE_MATH_SCRIPT } from './page-math-script.js';
import { PAGE_PLAYER_SCRIPT } from './page-player-script.js';
import { PAGE_PLOT_SCRIPT } from './page-plot-script.js';
import {
  renderCautionsSection,
  renderGlossarySection,
  renderGuitarSection,
  renderHowSection,
} from './page-sections.js';
import { PAGE_STYLE } from './page-style.js';
import { PAGE_UI_SCRIPT } from './page-ui-script.js';
import { HUM_CANCELLING_DB, HUM_PARTLY_CANCELLING_DB, formatDb } from './page-words.js';
import { renderBrightnessLegend, renderWiringTable } from './wiring-table.js';

/** Playback volume the page starts at, linear (−10.5 dB; start low to protect hearing: common practice). */
export const START_VOLUME = 0.3;

const TOPOLOGY_OPTIONS: ReadonlyArray<readonly [string, string]> = [
  ['single', 'alone'],
  ['series', 'series'],
  ['parallel', 'parallel'],
  ['series-parallel', 'series and parallel'],
];

/** Response curves ride along rounded to 0.01 dB: far finer than a plot shows, and a third of the size (our own choice). */
const RESPONSE_DB_STEP = 0.01;

/** The report as the page script reads it: the same data with response curves rounded. */
export function compactReportForPage(report: ListeningReport): ListeningReport {
  const round = (db: number): number => (Number.isFinite(db) ? Math.round(db / RESPONSE_DB_STEP) * RESPONSE_DB_STEP : db);
  return {
    ...report,
    wirings: report.wirings.map((wiring) => ({ ...wiring, responseDb: wiring.responseDb.map((db) => Number(round(db).toFixed(2))) })),
  };
}

/** Element ids in the order they first appear among the wirings (single coils come first, so declaration order). */
function elementIds(report: ListeningReport): string[] {
  const seen: string[] = [];
  for (const wiring of report.wirings) for (const id of wiring.coils) if (!seen.includes(id)) seen.push(id);
  return seen;
}

function renderFilters(report: ListeningReport): string {
  const ids = elementIds(report);
  const coilSelects = ids
    .map(
      (id) =>
        `<label class="coil-filter"><span>${escapeHtml(id)}</span><select data-filter-coil="${escapeHtml(id)}">` +
        '<option value="any">either</option><option value="used">used</option><option value="unused">not used</option></select></label>',
    )
    .join('');
  const counts = Array.from({ length: ids.length }, (_, index) => index + 1)
    .map((count) => `<option value="${count}">${count}</option>`)
    .join('');
  const topologies = TOPOLOGY_OPTIONS.map(([value, words]) => `<option value="${value}">${escapeHtml(words)}</option>`).join('');
  return (
    '<form id="filters" class="filters" aria-label="Filter the wirings">' +
    `<fieldset class="coils-used"><legend>Coils used</legend>${coilSelects}</fieldset>` +
    `<label>How many coils <select id="filter-count"><option value="any">any</option>${counts}</select></label>` +
    `<label>Joined <select id="filter-topology"><option value="any">any way</option>${topologies}</select></label>` +
    '<label>Phase <select id="filter-phase"><option value="any">any</option><option value="in">all in phase</option><option value="out">some out of phase</option></select></label>' +
    '<label class="check"><input type="checkbox" id="filter-quiet"> Quiet only (hum cancelling)</label>' +
    '<button type="button" data-action="reset-filters">Show all</button>' +
    `<output id="shown-count" aria-live="polite">Showing ${report.wirings.length} of ${report.wirings.length}</output>` +
    '</form>'
  );
}

/**
 * The player bar shared by coilbench's pages: play button, what is playing,
 * position, time, then `extra` controls (the listening page's loop), the
 * level-match switch and the volume.
 */
export function renderTransport(durationS: number, prompt: string, extra = ''): string {
  const duration = durationS.toFixed(2);
  return (
    '<div id="transport" class="transport" role="region" aria-label="Player">' +
    '<button type="button" id="transport-play" class="big-play" data-action="toggle" aria-label="Play" disabled><span aria-hidden="true" class="play-icon"></span></button>' +
    `<div class="now"><span id="now-label">${prompt}</span><span id="now-detail"></span></div>` +
    `<label class="scrub"><span class="visually-hidden">Position in the phrase</span><input type="range" id="scrub" min="0" max="${duration}" step="0.01" value="0"></label>` +
    `<output id="time" aria-live="off">0.00 s / ${duration} s</output>` +
    extra +
    '<label class="check level-switch"><input type="checkbox" id="match-level" data-action="level-mode" checked> Level matched</label>' +
    `<label class="volume">Volume <input type="range" id="volume" min="0" max="1" step="0.01" value="${START_VOLUME}"></label>` +
    '<output id="level-note" class="level-note"></output>' +
    '</div>'
  );
}

/** The loop controls of the listening page's player bar. */
function renderLoopControls(durationS: number): string {
  const duration = durationS.toFixed(2);
  return (
    '<fieldset class="loop"><legend class="visually-hidden">Loop a region</legend>' +
    '<label class="check"><input type="checkbox" id="loop-on" data-action="loop"> Loop</label>' +
    `<label>from <input type="number" id="loop-start" min="0" max="${duration}" step="0.1" value="0"> s</label>` +
    `<label>to <input type="number" id="loop-end" min="0" max="${duration}" step="0.1" value="${duration}"> s</label>` +
    '<button type="button" data-action="loop-start-here" title="Loop from the current position">from here</button>' +
    '<button type="button" data-action="loop-end-here" title="Loop up to the current position">to here</button>' +
    '</fieldset>'
  );
}

function renderPlotSection(): string {
  return (
    '<section id="response" aria-labelledby="response-title"><h2 id="response-title">Frequency response</h2>' +
    '<p>Tick <strong>Plot</strong> on any rows to overlay their responses: how strongly each wiring passes each frequency, from the coils to the amplifier input, relative to 100 Hz. The dot on each curve is its resonant peak. Point at the plot, or focus it and use the arrow keys, to read values.</p>' +
    '<div class="plot-wrap"><svg id="response-plot" viewBox="0 0 760 340" role="img" tabindex="0" aria-labelledby="response-title plot-readout"></svg></div>' +
    '<p id="plot-readout" class="readout" aria-live="polite">No wiring plotted yet.</p>' +
    '<ul id="plot-legend" class="legend"></ul>' +
    '<button type="button" data-action="clear-plot">Clear the plot</button>' +
    '</section>'
  );
}

function renderBlindSection(report: ListeningReport): string {
  return renderBlindTestSection(
    report.wirings.map((wiring) => ({ id: wiring.id, label: `${wiring.id} · ${wiring.description}` })),
    'Choose two wirings. Each trial plays X, secretly one of A or B, at matched level; listen to A, B and X as often as you like, switching at the same point in the phrase, then say which one X is. ',
  );
}

/**
 * The blind-test section, the markup the blind-test script drives (its ids
 * and data-action hooks), offering `choices` for A and B. `introText` is
 * plain text (escaped here). Shared by the listening and comparison pages.
 */
export function renderBlindTestSection(choices: ReadonlyArray<{ readonly id: string; readonly label: string }>, introText: string): string {
  const options = choices.map((choice) => `<option value="${escapeHtml(choice.id)}">${escapeHtml(choice.label)}</option>`).join('');
  return (
    '<section id="blind" aria-labelledby="blind-title"><h2 id="blind-title">Blind test: can you really hear the difference?</h2>' +
    `<p>${escapeHtml(introText)}` +
    `Do <strong>at least ${RECOMMENDED_ABX_TRIALS} trials</strong>: guessing gets about half right, and the page shows how likely your score would be by guessing alone.</p>` +
    '<div class="abx-pick">' +
    `<label>A <select id="abx-a">${options}</select></label>` +
    `<label>B <select id="abx-b">${options}</select></label>` +
    '<button type="button" data-action="abx-start">Start a blind test</button></div>' +
    '<div id="abx-trial" class="abx-trial" hidden>' +
    '<p id="abx-status" aria-live="polite"></p>' +
    '<div class="abx-listen" role="group" aria-label="Listen">' +
    '<button type="button" data-action="abx-play-a">Play A</button>' +
    '<button type="button" data-action="abx-play-b">Play B</button>' +
    '<button type="button" data-action="abx-play-x">Play X</button>' +
    '<button type="button" data-action="abx-stop">Stop</button></div>' +
    '<div class="abx-answer" role="group" aria-label="Answer">' +
    '<button type="button" data-action="abx-answer-a">X is A</button>' +
    '<button type="button" data-action="abx-answer-b">X is B</button></div>' +
    '<button type="button" data-action="abx-end">End the test and show the answers</button>' +
    '</div>' +
    '<p id="abx-score" class="score" aria-live="polite"></p>' +
    '<ol id="abx-log" class="abx-log"></ol>' +
    '</section>'
  );
}

function renderColumnHelp(report: ListeningReport): string {
  return (
    '<details class="help"><summary>What the columns mean</summary>' +
    '<dl>' +
    '<dt>Level</dt><dd>How loud the wiring is at true level, compared with the average single coil (0 dB). Playback is level matched unless you untick <em>Level matched</em>, so you compare the sound, not the loudness.</dd>' +
    `<dt>Brightness</dt><dd>${renderBrightnessLegend(report)}</dd>` +
    '<dt>Resonant peak</dt><dd>Where the circuit boosts most, and how much above 100 Hz. Words after H. Lemme: about 2 kHz warm, 3 kHz present, 4 kHz piercing, 5 kHz and above brittle.</dd>' +
    `<dt>Hum</dt><dd>Mains hum compared with the average single coil. <em>Quiet (hum cancelling)</em>: ${formatDb(HUM_CANCELLING_DB, 0)} or less; <em>less hum</em>: ${formatDb(HUM_PARTLY_CANCELLING_DB, 0)} or less; <em>noisy</em>: more.</dd>` +
    '</dl></details>'
  );
}

/** The listening page for a report, as one HTML document. */
export function renderListeningPage(report: ListeningReport): string {
  const script = ["'use strict';", PAGE_MATH_SCRIPT, PAGE_LOADER_SCRIPT, PAGE_PLAYER_SCRIPT, PAGE_PLOT_SCRIPT, PAGE_BLIND_SCRIPT, PAGE_UI_SCRIPT].join('\n');
  const { guitar, render, wirings } = report;
  const name = escapeHtml(guitar.name);
  const quiet = wirings.filter((wiring) => wiring.humCancelling).length;
  return `${renderPageHead({ title: `${guitar.name} · listen to every wiring`, script, style: PAGE_STYLE, generator: report.generator })}
<a class="skip" href="#wirings">Skip to the wirings</a>
<header class="masthead">
<p class="kicker">coilbench listening page</p>
<h1 id="guitar-name">${name}</h1>
<p class="lede">${wirings.length} ways to connect this guitar's coils, each rendered from the same playing (${escapeHtml(render.phrase)}, ${escapeHtml(render.chain)} chain). ${quiet} of them cancel hum.</p>
<p class="warn-volume">Turn your speakers or headphones down before you press play.</p>
</header>
<noscript><p class="noscript">Playing, sorting, filtering, the plot and the blind test need JavaScript; the table and notes below work without it.</p></noscript>
<main>
<section id="start" class="start" aria-labelledby="start-title">
<h2 id="start-title">Start here</h2>
<ol>
<li><strong>Find the quiet ones.</strong> <button type="button" data-action="quiet-only">Show only quiet wirings</button> (they cancel mains hum).</li>
<li><strong>Hear two back to back.</strong> Press ▶ on one row, then ▶ on another while it plays: the sound switches at the same point in the phrase, at the same loudness. Arrow keys ↑ ↓ step through the rows; Space plays and pauses.</li>
<li><strong>See which is brighter.</strong> The <em>Brightness</em> column says it in words and as a bar: the longer bar is the brighter sound.</li>
</ol>
</section>
<section id="wirings" aria-labelledby="wirings-title">
<h2 id="wirings-title">Every wiring</h2>
${renderFilters(report)}
${renderColumnHelp(report)}
<div class="scroll table-wrap">
${renderWiringTable(report)}
</div>
</section>
${renderGroupsSection(report)}
${renderPlotSection()}
${renderBlindSection(report)}
${renderGuitarSection(report)}
${renderHowSection(report)}
${renderGlossarySection()}
${renderCautionsSection()}
</main>
<footer class="footer"><p>Made with coilbench. Renders are models: make the final choice by ear on the real instrument.</p></footer>
${renderTransport(report.render.durationS, 'Press ▶ on any row to listen', renderLoopControls(report.render.durationS))}
<script type="application/json" id="report-data">${serializeJsonForScript(compactReportForPage(report))}</script>
<script>${script}</script>
</body>
</html>
`;
}

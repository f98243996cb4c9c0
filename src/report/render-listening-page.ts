/**
 * The listening page: one self-contained HTML document drawn from a
 * listening report and the page data (the guitar, the knob settings and
 * each coil's signal for the rendered phrase). Pure: no I/O. Text from the
 * guitar file is escaped; the data rides along as JSON in a
 * `<script type="application/json">` with every `<` escaped; the style and
 * the one script (the bundle of src/page, passed in) are inline and pinned by
 * hash in a Content-Security-Policy that allows no connections at all, so the
 * page makes no request outside its folder and works from file://. The page
 * synthesises any wiring itself, so its size grows with the number of coils,
 * not of wirings.
 */
import { renderPageHead } from './render-page-head.js';
import { escapeHtml, serializeJsonForScript } from './escape-html.js';
import type { ListeningReport } from './listening-report.js';
import { renderGroupsSection } from './page-groups.js';
import {
  renderCautionsSection,
  renderGlossarySection,
  renderGuitarSection,
  renderHowSection,
} from './page-sections.js';
import { PAGE_STYLE } from './page-style.js';
import { HUM_CANCELLING_DB, HUM_PARTLY_CANCELLING_DB, formatDb } from '../page/index.js';
import { renderBrightnessLegend } from './wiring-table.js';
import { PAGE_LIST_STYLE } from './page-list-style.js';
import { SUGGESTED_ROUNDS, loopsByDefault } from '../page/index.js';
import { type PageData, encodeWiringFigures } from '../page/index.js';
import type { CircuitOverrides } from '../circuit/index.js';
import type { Guitar } from '../guitar/index.js';

/** Playback volume the page starts at, linear (−10.5 dB; start low to protect hearing: common practice). */
export const START_VOLUME = 0.3;

/** Tone capacitor field step, nF, and cable field step, pF (our choice: finer than parts are sold in). */
const CAPACITOR_STEP_NF = 1;
const CABLE_STEP_PF = 50;
/** Range of the cable field, pF (the circuit's accepted 1 pF–20 nF). */
const CABLE_MIN_PF = 1;
const CABLE_MAX_PF = 20_000;
const FARADS_PER_NF = 1e-9;
const FARADS_PER_PF = 1e-12;

/**
 * The knobs: volume and tone positions, tone capacitor, cable and chain, each applied while playing, shown at
 * `guitar`'s settings with `overrides` (the listening page's guitar; on the comparison page, the baseline set's,
 * applied to every set; src/page/knob-fields.ts reads them).
 */
export function renderKnobs(guitar: Guitar, overrides: CircuitOverrides, chain: string): string {
  const volume = overrides.volumeSetting ?? guitar.controls.volume.setting;
  const tone = guitar.controls.tone;
  const cablePf = Math.round((overrides.cableCapacitanceF ?? guitar.cable.capacitanceF) / FARADS_PER_PF);
  const toneFields = tone
    ? `<label>Tone <input type="range" id="knob-tone" min="0" max="10" step="0.5" value="${overrides.toneSetting ?? tone.setting}"> <output id="knob-tone-value">${(overrides.toneSetting ?? tone.setting).toFixed(1)}</output></label>` +
      `<label>Tone capacitor <input type="number" id="knob-tone-capacitor" min="1" max="1000" step="${CAPACITOR_STEP_NF}" value="${Number((tone.capacitorF / FARADS_PER_NF).toPrecision(4))}"> nF</label>`
    : '';
  return (
    '<form id="knobs" class="knobs" aria-label="Knobs and amplifier">' +
    `<label>Volume <input type="range" id="knob-volume" min="0.5" max="10" step="0.5" value="${volume}"> <output id="knob-volume-value">${volume.toFixed(1)}</output></label>` +
    toneFields +
    `<label>Cable <input type="number" id="knob-cable" min="${CABLE_MIN_PF}" max="${CABLE_MAX_PF}" step="${CABLE_STEP_PF}" value="${cablePf}"> pF</label>` +
    `<label>Amplifier <select id="knob-chain" data-chain="${escapeHtml(chain)}"></select></label>` +
    '</form>'
  );
}

/** Search, and an expression to play. */
function renderFinder(report: ListeningReport, data: Omit<PageData, 'opening'>): string {
  const ids = data.guitar.elements.map((element) => element.id);
  const [first, second] = [ids[0] ?? 'neck', ids[ids.length - 1] ?? 'bridge'];
  return (
    '<div class="finder">' +
    `<label class="search">Find <input type="search" id="search" placeholder="${escapeHtml(`${first}, parallel, quiet …`)}" autocomplete="off"></label>` +
    `<output id="shown-count" aria-live="polite">Showing ${report.wirings.length}</output>` +
    '<form id="expression-form" class="expression">' +
    `<label>Play an expression <input type="text" id="expression-input" placeholder="${escapeHtml(`${first} + ~${second}`)}" autocomplete="off" spellcheck="false"></label>` +
    '<button type="submit">Play it</button> <output id="expression-message" aria-live="polite"></output></form>' +
    '</div>'
  );
}

/**
 * The player bar shared by coilbench's pages: play button, what is playing,
 * position, time, then `extra` controls (the listening page's loop), the
 * level-match switch and the volume.
 */
export function renderTransport(durationS: number, prompt: string, extra = '', withDownload = false): string {
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
    (withDownload ? '<button type="button" id="download" title="Save the wiring playing, at these knob settings, as a WAV file">Download WAV</button>' : '') +
    '</div>'
  );
}

/** The loop controls of the listening page's player bar. */
function renderLoopControls(durationS: number): string {
  const duration = durationS.toFixed(2);
  const checked = loopsByDefault(durationS) ? ' checked' : '';
  return (
    '<fieldset class="loop"><legend class="visually-hidden">Loop a region</legend>' +
    `<label class="check"><input type="checkbox" id="loop-on" data-action="loop"${checked}> Loop</label>` +
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
    '<p>Tick <strong>plot</strong> on any rows to overlay their responses at the knobs\' settings: how strongly each wiring passes each frequency, from the coils to the amplifier input, relative to 100 Hz. The dot on each curve is its resonant peak. Point at the plot, or focus it and use the arrow keys, to read values.</p>' +
    '<div class="plot-wrap"><svg id="response-plot" viewBox="0 0 760 340" role="img" tabindex="0" aria-labelledby="response-title plot-readout"></svg></div>' +
    '<p id="plot-readout" class="readout" aria-live="polite">No wiring plotted yet.</p>' +
    '<ul id="plot-legend" class="legend"></ul>' +
    '<button type="button" data-action="clear-plot">Clear the plot</button>' +
    '</section>'
  );
}

/**
 * The blind test's section, the markup src/page/blind-test.ts drives (its ids
 * and data-action hooks). `intro` is plain text (escaped here); `choices`
 * fill the two pickers (the listening page fills them itself when none are given).
 * Shared by the listening and comparison pages.
 */
export function renderBlindSection(
  intro = 'Pick two wirings (the ones you plotted are offered, and every single coil). ',
  choices: ReadonlyArray<{ readonly id: string; readonly label: string }> = [],
  what = 'wiring',
): string {
  const options = choices.map((choice) => `<option value="${escapeHtml(choice.id)}">${escapeHtml(choice.label)}</option>`).join('');
  return (
    '<section id="blind" aria-labelledby="blind-title"><h2 id="blind-title">Blind test: is the difference real to your ears?</h2>' +
    `<p>${escapeHtml(intro)}Each round, the page hides one of them as the <em>mystery sound</em>. Hear the first, the second and the mystery as often as you like, always at matched level and at the same place in the phrase, then say which one the mystery is. ` +
    `The tally says how often a coin would do as well; give it <strong>${SUGGESTED_ROUNDS} rounds or more</strong>. (The method is the ABX test.)</p>` +
    `<div class="blind-pick"><label>First ${what} <select id="blind-first">${options}</select></label>` +
    `<label>Second ${what} <select id="blind-second">${options}</select></label>` +
    '<button type="button" data-action="blind-start">Begin</button></div>' +
    '<div id="blind-rounds" class="blind-rounds" hidden>' +
    '<p id="blind-round" aria-live="polite"></p>' +
    '<div class="blind-hear" role="group" aria-label="Hear">' +
    '<button type="button" data-action="blind-hear-first">Hear the first</button>' +
    '<button type="button" data-action="blind-hear-second">Hear the second</button>' +
    '<button type="button" data-action="blind-hear-mystery">Hear the mystery</button>' +
    '<button type="button" data-action="blind-silence">Silence</button></div>' +
    '<div class="blind-name" role="group" aria-label="Name the mystery">' +
    '<button type="button" data-action="blind-is-first">The mystery is the first</button>' +
    '<button type="button" data-action="blind-is-second">The mystery is the second</button></div>' +
    '<button type="button" data-action="blind-finish">Finish and reveal the answers</button>' +
    '</div>' +
    '<p id="blind-tally" class="score" aria-live="polite"></p>' +
    '<ol id="blind-answers" class="blind-answers"></ol>' +
    '</section>'
  );
}

function renderColumnHelp(report: ListeningReport): string {
  return (
    '<details class="help"><summary>What the columns mean</summary>' +
    '<dl>' +
    '<dt>Level</dt><dd>How loud the wiring is at true level, compared with the average single coil (0 dB), at the render\'s settings. Playback is level matched unless you untick <em>Level matched</em>: each render is measured as it plays (knobs and amplifier included) and brought to one loudness, so you compare the sound, not the loudness.</dd>' +
    `<dt>Brightness</dt><dd>${renderBrightnessLegend(report)}</dd>` +
    '<dt>Resonant peak</dt><dd>Where the circuit boosts most, and how many dB above its response at 100 Hz. Where the wiring sits between dark and bright is said once, by the Brightness column.</dd>' +
    `<dt>Hum</dt><dd>Mains hum compared with the average single coil. <em>Quiet (hum cancelling)</em>: ${formatDb(HUM_CANCELLING_DB, 0)} or less; <em>less hum</em>: ${formatDb(HUM_PARTLY_CANCELLING_DB, 0)} or less; <em>noisy</em>: more.</dd>` +
    '</dl></details>'
  );
}

/**
 * A switch plan's positions in position order (`switch --render`): each labelled "position N:
 * wiring", with its wiring's row number and WAV file; empty for an ordinary render.
 */
function renderPositionsSection(report: ListeningReport): string {
  const positions = report.positions;
  if (positions === undefined || positions.length === 0) return '';
  const byId = new Map(report.wirings.map((wiring) => [wiring.id, wiring]));
  const items = positions.map((position) => {
    const wiring = position.wiringId === null ? undefined : byId.get(position.wiringId);
    const file = wiring?.wav ? ` · <a href="${escapeHtml(wiring.wav)}">${escapeHtml(wiring.wav)}</a>` : '';
    const detail = wiring ? ` <span class="position-detail">(${escapeHtml(wiring.id)}, ${escapeHtml(wiring.description)})${file}</span>` : ' <span class="position-detail">(no coil connected)</span>';
    return `<li data-position="${position.position}"><strong>${escapeHtml(position.label)}</strong>${detail}</li>`;
  });
  return `<section id="positions" aria-labelledby="positions-title">
<h2 id="positions-title">Switch positions</h2>
<p>The switch plan's positions in order, each with the wiring it gives. In the list below, each row names the positions that give its wiring.</p>
<ol class="switch-positions">
${items.join('\n')}
</ol>
</section>`;
}

/** The listening page for a report, as one HTML document: `data` is what the page plays from, `script` the bundled page script (dist/page.js). */
export function renderListeningPage(report: ListeningReport, data: Omit<PageData, 'report' | 'opening'>, script: string): string {
  const { guitar, render } = report;
  const name = escapeHtml(guitar.name);
  const durationS = data.coils.length / data.coils.sampleRateHz;
  const style = `${PAGE_STYLE}${PAGE_LIST_STYLE}`;
  const switched = report.positions !== undefined && report.positions.length > 0;
  // The wiring that sounds first: position 1's on a switch plan's page, else the report's first.
  const firstPosition = switched ? report.positions?.find((position) => position.wiringId !== null) : undefined;
  const first = (firstPosition ? report.wirings.find((wiring) => wiring.id === firstPosition.wiringId) : undefined) ?? report.wirings[0];
  // The page's script reads neither the wirings (carried apart, as columns, after the script) nor the groups (drawn
  // here, as markup), nor response curves (it computes each from the circuit at the knobs' settings).
  const { groups: _groups, ...carried } = report;
  const pageData: PageData = { ...data, report: { ...carried, wirings: [] }, opening: first ? { expression: first.expression, number: first.number } : null };
  return `${renderPageHead({ title: `${guitar.name} · ${switched ? 'listen to the switch positions' : 'listen to every wiring'}`, script, style, generator: report.generator })}
<a class="skip" href="#wirings">Skip to the wirings</a>
<header class="masthead">
<p class="kicker">coilbench listening page</p>
<h1 id="guitar-name">${name}</h1>
<p class="lede">Every way to connect this guitar's coils, played live from the same performance (${escapeHtml(render.phrase)}): choose any wiring, turn the knobs, change the amplifier, and hear it at once.</p>
<p class="warn-volume">Turn your speakers or headphones down before you press play.</p>
</header>
<noscript><p class="noscript">This page makes its sound with JavaScript; the notes below work without it, and the WAV files beside it (when written) play anywhere.</p></noscript>
<main>
<section id="start" class="start" aria-labelledby="start-title">
<h2 id="start-title">Start here</h2>
<ol>
<li><strong>Hear two back to back.</strong> Press ▶ on one row, then ▶ on another while it plays: the sound switches at the same point in the phrase, at the same loudness. Arrow keys ↑ ↓ step through the rows; Space plays and pauses.</li>
<li><strong>Turn the knobs.</strong> Volume, tone, tone capacitor, cable and amplifier change the sound while it plays.</li>
<li><strong>Find one.</strong> Type words, a coil's name or an expression in <em>Find</em>, or type an expression such as <code>${escapeHtml(exampleExpression(data))}</code> and press <em>Play it</em>.</li>
</ol>
</section>
${renderPositionsSection(report)}
<section id="wirings" aria-labelledby="wirings-title">
<h2 id="wirings-title">${switched ? 'The positions\' wirings' : 'Every wiring'}</h2>
${renderKnobs(data.guitar, data.overrides, report.render.chain)}
${renderFinder(report, { ...data, report })}
${renderColumnHelp(report)}
<div class="list-head" aria-hidden="true"><span></span><span>No.</span><span>Wiring</span><span>In words</span><span>Level</span><span>Brightness</span><span>Resonant peak</span><span>Hum</span><span></span></div>
<div id="wiring-list" class="wiring-list" role="list" aria-label="Wirings" tabindex="0"></div>
</section>
${renderGroupsSection(report)}
${renderPlotSection()}
${renderBlindSection()}
${renderGuitarSection(report)}
${renderHowSection(report)}
${renderGlossarySection(data.guitar.elements.map((element) => element.id))}
${renderCautionsSection()}
</main>
<footer class="footer"><p>Made with coilbench. Renders are models: make the final choice by ear on the real instrument.</p></footer>
${renderTransport(durationS, 'Press ▶ on any row to listen', renderLoopControls(durationS), true)}
<script type="application/json" id="page-data">${serializeJsonForScript(pageData)}</script>
<script>${script}</script>
<script type="application/json" id="page-wirings">${serializeJsonForScript(encodeWiringFigures(report.wirings))}</script>
</body>
</html>
`;
}

/** An expression in the guitar's own coil names for the examples ("neck + ~bridge"). */
function exampleExpression(data: Pick<PageData, 'guitar'>): string {
  const ids = data.guitar.elements.map((element) => element.id);
  if (ids.length < 2) return ids[0] ?? '';
  return `${ids[0]} + ~${ids[ids.length - 1]}`;
}

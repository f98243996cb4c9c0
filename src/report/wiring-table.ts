/**
 * The table of wirings on the listening page: one row per wiring with plain
 * words first and the numbers beside them. Rows carry `data-wiring="<id>"`
 * and their play button `data-action="play"` (stable hooks for tests).
 */
import type { ListeningReport, ReportWiring } from './listening-report.js';
import { escapeHtml } from './escape-html.js';
import { isInsideFolder } from './inside-folder.js';
import {
  type BrightnessScale,
  HUM_VERDICT_WORDS,
  brightnessScale,
  formatDb,
  formatHumDb,
  formatHz,
  humVerdict,
  describePeak,
  topologyInWords,
} from '../page/index.js';

/** Width of the brightness bar, SVG user units (px). */
const BAR_WIDTH = 64;
const BAR_HEIGHT = 8;

/** Sortable columns: key used by the page script, heading, and what the heading's help says. */
export const WIRING_COLUMNS: ReadonlyArray<{ readonly key: string; readonly heading: string; readonly sortable: boolean }> =
  Object.freeze([
    { key: 'number', heading: 'No.', sortable: true },
    { key: 'play', heading: 'Listen', sortable: false },
    { key: 'compare', heading: 'Plot', sortable: false },
    { key: 'description', heading: 'Wiring', sortable: true },
    { key: 'coils', heading: 'Coils', sortable: true },
    { key: 'topology', heading: 'Joined', sortable: true },
    { key: 'phase', heading: 'Phase', sortable: true },
    { key: 'level', heading: 'Level', sortable: true },
    { key: 'brightness', heading: 'Brightness', sortable: true },
    { key: 'peak', heading: 'Resonant peak', sortable: true },
    { key: 'hum', heading: 'Hum', sortable: true },
  ]);

function brightnessCell(wiring: ReportWiring, scale: BrightnessScale): string {
  const width = Math.max(2, Math.round(scale.fraction(wiring.centroidHz) * BAR_WIDTH));
  return (
    `<td class="bright"><span class="word">${escapeHtml(scale.word(wiring.centroidHz))}</span>` +
    `<svg class="bar" width="${BAR_WIDTH}" height="${BAR_HEIGHT}" viewBox="0 0 ${BAR_WIDTH} ${BAR_HEIGHT}" aria-hidden="true" focusable="false">` +
    `<rect class="bar-back" width="${BAR_WIDTH}" height="${BAR_HEIGHT}" rx="2"></rect>` +
    `<rect class="bar-fill" width="${width}" height="${BAR_HEIGHT}" rx="2"></rect></svg>` +
    `<span class="figure">${escapeHtml(formatHz(wiring.centroidHz))}</span></td>`
  );
}

function peakCell(wiring: ReportWiring): string {
  if (wiring.resonanceHz === null || !Number.isFinite(wiring.resonanceHz)) {
    return '<td class="peak"><span class="word">no clear peak</span></td>';
  }
  return (
    `<td class="peak"><span class="figure">${escapeHtml(formatHz(wiring.resonanceHz))}</span>` +
    `<span class="word">${escapeHtml(describePeak(wiring.resonanceHz, wiring.peakDb))}</span></td>`
  );
}

function humCell(wiring: ReportWiring): string {
  const verdict = humVerdict(wiring.humDb, wiring.humCancelling);
  const [mark, words] = HUM_VERDICT_WORDS[verdict];
  const figure = words === '' ? formatHumDb(wiring.humDb) : `${words} ${formatHumDb(wiring.humDb)}`;
  return (
    `<td class="hum"><span class="hum-mark hum-${verdict}"><span class="dot" aria-hidden="true"></span>${escapeHtml(mark)}</span>` +
    `<span class="figure">${escapeHtml(figure)}</span></td>`
  );
}

function phaseCell(wiring: ReportWiring): string {
  if (wiring.outOfPhase.length === 0) return '<td class="phase"><span class="word">in phase</span></td>';
  return `<td class="phase"><span class="word">out of phase</span><span class="figure">${escapeHtml(wiring.outOfPhase.join(', '))}</span></td>`;
}

function wiringRow(wiring: ReportWiring, scale: BrightnessScale): string {
  const id = escapeHtml(wiring.id);
  const description = escapeHtml(wiring.description);
  const playable = isInsideFolder(wiring.wav);
  const play = playable
    ? `<button type="button" class="play" data-action="play" aria-pressed="false" aria-label="Play ${id}: ${description}"><span aria-hidden="true" class="play-icon"></span></button>`
    : `<button type="button" class="play" data-action="play" disabled aria-label="${id} was not rendered"><span aria-hidden="true" class="play-icon"></span></button>`;
  const download = playable ? ` <a class="wav-link" href="${escapeHtml(wiring.wav ?? '')}" download>WAV</a>` : '';
  return (
    `<tr data-wiring="${id}">` +
    `<td class="number">${escapeHtml(String(wiring.number))}</td>` +
    `<td class="listen">${play}</td>` +
    `<td class="compare"><input type="checkbox" data-action="compare" aria-label="Plot ${id} in the frequency response"></td>` +
    `<td class="wiring"><span class="description">${description}</span>` +
    `<span class="expression"><code>${escapeHtml(wiring.expression)}</code> <span class="id">${id}</span>${download}</span></td>` +
    `<td class="coils">${escapeHtml(String(wiring.coils.length))}</td>` +
    `<td class="topology">${escapeHtml(topologyInWords(wiring.topology))}</td>` +
    phaseCell(wiring) +
    `<td class="level">${escapeHtml(formatDb(wiring.levelDb))}</td>` +
    brightnessCell(wiring, scale) +
    peakCell(wiring) +
    humCell(wiring) +
    '</tr>'
  );
}

/** The `<table>` of every wiring, in report order. */
export function renderWiringTable(report: ListeningReport): string {
  const scale = brightnessScale(report.wirings.map((wiring) => wiring.centroidHz));
  const headings = WIRING_COLUMNS.map((column) => {
    if (!column.sortable) return `<th scope="col" class="col-${column.key}">${escapeHtml(column.heading)}</th>`;
    const sorted = column.key === 'number' ? ' aria-sort="ascending"' : '';
    return (
      `<th scope="col" class="col-${column.key}"${sorted}><button type="button" data-sort="${column.key}">` +
      `${escapeHtml(column.heading)}<span class="sort-mark" aria-hidden="true"></span></button></th>`
    );
  }).join('');
  const rows = report.wirings.map((wiring) => wiringRow(wiring, scale)).join('\n');
  return (
    '<table id="wiring-table" class="wirings">' +
    '<caption class="visually-hidden">Every wiring of this guitar. Choose a column heading to sort.</caption>' +
    `<thead><tr>${headings}</tr></thead>\n<tbody>\n${rows}\n</tbody></table>`
  );
}

/** The legend tying brightness words to this guitar's centroid figures. */
export function renderBrightnessLegend(report: ListeningReport): string {
  const scale = brightnessScale(report.wirings.map((wiring) => wiring.centroidHz));
  const bands = scale.bands
    .map(([word, lowHz, highHz]) => {
      const range =
        lowHz === null ? `below ${formatHz(highHz)}` : highHz === null ? `${formatHz(lowHz)} and above` : `${formatHz(lowHz)} to ${formatHz(highHz)}`;
      return `<li><strong>${escapeHtml(word)}</strong>: ${escapeHtml(range)}</li>`;
    })
    .join('');
  return (
    `<p>Brightness is the balance point of each render's spectrum (its spectral centroid). The words compare it with the middle of this guitar's wirings, ${escapeHtml(formatHz(scale.medianHz))}; the bar runs from the darkest wiring (${escapeHtml(formatHz(scale.minHz))}) to the brightest (${escapeHtml(formatHz(scale.maxHz))}). A longer bar is a brighter sound.</p>` +
    `<ul class="bands">${bands}</ul>`
  );
}

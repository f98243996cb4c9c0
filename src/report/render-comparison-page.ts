/**
 * The comparison page: candidate pickup sets against a baseline, wiring by
 * wiring, in one self-contained HTML document drawn from a comparison
 * report and each set's sound. Pure: no I/O. Built like the listening page
 * (render-listening-page.ts) from the same pieces — its style, its player
 * bar, its blind-test markup, glossary and cautions — with its own table;
 * the script is the bundle's comparison entry (src/page/comparison-main.ts,
 * dist/comparison-page.js, passed in), which sounds every set live from its
 * coil signals carried in the page. The script is inline and pinned by hash
 * in a Content-Security-Policy that allows no connections, so the page makes
 * no request outside its folder and works from file://.
 */
import { renderPageHead } from './render-page-head.js';
import type { ComparisonDifference, ComparisonEntry, ComparisonReport, ComparisonRow } from './comparison-report.js';
import { escapeHtml, serializeJsonForScript } from './escape-html.js';
import { renderCautionsSection, renderGlossarySection } from './page-sections.js';
import { PAGE_STYLE } from './page-style.js';
import { renderBlindSection, renderKnobs, renderTransport } from './render-listening-page.js';
import { KNOBS_STYLE } from './page-list-style.js';
import type { ComparisonPageData, PageSound } from '../page/index.js';

/** Extra rules for the comparison table's set buttons (appended to the listening page's style). */
const COMPARISON_STYLE = `
.sets { display: flex; gap: 0.3rem; }
.sets button { min-width: 2.4rem; font-weight: 700; }
.sets button.is-current { background: var(--accent-soft); border-color: var(--accent); }
.sets button.is-playing { background: var(--accent); color: #fff; }
.changes { font-variant-numeric: tabular-nums; white-space: nowrap; }
.changes .above { font-weight: 700; }
.heard { font-weight: 700; }
`;

const MINUS = '\u2212';

function signed(value: number | null, digits: number, unit: string): string {
  if (value === null || !Number.isFinite(value)) return '—';
  const fixed = Math.abs(value).toFixed(digits);
  if (Number(fixed) === 0) return `${(0).toFixed(digits)}${unit}`;
  return `${value < 0 ? MINUS : '+'}${fixed}${unit}`;
}

function hertz(value: number | null): string {
  return value === null || !Number.isFinite(value) ? '—' : `${Math.round(value)} Hz`;
}

/** One cell listing a figure for every candidate set ("B +1.2 dB"), bold where it reaches its threshold. */
function changesCell(report: ComparisonReport, row: ComparisonRow, pick: (difference: ComparisonDifference) => { text: string; above: boolean }): string {
  const parts = row.differences.map((difference) => {
    const { text, above } = pick(difference);
    const label = report.sets[difference.set]?.label ?? '?';
    const words = report.sets.length > 2 ? `${escapeHtml(label)} ${escapeHtml(text)}` : escapeHtml(text);
    return above ? `<span class="above">${words}</span>` : `<span>${words}</span>`;
  });
  return `<td class="changes">${parts.join('<br>')}</td>`;
}

function renderRow(report: ComparisonReport, row: ComparisonRow, entries: ReadonlyMap<string, ComparisonEntry>): string {
  const { thresholds } = report;
  const buttons = report.sets
    .map((set, index) => {
      const entry = entries.get(row.entries[index] ?? '');
      const title = entry ? `${set.label}: ${set.name} · ${entry.wiringId} ${entry.expression}` : `${set.label}: not rendered`;
      return `<button type="button" data-action="play-set" data-set="${index}" aria-pressed="false" title="${escapeHtml(title)}"${entry ? '' : ' disabled'}>${escapeHtml(set.label)}</button>`;
    })
    .join('');
  const heard = row.differences.some((difference) => difference.audible);
  const resonances = report.sets
    .map((set, index) => `${escapeHtml(set.label)} ${escapeHtml(hertz(entries.get(row.entries[index] ?? '')?.resonanceHz ?? null))}`)
    .join(' → ');
  return (
    `<tr data-row="${escapeHtml(row.key)}">` +
    `<td class="number">${escapeHtml(row.key)}</td>` +
    `<td class="wiring"><span class="description">${escapeHtml(row.description)}</span><span class="expression"><code>${escapeHtml(row.expression)}</code></span></td>` +
    `<td><div class="sets" role="group" aria-label="Play on each set">${buttons}</div></td>` +
    changesCell(report, row, (d) => ({ text: `${d.distance.toFixed(2)}×`, above: d.audible })) +
    `<td class="heard">${heard ? 'yes' : 'no'}</td>` +
    changesCell(report, row, (d) => ({ text: signed(d.levelDb, 1, ' dB'), above: d.levelDb !== null && Math.abs(d.levelDb) >= thresholds.levelDb })) +
    changesCell(report, row, (d) => ({
      text: signed(d.brightnessPercent, 1, ' %'),
      above: d.brightnessPercent === null || Math.abs(Math.log1p(d.brightnessPercent / 100)) >= Math.log1p(thresholds.brightnessPercent / 100),
    })) +
    changesCell(report, row, (d) => ({ text: `${d.spectrumDb.toFixed(1)} dB`, above: d.spectrumDb >= thresholds.spectrumDb })) +
    `<td class="changes">${resonances}</td>` +
    changesCell(report, row, (d) => ({ text: signed(d.humDb, 0, ' dB'), above: false })) +
    '<td><button type="button" data-action="blind-row">Blind test</button></td>' +
    '</tr>'
  );
}

function renderTable(report: ComparisonReport): string {
  const entries = new Map(report.entries.map((entry) => [entry.id, entry]));
  const candidates = report.sets.slice(1).map((set) => set.label).join(', ');
  return (
    '<table id="comparison-table" class="wirings">' +
    `<caption class="visually-hidden">Every wiring on ${escapeHtml(report.sets.map((set) => set.label).join(' and '))}, biggest change first</caption>` +
    '<thead><tr>' +
    '<th scope="col">#</th><th scope="col">Wiring</th><th scope="col">Listen</th>' +
    `<th scope="col">Change (${escapeHtml(candidates)} vs ${escapeHtml(report.sets[0]?.label ?? 'A')})</th><th scope="col">Heard?</th>` +
    '<th scope="col">Level</th><th scope="col">Brightness</th><th scope="col">Spectrum</th><th scope="col">Resonant peak</th><th scope="col">Hum</th><th scope="col"><span class="visually-hidden">Blind test</span></th>' +
    '</tr></thead>' +
    `<tbody>${report.rows.map((row) => renderRow(report, row, entries)).join('')}</tbody></table>`
  );
}


function renderSetsList(report: ComparisonReport): string {
  const items = report.sets
    .map(
      (set, index) =>
        `<li><strong>${escapeHtml(set.label)}</strong>${index === 0 ? ' (baseline)' : ''}: ${escapeHtml(set.name)} · ` +
        `<a href="${escapeHtml(`${set.folder}/index.html`)}">its own listening page</a></li>`,
    )
    .join('');
  return `<ul class="set-list">${items}</ul>`;
}

/** The comparison page for a report, as one HTML document: `sounds` are the sets' sounds (in `report.sets` order), `script` the bundled comparison script (dist/comparison-page.js). */
export function renderComparisonPage(report: ComparisonReport, sounds: readonly PageSound[], script: string): string {
  const style = `${PAGE_STYLE}${KNOBS_STYLE}${COMPARISON_STYLE}`;
  const { thresholds } = report;
  const first = report.sets[0];
  const render = first?.render;
  const heard = report.rows.filter((row) => row.differences.some((difference) => difference.audible)).length;
  const title = `${report.baseline}: pickup sets compared`;
  const choices = report.entries.map((entry) => ({
    id: entry.id,
    label: `${report.sets[entry.set]?.label ?? '?'} · ${entry.wiringId} ${entry.expression}`,
  }));
  const data: ComparisonPageData = { report, sets: sounds };
  return `${renderPageHead({ title, script, style, generator: report.generator })}
<a class="skip" href="#compared">Skip to the wirings</a>
<header class="masthead">
<p class="kicker">coilbench comparison page</p>
<h1>${escapeHtml(title)}</h1>
<p class="lede">The same ${report.rows.length} wirings on ${report.sets.length} pickup sets, each rendered from the same playing (${escapeHtml(render?.phrase ?? '')}, ${escapeHtml(render?.chain ?? '')} chain). ${heard} of them change audibly on ${escapeHtml(report.sets.slice(1).map((set) => set.label).join(' or '))}.</p>
${renderSetsList(report)}
<p class="warn-volume">Turn your speakers or headphones down before you press play.</p>
</header>
<noscript><p class="noscript">This page makes its sound with JavaScript; the table and notes below work without it, and each set's WAV files (when written) play anywhere.</p></noscript>
<main>
<section id="start" class="start" aria-labelledby="start-title">
<h2 id="start-title">Start here</h2>
<ol>
<li><strong>Switch sets while it plays.</strong> Press ${escapeHtml(report.sets.map((set) => set.label).join(' or '))} on a row: the sound moves to that set at the same point in the phrase, at the same loudness. Keys: Space plays and pauses, ${escapeHtml(report.sets.map((set) => set.label).join(', '))} switch sets, ↑ ↓ change wiring.</li>
<li><strong>Turn the knobs.</strong> Volume, tone, tone capacitor, cable and amplifier apply to every set at once, while it plays.</li>
<li><strong>Biggest changes first.</strong> <em>Change</em> is the largest difference over its just-noticeable threshold: 1× is just noticeable (level ${escapeHtml(String(thresholds.levelDb))} dB, spectrum ${escapeHtml(String(thresholds.spectrumDb))} dB, brightness ${escapeHtml(String(thresholds.brightnessPercent))} %). Bold figures reach their threshold.</li>
<li><strong>Trust your ears, not the numbers.</strong> Press <em>Blind test</em> on a row to hear the two sets without knowing which is which.</li>
</ol>
</section>
<section id="compared" aria-labelledby="compared-title">
<h2 id="compared-title">Every wiring, set against set</h2>
${sounds[0] ? renderKnobs(sounds[0].guitar, sounds[0].overrides, render?.chain ?? sounds[0].chain) : ''}
<div class="scroll table-wrap">
${renderTable(report)}
</div>
<p class="notes">Level: the candidate's wiring against the baseline's, both on the baseline's scale (its average single coil is 0 dB). Brightness: power-weighted spectral centroid of the strum. Spectrum: level-matched difference over ERB bands. Hum: against the baseline's average single coil. Resonant peak: where the circuit boosts most.</p>
</section>
${renderBlindSection('Choose a wiring on each set (a row\'s Blind test button picks its two sets). ', choices, 'sound')}
${renderGlossarySection()}
${renderCautionsSection()}
</main>
<footer class="footer"><p>Made with coilbench. Renders are models of pickups that may differ from real ones: try a candidate set by ear before you buy and fit it.</p></footer>
${renderTransport(report.sets[0]?.render.durationS ?? 0, 'Press a set’s letter on any row to listen')}
<script type="application/json" id="comparison-data">${serializeJsonForScript(data)}</script>
<script>${script}</script>
</body>
</html>
`;
}

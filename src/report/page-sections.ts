/**
 * The reading parts of the listening page: the guitar, how the renders were
 * made, a short glossary and the cautions. Every string from the report is
 * escaped here.
 */
import { formatEngineering } from '../units/index.js';
import { escapeHtml } from './escape-html.js';
import type { ListeningReport } from './listening-report.js';

const MM_PER_M = 1000;

const TOPOLOGY_COUNT_WORDS = ['no coils', 'one coil', 'two coils', 'three coils', 'four coils', 'five coils'];

function coilCount(count: number): string {
  return TOPOLOGY_COUNT_WORDS[count] ?? `${count} coils`;
}

/** The guitar as described in its file. */
export function renderGuitarSection(report: ListeningReport): string {
  const { guitar } = report;
  const coils = guitar.coils
    .map(
      (coil) =>
        '<tr>' +
        `<th scope="row">${escapeHtml(coil.id)}</th>` +
        `<td>${escapeHtml(coil.pickup ?? '—')}</td>` +
        `<td>${escapeHtml(coil.position)}</td>` +
        `<td>${escapeHtml(formatEngineering(coil.resistanceOhms, 'Ω'))}</td>` +
        `<td>${escapeHtml(formatEngineering(coil.inductanceH, 'H'))}</td>` +
        `<td>${escapeHtml(formatEngineering(coil.capacitanceF, 'F'))}</td>` +
        `<td>${escapeHtml(coil.winding === 'cw' ? 'clockwise' : 'counter-clockwise')}</td>` +
        `<td>${escapeHtml(coil.magnet)}</td>` +
        '</tr>',
    )
    .join('');
  const controls = guitar.controls.map((line) => `<li>${escapeHtml(line)}</li>`).join('');
  const notes = guitar.notes ? `<p class="notes">${escapeHtml(guitar.notes)}</p>` : '';
  return (
    '<section id="guitar" aria-labelledby="guitar-title"><h2 id="guitar-title">The guitar</h2>' +
    `<p><strong>${escapeHtml(guitar.name)}</strong>: ${escapeHtml(coilCount(guitar.coils.length))}, ` +
    `scale ${escapeHtml(formatEngineering(guitar.scaleM * MM_PER_M))} mm, strings tuned ${escapeHtml(guitar.tuning.join(' '))} (lowest first).</p>` +
    notes +
    '<div class="scroll"><table class="facts"><caption>Coils (position measured from the bridge saddle; winding seen from the top; magnet pole facing the strings)</caption>' +
    '<thead><tr><th scope="col">Coil</th><th scope="col">Pickup</th><th scope="col">Position</th><th scope="col">Resistance</th>' +
    '<th scope="col">Inductance</th><th scope="col">Capacitance</th><th scope="col">Winding</th><th scope="col">Magnet</th></tr></thead>' +
    `<tbody>${coils}</tbody></table></div>` +
    `<h3>Controls, cable and amplifier</h3><ul>${controls}` +
    `<li>cable ${escapeHtml(formatEngineering(guitar.cableCapacitanceF, 'F'))}</li>` +
    `<li>amplifier input ${escapeHtml(formatEngineering(guitar.ampResistanceOhms, 'Ω'))} with ${escapeHtml(formatEngineering(guitar.ampCapacitanceF, 'F'))}</li></ul>` +
    '</section>'
  );
}

const CHAIN_WORDS: Readonly<Record<string, string>> = Object.freeze({
  direct: 'direct: the guitar output as the amplifier input sees it, with no amplifier or speaker colour',
  clean: 'clean: a clean amplifier stage and a speaker-cabinet-like response',
  drive: 'drive: an overdriven amplifier stage and a speaker-cabinet-like response',
  compressed: 'compressed: a compressor after the guitar',
});

/** How the renders were made: phrase, chain, format, level. */
export function renderHowSection(report: ListeningReport): string {
  const { render } = report;
  const chain = CHAIN_WORDS[render.chain] ?? render.chain;
  const level =
    render.level === 'true'
      ? `The WAV files keep the true level differences (one common gain of ${render.commonGainDb.toFixed(1)} dB for all).`
      : 'Each WAV file was loudness-matched when written.';
  const hum =
    render.humMixHz === null ? 'No hum was mixed into the audio.' : `Hum at ${render.humMixHz} Hz was mixed into the audio.`;
  return (
    '<section id="how" aria-labelledby="how-title"><h2 id="how-title">How these sounds were made</h2><ul>' +
    `<li>Every wiring plays the same performance: the <strong>${escapeHtml(render.phrase)}</strong> phrase, ${escapeHtml(render.durationS.toFixed(1))} s.</li>` +
    `<li>Chain: <strong>${escapeHtml(chain)}</strong>.</li>` +
    `<li>${escapeHtml(String(render.sampleRateHz))} Hz, ${escapeHtml(render.format)} WAV files in the <code>wav</code> folder beside this page. ${escapeHtml(level)}</li>` +
    `<li>Hum figures are for ${escapeHtml(String(render.mainsHz))} Hz mains. ${escapeHtml(hum)}</li>` +
    `<li>Made by ${escapeHtml(report.generator)}.</li>` +
    '</ul></section>'
  );
}

/** A short glossary for players who do not know the trade terms. */
export function renderGlossarySection(coilIds: readonly string[] = ['neck', 'bridge']): string {
  const first = coilIds[0] ?? 'neck';
  const last = coilIds[coilIds.length - 1] ?? 'bridge';
  const terms: ReadonlyArray<readonly [string, string]> = [
    ['Coil', 'One winding of wire around magnets under the strings. A single-coil pickup has one; a humbucker has two.'],
    ['Series', `Coils joined end to end, written ${first} + ${last}: usually louder, fuller and darker.`],
    ['Parallel', `Coils joined side by side, written ${first} // ${last}: usually quieter, clearer and brighter than series.`],
    ['In phase', 'The coils push the signal the same way, so their sounds add.'],
    ['Out of phase', `One coil is connected the other way round, written ~${last}: the sounds partly cancel, leaving a thin, hollow, often quieter tone.`],
    ['Hum cancelling', 'Mains hum picked up by one coil is cancelled by another coil wound and magnetised the opposite way. Marked "quiet" in the table.'],
    ['Resonant peak', 'The frequency where the pickup, controls and cable together boost the sound most; higher peaks sound brighter and sharper. Shown in the plot as a dot on each curve.'],
    ['Brightness', 'Where the balance of the sound lies between bass and treble (spectral centroid), in hertz: a higher figure is a brighter sound.'],
    ['Level', 'How loud the wiring is compared with the average single coil, in decibels (dB); 6 dB is about twice the signal.'],
    ['Blind test', 'The page hides one of two wirings as a mystery sound; you hear both and the mystery, and name it. A coin scores about half; a high tally over many rounds means you really hear a difference (the ABX method).'],
  ];
  const items = terms.map(([term, meaning]) => `<dt>${escapeHtml(term)}</dt><dd>${escapeHtml(meaning)}</dd>`).join('');
  return `<section id="glossary" aria-labelledby="glossary-title"><h2 id="glossary-title">Words used here</h2><dl>${items}</dl></section>`;
}

/** Renders are models; soldering; amplifiers; listening level. */
export function renderCautionsSection(): string {
  return (
    '<section id="cautions" aria-labelledby="cautions-title"><h2 id="cautions-title">Before you pick up the soldering iron</h2><ul>' +
    '<li><strong>These are models.</strong> Real pickups lose treble to eddy currents and differ from their spec sheets. Use this page to narrow the choice, then judge on the real instrument, by ear.</li>' +
    '<li><strong>Listening level.</strong> Start playback at a low volume and raise it slowly; switching to true level can make some wirings much louder.</li>' +
    '<li><strong>Soldering.</strong> Keep the iron in its stand and a damp sponge at hand; hot joints and tips burn. Work with ventilation or a fume extractor, wear eye protection, keep food and drink off the bench and wash your hands after handling solder.</li>' +
    '<li><strong>Check before closing up.</strong> Measure continuity and pot readings with a meter before you put the guitar back together.</li>' +
    '<li><strong>Never open an amplifier.</strong> Its capacitors can hold a lethal charge long after it is unplugged; leave that to a technician. Unplug the guitar from the amplifier while you work on it.</li>' +
    '</ul></section>'
  );
}

/**
 * The comparison page's script (the second entry of the page bundle, see
 * scripts/build-page.mjs): candidate pickup sets against a baseline, each set
 * sounded live from its own coil signals by its own wiring engine (the same
 * synthesis and chain as the listening page and the command line). Pressing
 * another set on a row while it plays switches sets at the same point in the
 * phrase (one player, one clock, the player's crossfade), at matched level
 * (each render's own measured loudness) unless the listener asks for true
 * level; the blind test hides which set is which. The knobs (the listening
 * page's, knob-fields.ts) apply to every set: a knob the listener moves
 * replaces each set's own setting, the others stay as each set was rendered.
 * Every string from the
 * guitar files reaches the document through textContent or attributes.
 */
import type { ComparisonEntry, ComparisonRow } from '../report/index.js';
import { type Wiring, enumerateWirings } from '../wiring/index.js';
import { createBlindTest } from './blind-test.js';
import { RENDERS_KEPT, createRenderCache } from './render-cache.js';
import { type ComparisonPageData, encodeSignal } from './page-data.js';
import { loopsByDefault, playbackGainDb, MATCHED_LOUDNESS_LUFS } from './page-math.js';
import { formatDb } from './page-words.js';
import { type Playable, createPlayer } from './player.js';
import { byId, connectTransport } from './transport-bar.js';
import { connectKnobFields, knobsForSet } from './knob-fields.js';
import { type Knobs, type RenderedWiring, type WiringEngine, createWiringEngine, renderKey } from './wiring-engine.js';


const data = JSON.parse(byId('comparison-data').textContent ?? '{}') as ComparisonPageData;
const { report } = data;
const sets = report.sets;
const engines: WiringEngine[] = data.sets.map((sound) => createWiringEngine(sound));
const wiringsOfSet: Array<Map<string, Wiring>> = data.sets.map((sound) => new Map(enumerateWirings(sound.guitar.elements).map((wiring) => [wiring.id, wiring])));
const entries = new Map<string, ComparisonEntry>(report.entries.map((entry) => [entry.id, entry]));
const rows = new Map<string, ComparisonRow>(report.rows.map((row) => [row.key, row]));
const rowElements = Array.from(document.querySelectorAll<HTMLTableRowElement>('tr[data-row]'));
const first = engines[0] as WiringEngine;

/**
 * True level: one common gain for every set, so the measured differences
 * remain (both sets' renders are volts at the amplifier input): the median
 * entry's reference loudness brought to the matched loudness.
 */
const trueGainDb = ((): number => {
  const loudness = report.entries.map((entry) => entry.loudnessLufs).filter(Number.isFinite).sort((a, b) => a - b);
  if (loudness.length === 0) return 0;
  const middle = loudness.length >> 1;
  const median = loudness.length % 2 === 1 ? (loudness[middle] as number) : ((loudness[middle - 1] as number) + (loudness[middle] as number)) / 2;
  return MATCHED_LOUDNESS_LUFS - median;
})();

let matched = true;
const ui = { row: report.rows[0]?.key ?? null, set: 0 };

const player = createPlayer({
  sampleRateHz: first.sampleRateHz,
  volume: Number(byId<HTMLInputElement>('volume').value),
  gainDb: (playable) => {
    const render = cache.played(playable.key);
    return render ? playbackGainDb(render, matched || blind.isRunning(), trueGainDb) : 0;
  },
});
const cache = createRenderCache(RENDERS_KEPT, () => player.soundingKeys());

/** The knobs' bar starts at the baseline set's render knobs; what the listener moves applies to every set. */
const shownKnobs: Knobs = first.renderKnobs;
let movedKnobs: Knobs = shownKnobs;

/** The knobs entry `id`'s set renders at now. */
function knobsOf(id: string): Knobs | null {
  const entry = entries.get(id);
  const engine = entry ? engines[entry.set] : undefined;
  return engine ? knobsForSet(engine.renderKnobs, shownKnobs, movedKnobs) : null;
}


/** The render of entry `id` on its set's engine at the knobs (kept for the last RENDERS_KEPT settings and entries). */
function renderOf(id: string): Promise<RenderedWiring> {
  const entry = entries.get(id);
  const engine = entry ? engines[entry.set] : undefined;
  const wiring = entry ? wiringsOfSet[entry.set]?.get(entry.wiringId) : undefined;
  const knobs = knobsOf(id);
  if (!entry || !engine || !wiring || !knobs) return Promise.reject(new Error(`no wiring ${id} on this page`));
  return cache.render(renderKey(id, knobs), () => engine.render(id, wiring.network, knobs));
}

function playableOf(render: RenderedWiring, sampleRateHz: number): Playable {
  const buffer = player.context().createBuffer(1, render.samples.length, sampleRateHz);
  buffer.copyToChannel(render.samples as Float32Array<ArrayBuffer>, 0);
  return { key: render.key, buffer, peak: render.peak };
}

function describe(id: string): string {
  const entry = entries.get(id);
  if (!entry) return id;
  const set = sets[entry.set];
  return `${set?.label ?? '?'} \u00b7 ${set?.name ?? ''} \u00b7 ${entry.wiringId} ${entry.expression}`;
}

let request = 0;
/** Make entry `id` the one that sounds (now, if playing; `start` starts playback). */
async function choose(id: string, start: boolean): Promise<void> {
  const mine = (request += 1);
  byId('now-detail').textContent = 'rendering\u2026';
  updateLabels();
  try {
    const render = await renderOf(id);
    if (mine !== request) return;
    const entry = entries.get(id) as ComparisonEntry;
    player.show(playableOf(render, (engines[entry.set] as WiringEngine).sampleRateHz), start || player.isPlaying());
    byId('now-detail').textContent = '';
  } catch (error) {
    byId('now-detail').textContent = `Could not render: ${error instanceof Error ? error.message : String(error)}.`;
  }
  updateLabels();
}

function entryOf(key: string | null, set: number): string | null {
  const row = key === null ? undefined : rows.get(key);
  return row?.entries[set] ?? null;
}

/* ---------- labels ---------- */

function levelNote(): string {
  if (blind.isRunning()) return 'Blind test: level matched, sets hidden.';
  const id = entryOf(ui.row, ui.set);
  const entry = id === null ? undefined : entries.get(id);
  let words = matched ? 'Level matched: you hear the sound, not the loudness. ' : 'True level. ';
  if (!entry) return words;
  words += `At true level this is ${formatDb(entry.levelDb)} against ${sets[0]?.label ?? 'A'}\u2019s average single coil`;
  const baseline = entries.get(entryOf(ui.row, 0) ?? '');
  if (ui.set !== 0 && baseline && Number.isFinite(baseline.levelDb) && Number.isFinite(entry.levelDb)) {
    const difference = entry.levelDb - baseline.levelDb;
    words += `, ${Math.abs(difference).toFixed(1)} dB ${difference >= 0 ? 'louder' : 'quieter'} than on ${sets[0]?.label ?? 'A'}`;
  }
  return `${words}.`;
}

function updateLabels(): void {
  const id = entryOf(ui.row, ui.set);
  const label = blind.isRunning() ? blind.label() : null;
  byId('now-label').textContent = label ? `Blind test \u00b7 playing ${label}` : id ? describe(id) : 'Press a set\u2019s letter on any row to listen';
  byId('level-note').textContent = levelNote();
  const playing = player.isPlaying();
  const play = byId('transport-play');
  play.setAttribute('aria-label', playing ? 'Pause' : 'Play');
  play.classList.toggle('is-playing', playing);
  for (const element of rowElements) {
    const current = !blind.isRunning() && element.dataset['row'] === ui.row;
    if (current) element.setAttribute('aria-current', 'true');
    else element.removeAttribute('aria-current');
    for (const button of Array.from(element.querySelectorAll<HTMLButtonElement>('[data-action="play-set"]'))) {
      const on = current && Number(button.dataset['set']) === ui.set;
      button.setAttribute('aria-pressed', on && playing ? 'true' : 'false');
      button.classList.toggle('is-playing', on && playing);
      button.classList.toggle('is-current', on);
    }
  }
}

/* ---------- switching sets ---------- */

/** Sound `key`'s wiring on `set`: at the same place in the phrase if something plays; the row's other sets are rendered ahead. */
function sound(key: string, set: number, start: boolean): void {
  const id = entryOf(key, set);
  if (id === null) return;
  ui.row = key;
  ui.set = set;
  void choose(id, start);
  sets.forEach((_, other) => {
    const twin = entryOf(key, other);
    if (twin !== null && other !== set) renderOf(twin).catch(() => undefined);
  });
}

byId('comparison-table').addEventListener('click', (event) => {
  const button = (event.target as HTMLElement).closest('[data-action]') as HTMLElement | null;
  const key = (button?.closest('tr') as HTMLTableRowElement | null | undefined)?.dataset['row'];
  if (!button || key === undefined) return;
  if (button.dataset['action'] === 'play-set') {
    const set = Number(button.dataset['set']);
    if (!blind.isRunning() && key === ui.row && set === ui.set && player.isPlaying()) player.pause();
    else sound(key, set, true);
  } else if (button.dataset['action'] === 'blind-row') {
    const row = rows.get(key);
    if (!row) return;
    byId<HTMLSelectElement>('blind-first').value = row.entries[0] ?? '';
    byId<HTMLSelectElement>('blind-second').value = row.entries[Math.min(1, row.entries.length - 1)] ?? '';
    byId('blind').scrollIntoView({ block: 'start' });
  }
});

function togglePlayback(): void {
  if (player.isPlaying()) player.pause();
  else if (ui.row !== null) sound(ui.row, ui.set, true);
}
connectTransport({
  player,
  durationS: first.length / first.sampleRateHz,
  toggle: togglePlayback,
  levelMode: (on) => {
    matched = on;
  },
  changed: () => updateLabels(),
});

/* ---------- knobs ---------- */

/** The entry id a render key names (renderKey: `<id>@<knobs>`). */
function idOfKey(key: string | null): string | null {
  return key === null ? null : key.slice(0, key.indexOf('@'));
}

connectKnobFields(shownKnobs, (now) => {
  movedKnobs = now;
  const id = blind.isRunning() ? idOfKey(player.current()?.key ?? null) : entryOf(ui.row, ui.set);
  if (id !== null && player.current() !== null) void choose(id, false);
});

/* ---------- blind test ---------- */

const blind = createBlindTest({
  listen: (id) => void choose(id, true),
  stop: () => player.pause(),
  describe,
  changed: () => {
    player.refreshGains();
    updateLabels();
  },
});

/* ---------- keyboard: Space plays and pauses; arrows change wiring on the same set; A, B, C … switch sets ---------- */

document.addEventListener('keydown', (event) => {
  if (event.altKey || event.ctrlKey || event.metaKey || blind.isRunning()) return;
  const target = event.target as HTMLElement;
  if (target.closest('select, textarea, input:not([type="checkbox"]):not([type="range"])')) return;
  if (event.key === ' ' && !target.closest('button')) {
    event.preventDefault();
    togglePlayback();
    return;
  }
  const keys = report.rows.map((row) => row.key);
  if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
    event.preventDefault();
    const index = ui.row === null ? -1 : keys.indexOf(ui.row);
    const next = keys[Math.max(0, Math.min(keys.length - 1, index + (event.key === 'ArrowDown' ? 1 : -1)))];
    if (next !== undefined) sound(next, ui.set, false);
    return;
  }
  const letter = event.key.length === 1 ? event.key.toUpperCase() : '';
  const set = sets.findIndex((candidate) => candidate.label === letter);
  if (set >= 0 && ui.row !== null) {
    event.preventDefault();
    sound(ui.row, set, false);
  }
});

/* ---------- start ---------- */

player.setLoop(loopsByDefault(first.length / first.sampleRateHz) ? { start: 0, end: first.length / first.sampleRateHz } : null);
const firstRow = report.rows[0];
if (firstRow) {
  byId<HTMLSelectElement>('blind-first').value = firstRow.entries[0] ?? '';
  byId<HTMLSelectElement>('blind-second').value = firstRow.entries[Math.min(1, firstRow.entries.length - 1)] ?? '';
}
updateLabels();
byId<HTMLButtonElement>('transport-play').disabled = false;

/** Read-only view and test hooks. */
(window as unknown as { coilbenchComparison: unknown }).coilbenchComparison = Object.freeze({
  position: () => player.position(),
  isPlaying: () => player.isPlaying(),
  currentId: () => idOfKey(player.current()?.key ?? null),
  soundingIds: () => player.soundingKeys().map(idOfKey),
  /** The sounding renders' keys: entry id and knob settings. */
  soundingKeys: () => player.soundingKeys(),
  knobs: () => movedKnobs,
  blindScore: () => blind.score(),
  /** Render entry `id` as the page plays it: processed samples (base64 float32), loudness, and the playback gain in each level mode. */
  async render(id: string) {
    const render = await renderOf(id);
    return {
      samples: encodeSignal(render.samples),
      sampleRateHz: (engines[(entries.get(id) as ComparisonEntry).set] as WiringEngine).sampleRateHz,
      loudnessLufs: render.loudnessLufs,
      matchedGainDb: playbackGainDb(render, true, trueGainDb),
      trueGainDb: playbackGainDb(render, false, trueGainDb),
    };
  },
});

/**
 * The listening page's script (the bundle's entry): reads the page data,
 * lists every wiring of the guitar (the same enumerator as the command line),
 * renders the chosen one on demand with the wiring engine at the knobs'
 * settings, plays it through the player with level matching, and joins the
 * plot, the blind test, the keyboard and the download. Every string from the
 * guitar file reaches the document through textContent or attributes.
 */
import { measureCentroid } from '../analysis/index.js';
import { fftKernelHost } from '../math/index.js';
import { type ChainName, CHAIN_NAMES, encodeWav } from '../render/portable/index.js';
import { type Wiring, enumerateWirings, makeWiring, parseWiring, printNetwork, canonicalize, vocabularyOf } from '../wiring/index.js';
import { createBlindTest } from './blind-test.js';
import { RENDERS_KEPT, createRenderCache } from './render-cache.js';
import { connectKnobFields } from './knob-fields.js';
import { type PageData, decodeCoilDrive, encodeSignal } from './page-data.js';
import { loopsByDefault, matchesSearch, playbackGainDb, MATCHED_LOUDNESS_LUFS } from './page-math.js';
import { brightnessScale, describePeak, formatDb, formatHz, humVerdict, HUM_VERDICT_WORDS } from './page-words.js';
import { type Playable, createPlayer } from './player.js';
import { TICK_MS, byId, connectTransport } from './transport-bar.js';
import { createResponsePlot } from './response-plot.js';
import { responseCurve } from './response-curve.js';
import { type Knobs, type RenderedWiring, createWiringEngine, overridesOf, guitarWithKnobs, renderChainInBrowser, renderKey } from './wiring-engine.js';
import { type ListRow, type WiringList, createWiringList } from './wiring-list.js';
import { warmUpWirings } from './warm-up.js';
import { type PageWiringFigures, type WiringFigures, decodeWiringFigures } from './wiring-figures.js';



const data = JSON.parse(byId('page-data').textContent ?? '{}') as PageData;
const { guitar, report } = data;
performance.mark('coilbench-data');
const engine = createWiringEngine({ ...data, chain: report.render.chain });
performance.mark('coilbench-engine');
// The list of every wiring is built after the first wiring is ready to sound (see "start" below).
let wirings: Wiring[] = [];
// The wirings' figures follow the page's script in the document (#page-wirings, columns: wiring-figures.ts): read with the list.
const reported = new Map<string, WiringFigures>();
const byKey = new Map<string, Wiring>();
const ids = guitar.elements.map((element) => element.id);
const vocabulary = vocabularyOf(guitar);
let scale = brightnessScale([]);
/** True level: one common gain putting the mean single coil at the matched loudness (set when the figures are read; until then Play is level matched). */
let trueGainDb = 0;

/** Read the wirings' figures: the brightness scale and the true-level gain follow from them. */
function readFigures(): void {
  const figures = decodeWiringFigures(JSON.parse(byId('page-wirings').textContent ?? '{"numbers":[]}') as PageWiringFigures);
  for (const wiring of figures) reported.set(wiring.id, wiring);
  scale = brightnessScale(figures.map((wiring) => wiring.centroidHz));
  const singleLoudness = figures.filter((wiring) => wiring.coilCount === 1).map((wiring) => wiring.loudnessLufs).filter(Number.isFinite);
  trueGainDb = singleLoudness.length ? MATCHED_LOUDNESS_LUFS - singleLoudness.reduce((a, b) => a + b, 0) / singleLoudness.length : 0;
}

let knobs: Knobs = engine.renderKnobs;
let matched = true;
let currentWiring: Wiring | null = null;
let previous: { wiring: Wiring; loudness: number } | null = null;
const plotted: string[] = [];

const player = createPlayer({
  sampleRateHz: engine.sampleRateHz,
  volume: Number(byId<HTMLInputElement>('volume').value),
  gainDb: (playable) => {
    const render = cache.played(playable.key);
    return render ? playbackGainDb(render, matched || blind.isRunning(), trueGainDb) : 0;
  },
});
const cache = createRenderCache(RENDERS_KEPT, () => player.soundingKeys());

function renderOf(wiring: Wiring, at: Knobs): Promise<RenderedWiring> {
  return cache.render(renderKey(wiring.expression, at), () => engine.render(wiring.expression, wiring.network, at));
}

function playableOf(render: RenderedWiring): Playable {
  const context = player.context();
  const buffer = context.createBuffer(1, render.samples.length, engine.sampleRateHz);
  buffer.copyToChannel(render.samples as Float32Array<ArrayBuffer>, 0);
  return { key: render.key, buffer, peak: render.peak };
}

let request = 0;
/** Make `wiring` the one that sounds (now, if playing; `start` starts playback). */
async function choose(wiring: Wiring, start: boolean): Promise<void> {
  const mine = (request += 1);
  if (currentWiring && currentWiring.id !== wiring.id) {
    const before = cache.played(renderKey(currentWiring.expression, knobs));
    if (before) previous = { wiring: currentWiring, loudness: before.loudnessLufs };
  }
  currentWiring = wiring;
  list?.setCurrent(wiring.id, false);
  byId('now-detail').textContent = 'rendering\u2026';
  try {
    const render = await renderOf(wiring, knobs);
    if (mine !== request) return;
    player.show(playableOf(render), start || player.isPlaying());
    byId('now-detail').textContent = '';
  } catch (error) {
    byId('now-detail').textContent = `Could not render: ${error instanceof Error ? error.message : String(error)}.`;
  }
  updateLabels();
}

/* ---------- the list ---------- */

/** A switch plan's render (`switch --render`): the list holds the positions' wirings in position order, each row naming its positions. */
const positionsOf = new Map<string, string[]>();
for (const position of report.positions ?? []) {
  if (position.wiringId !== null) positionsOf.set(position.wiringId, [...(positionsOf.get(position.wiringId) ?? []), `position ${position.position}`]);
}
/** The rows of the list: every wiring, or a switch plan's positions' wirings (set when the list is built). */
let listed: Wiring[] = [];

function rowOf(wiring: Wiring): ListRow {
  const where = positionsOf.get(wiring.id);
  const words = where === undefined ? wiring.description : `${where.join(', ')}: ${wiring.description}`;
  const metrics = reported.get(wiring.id);
  const level = metrics ? formatDb(metrics.levelDb) : '\u2014';
  const brightness = metrics ? `${scale.word(metrics.centroidHz)} (${formatHz(metrics.centroidHz)})` : '\u2014';
  const peak = metrics ? describePeak(metrics.resonanceHz, metrics.peakDb) : '\u2014';
  const hum = metrics ? HUM_VERDICT_WORDS[humVerdict(metrics.humDb, metrics.humCancelling)].join(' ').trim() : '\u2014';
  return {
    id: wiring.id,
    number: wiring.number,
    expression: wiring.expression,
    cells: [words, level, brightness, peak, hum],
    searchText: [wiring.id, wiring.expression, words, ...wiring.elementIds, brightness, hum].join(' '),
  };
}

let list: WiringList | null = null;

function search(): void {
  if (!list) return;
  const shown = list.filter(byId<HTMLInputElement>('search').value);
  byId('shown-count').textContent = `Showing ${shown} of ${listed.length}`;
}
byId('search').addEventListener('input', search);

/** Enumerate every wiring (the command line's enumerator) and build the list, the plot and the blind test's choices. */
function buildList(): void {
  readFigures();
  wirings = enumerateWirings(guitar.elements);
  for (const wiring of wirings) byKey.set(wiring.id, wiring);
  listed = positionsOf.size > 0 ? [...positionsOf.keys()].flatMap((id) => byKey.get(id) ?? []) : wirings;
  for (const wiring of wirings.filter((candidate) => candidate.elements.length === 1).slice(0, 4)) plotted.push(wiring.id);
  list = createWiringList(byId('wiring-list'), listed.map(rowOf), {
    play: (id) => {
      const wiring = byKey.get(id);
      if (!wiring) return;
      if (currentWiring?.id === id && player.isPlaying()) player.pause();
      else void choose(wiring, true);
    },
    plot: (id, on) => {
      const at = plotted.indexOf(id);
      if (on && at < 0) plotted.push(id);
      if (!on && at >= 0) plotted.splice(at, 1);
      drawPlot();
      fillBlindChoices();
    },
    plotted: (id) => plotted.includes(id),
  });
  // The wiring prepared before the list existed is the list's first row: take the list's own record of it.
  const opened = currentWiring ? wirings.find((wiring) => wiring.expression === currentWiring?.expression) : undefined;
  if (opened) {
    currentWiring = opened;
    list.setCurrent(opened.id, false);
  }
  search();
  drawPlot();
  fillBlindChoices();
  updateLabels();
  performance.mark('coilbench-list');
}



/* ---------- typing an expression ---------- */

byId<HTMLFormElement>('expression-form').addEventListener('submit', (event) => {
  event.preventDefault();
  const text = byId<HTMLInputElement>('expression-input').value;
  const message = byId('expression-message');
  try {
    const network = canonicalize(parseWiring(text, vocabulary, 'expression'));
    const expression = printNetwork(network, ids);
    const wiring = wirings.find((candidate) => candidate.expression === expression) ?? makeWiring(network, ids, 0);
    message.textContent = `Playing ${wiring.expression} (${wiring.description}).`;
    void choose(wiring, true);
  } catch (error) {
    message.textContent = error instanceof Error ? error.message : String(error);
  }
});

/* ---------- knobs ---------- */

const knobFields = connectKnobFields(knobs, (now) => {
  knobs = now;
  drawPlot();
  if (currentWiring) void choose(currentWiring, false);
});

/* ---------- transport ---------- */

function levelNote(): string {
  if (blind.isRunning()) return 'Blind test: level matched, names hidden.';
  const wiring = currentWiring;
  const render = wiring ? cache.played(renderKey(wiring.expression, knobs)) : undefined;
  if (!wiring || !render) return matched ? 'Level matched.' : 'True level.';
  let note = `${matched ? 'Level matched' : 'True level'}. This render: ${render.loudnessLufs.toFixed(1).replace('-', '\u2212')} LUFS before playback gain`;
  if (previous && previous.wiring.id !== wiring.id && Number.isFinite(previous.loudness) && Number.isFinite(render.loudnessLufs)) {
    const difference = render.loudnessLufs - previous.loudness;
    note += `; at true level ${Math.abs(difference).toFixed(1)} dB ${difference >= 0 ? 'louder' : 'quieter'} than ${previous.wiring.expression}`;
  }
  const wanted = matched ? MATCHED_LOUDNESS_LUFS - render.loudnessLufs : trueGainDb;
  const given = playbackGainDb(render, matched, trueGainDb);
  if (given < wanted - 0.05) note += ` (raised only ${formatDb(given)} of ${formatDb(wanted)} to stay below full scale)`;
  return `${note}.`;
}

function updateLabels(): void {
  const label = blind.isRunning() ? blind.label() : null;
  byId('now-label').textContent = label ? `Blind test \u00b7 playing ${label}` : currentWiring ? `${currentWiring.expression} \u00b7 ${currentWiring.description}` : 'Press \u25b6 on any row to listen';
  byId('level-note').textContent = levelNote();
  const play = byId('transport-play');
  play.setAttribute('aria-label', player.isPlaying() ? 'Pause' : 'Play');
  play.classList.toggle('is-playing', player.isPlaying());
}

function togglePlayback(): void {
  if (player.isPlaying()) {
    player.pause();
    return;
  }
  const wiring = currentWiring ?? byKey.get(list?.shown()[0] ?? '');
  if (wiring) void choose(wiring, true);
}
const updateTime = connectTransport({
  player,
  durationS: engine.length / engine.sampleRateHz,
  toggle: togglePlayback,
  levelMode: (on) => {
    matched = on;
  },
  changed: () => updateLabels(),
});

function applyLoop(): void {
  const on = byId<HTMLInputElement>('loop-on').checked;
  const start = Number(byId<HTMLInputElement>('loop-start').value);
  const end = Number(byId<HTMLInputElement>('loop-end').value);
  player.setLoop(on && end > start ? { start, end } : null);
}
for (const id of ['loop-on', 'loop-start', 'loop-end']) byId(id).addEventListener('change', applyLoop);


/* ---------- download ---------- */

byId('download').addEventListener('click', () => {
  const wiring = currentWiring;
  if (!wiring) return;
  void renderOf(wiring, knobs).then((render) => {
    const gain = 10 ** (playbackGainDb(render, matched, trueGainDb) / 20);
    const samples = render.samples.map((sample) => sample * gain);
    const bytes = encodeWav(samples, {
      sampleRateHz: engine.sampleRateHz,
      format: 'pcm24',
      info: { name: wiring.expression, comment: `${wiring.description}; ${knobs.chain} chain; volume ${knobs.volumeSetting}${knobs.toneSetting === null ? '' : `, tone ${knobs.toneSetting}`}`, software: report.generator },
    });
    const link = document.createElement('a');
    link.href = URL.createObjectURL(new Blob([bytes as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }));
    link.download = `${wiring.id}-${knobs.chain}.wav`;
    link.click();
    setTimeout(() => URL.revokeObjectURL(link.href), TICK_MS * 100);
  });
});

/* ---------- plot ---------- */

/** The drive the report's figures were read with: the plotted curve is R(f) as the strings drive it, its dot the report's resonance. */
const drive = data.drive === undefined ? undefined : decodeCoilDrive(data.drive);
const plot = createResponsePlot(byId('response-plot') as unknown as SVGSVGElement, byId('plot-legend'), byId('plot-readout'));
function drawPlot(): void {
  const circuitGuitar = guitarWithKnobs(guitar, knobs);
  const overrides = overridesOf(knobs, data.overrides);
  plot.draw(
    plotted.flatMap((id) => {
      const wiring = byKey.get(id);
      return wiring ? [{ id, label: wiring.expression, ...responseCurve(circuitGuitar, overrides, wiring.network, drive) }] : [];
    }),
  );
}
document.querySelector('[data-action="clear-plot"]')?.addEventListener('click', () => {
  plotted.splice(0);
  list?.refresh();
  drawPlot();
});

/* ---------- blind test ---------- */

const blind = createBlindTest({
  listen: (id) => {
    const wiring = byKey.get(id);
    if (wiring) void choose(wiring, true);
  },
  stop: () => player.pause(),
  describe: (id) => {
    const wiring = byKey.get(id);
    return wiring ? `${wiring.expression}, ${wiring.description}` : id;
  },
  changed: () => {
    player.refreshGains();
    updateLabels();
  },
});

function fillBlindChoices(): void {
  const offered = [...new Set([...plotted, ...wirings.filter((wiring) => wiring.elements.length === 1).map((wiring) => wiring.id)])];
  for (const [selectId, pick] of [['blind-first', 0], ['blind-second', 1]] as const) {
    const select = byId<HTMLSelectElement>(selectId);
    const keep = select.value;
    select.replaceChildren(
      ...offered.map((id) => {
        const option = document.createElement('option');
        option.value = id;
        option.textContent = byKey.get(id)?.expression ?? id;
        return option;
      }),
    );
    select.value = offered.includes(keep) ? keep : (offered[pick] ?? '');
  }
}

/* ---------- keyboard ---------- */

function step(delta: number): void {
  if (!list) return;
  const shown = list.shown();
  if (shown.length === 0) return;
  const index = currentWiring ? shown.indexOf(currentWiring.id) : -1;
  const next = byKey.get(shown[index < 0 ? 0 : Math.max(0, Math.min(shown.length - 1, index + delta))] ?? '');
  if (!next) return;
  void choose(next, false);
  list.setCurrent(next.id, true);
}

document.addEventListener('keydown', (event) => {
  if (event.altKey || event.ctrlKey || event.metaKey) return;
  const target = event.target as HTMLElement;
  if (target.closest('input:not([type="checkbox"]):not([type="range"]), select, textarea')) return;
  if (event.key === ' ' && !target.closest('button')) {
    event.preventDefault();
    togglePlayback();
  } else if (event.key === 'ArrowDown' && !blind.isRunning()) {
    event.preventDefault();
    step(1);
  } else if (event.key === 'ArrowUp' && !blind.isRunning()) {
    event.preventDefault();
    step(-1);
  }
});

/* ---------- start ---------- */

byId<HTMLInputElement>('loop-on').checked = loopsByDefault(engine.length / engine.sampleRateHz);
applyLoop();
updateLabels();
updateTime();

// First sound first: the wiring Play starts (the report's first wiring, the list's first row) is rendered before the
// wirings' figures are read and the list of every wiring is built, so Play sounds as soon as the page can; the list
// follows once the document is parsed (its figures come after this script).
const opening = data.opening ? makeWiring(canonicalize(parseWiring(data.opening.expression, vocabulary, 'opening.expression')), ids, data.opening.number) : null;
if (opening) currentWiring = opening;
const openingRender = opening ? renderOf(opening, knobs) : Promise.resolve(null);
void openingRender
  .then(() => {
    byId<HTMLButtonElement>('transport-play').disabled = false;
    performance.mark('coilbench-first-sound');
    updateLabels();
  })
  .finally(() => {
    const finish = (): void => {
      buildList();
      byId<HTMLButtonElement>('transport-play').disabled = false;
      exposeTestView();
      performance.mark('coilbench-ready');
      warmUp();
    };
    if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', () => setTimeout(finish, 0), { once: true });
    else setTimeout(finish, 0);
  });

/** Run `work` when the page is idle (the browser's idle callback where it has one). */
function whenIdle(work: () => void): void {
  if ('requestIdleCallback' in window) requestIdleCallback(() => work());
  else setTimeout(work, 0);
}

/**
 * After the list is built, one step per idle period: the spectra of the coils the first sound did not need (not at
 * the first wiring that uses them), then the warm-up renders (warm-up.ts) at the knobs of the moment and through
 * every chain, into the cache (a render already there costs nothing).
 * Marks `coilbench-warm` when done.
 */
function warmUp(): void {
  const warm = warmUpWirings(guitar, wirings);
  // Each warm-up wiring at the knobs of the moment, then the first through every other chain.
  const queue: Array<{ wiring: Wiring; chain: ChainName | null }> = warm.map((wiring) => ({ wiring, chain: null }));
  const first = warm[0];
  if (first) for (const chain of CHAIN_NAMES) queue.push({ wiring: first, chain });
  const next = (): void => {
    const step = queue.shift();
    if (!step) {
      performance.mark('coilbench-warm');
      return;
    }
    void renderOf(step.wiring, step.chain === null ? knobs : { ...knobs, chain: step.chain })
      .catch(() => undefined) // a failed render is shown when the wiring is chosen, not here
      .finally(() => whenIdle(next));
  };
  whenIdle(() => {
    engine.prepareSpectra();
    whenIdle(next);
  });
}

/** Float32 samples as base64 (the page's own coil-signal codec), for tests that compare hosts. */
function samplesToBase64(samples: Float32Array): string {
  return encodeSignal(samples);
}

/** Read-only view and test hooks: the page's own rendering path, for the cross-host checks (set once the list is built). */
function exposeTestView(): void {
  (window as unknown as { coilbenchPage: unknown }).coilbenchPage = Object.freeze({
    position: () => player.position(),
    audioClock: () => player.clock(),
    isPlaying: () => player.isPlaying(),
    currentExpression: () => currentWiring?.expression ?? null,
    soundingKeys: () => player.soundingKeys(),
    blindScore: () => blind.score(),
    wiringCount: () => wirings.length,
    knobs: () => knobFields.knobs(),
    /** Render `expression` at the knobs (render knobs overridden by `changes`): processed samples (base64 float32), loudness, centroid, peak. */
    async render(expression: string, changes: Partial<Knobs> = {}) {
      const network = canonicalize(parseWiring(expression, vocabulary, 'expression'));
      const at = { ...engine.renderKnobs, ...changes };
      const rendered = await engine.render(printNetwork(network, ids), network, at);
      return {
        samples: samplesToBase64(rendered.samples),
        loudnessLufs: rendered.loudnessLufs,
        centroidHz: measureCentroid(rendered.samples, engine.sampleRateHz),
        peak: rendered.peak,
        matchedGainDb: playbackGainDb(rendered, true, trueGainDb),
      };
    },
    /**
     * Make `expression` at the render's knobs with `changes` ready to sound, the way choosing it or moving a knob does
     * (render, level measure, audio buffer), without playing it; resolves to the render's loudness. For the bench.
     */
    async prepare(expression: string, changes: Partial<Knobs> = {}): Promise<number> {
      const network = canonicalize(parseWiring(expression, vocabulary, 'expression'));
      const wiring = wirings.find((candidate) => candidate.expression === printNetwork(network, ids)) ?? makeWiring(network, ids, 0);
      const render = await renderOf(wiring, { ...engine.renderKnobs, ...changes });
      playableOf(render);
      return render.loudnessLufs;
    },
    /** `expression` at the render's knobs through `chain`, its graph rendered in `parts` parts (base64 float32): for the check that parts join exactly. */
    async chainInParts(expression: string, chain: ChainName, parts: number): Promise<string> {
      const network = canonicalize(parseWiring(expression, vocabulary, 'expression'));
      return samplesToBase64(await renderChainInBrowser(engine.synthesize(network, engine.renderKnobs), engine.sampleRateHz, chain, parts));
    },
    /** The direct signal of `expression` at the render's knobs (base64 float32): the synthesis alone, for the cross-host checks. */
    direct(expression: string): string {
      const network = canonicalize(parseWiring(expression, vocabulary, 'expression'));
      return samplesToBase64(engine.synthesize(network, engine.renderKnobs));
    },
    /** Playback gain the page gives the render of `expression` at the current knobs, dB (null before it is rendered). */
    gainDb: (expression: string) => {
      const render = cache.played(renderKey(expression, knobs));
      return render ? playbackGainDb(render, matched || blind.isRunning(), trueGainDb) : null;
    },
    loudnessOf: (expression: string) => cache.played(renderKey(expression, knobs))?.loudnessLufs ?? null,
    matchesSearch,
    /** Which code runs the page's FFTs: 'webassembly' unless the browser refused to compile the kernels. */
    fftKernels: fftKernelHost,
  });
}

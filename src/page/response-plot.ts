/**
 * The response plot: chosen wirings' curves overlaid as inline SVG on a log
 * frequency axis (20 Hz–20 kHz), dB relative to 100 Hz, each resonant peak
 * a focusable dot, and a cursor whose readout gives every curve's value
 * (pointer, or arrow keys when the plot has focus). The curves come from
 * `responseCurve` (response-curve.ts), one function, so what is plotted can
 * change in one place. Built with createElementNS and textContent.
 */
import { formatDb, formatHz } from './page-words.js';

export interface PlottedCurve {
  readonly id: string;
  readonly label: string;
  readonly frequenciesHz: readonly number[];
  readonly responseDb: readonly number[];
  readonly peakHz: number | null;
  readonly peakDb: number | null;
}

const SVG = 'http://www.w3.org/2000/svg';
/** Layout of the plot, SVG user units. */
const PLOT = { width: 760, height: 340, left: 56, right: 18, top: 14, bottom: 44, minHz: 20, maxHz: 20000 } as const;
const COLOURS = ['#0f766e', '#b4480b', '#4f46e5', '#a21caf', '#15803d', '#b91c1c', '#0369a1', '#854d0e'];
const FREQUENCY_TICKS = [20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000];
/** dB grid step and range rounding (our choice). */
const DB_STEP = 6;
const DB_RANGE_MAX = 72;
/** A semitone, the arrow keys' step along the frequency axis. */
const SEMITONE = 2 ** (1 / 12);

function svg(name: string, attributes: Record<string, string | number>, parent?: Element): SVGElement {
  const element = document.createElementNS(SVG, name);
  for (const [key, value] of Object.entries(attributes)) element.setAttribute(key, String(value));
  if (parent) parent.appendChild(element);
  return element;
}

/** Linear interpolation of a curve (dB) at a frequency, on log frequency. */
export function responseAt(frequenciesHz: readonly number[], responseDb: readonly number[], hz: number): number {
  const first = frequenciesHz[0];
  if (first === undefined) return Number.NaN;
  if (hz <= first) return responseDb[0] ?? Number.NaN;
  for (let i = 1; i < frequenciesHz.length; i += 1) {
    const high = frequenciesHz[i] as number;
    if (hz <= high) {
      const low = Math.log(frequenciesHz[i - 1] as number);
      const t = (Math.log(hz) - low) / (Math.log(high) - low);
      const a = responseDb[i - 1] as number;
      return a + t * ((responseDb[i] as number) - a);
    }
  }
  return responseDb[responseDb.length - 1] ?? Number.NaN;
}

export function createResponsePlot(plot: SVGSVGElement, legend: HTMLElement, readout: HTMLElement): { draw(curves: readonly PlottedCurve[]): void } {
  let shown: readonly PlottedCurve[] = [];
  let cursorHz = 1000;
  let range = { top: 12, bottom: -36 };
  const xOf = (hz: number): number => PLOT.left + (Math.log(hz / PLOT.minHz) / Math.log(PLOT.maxHz / PLOT.minHz)) * (PLOT.width - PLOT.left - PLOT.right);
  const hzOf = (x: number): number =>
    PLOT.minHz * (PLOT.maxHz / PLOT.minHz) ** Math.max(0, Math.min(1, (x - PLOT.left) / (PLOT.width - PLOT.left - PLOT.right)));
  const yOf = (db: number): number => PLOT.top + ((range.top - db) / (range.top - range.bottom)) * (PLOT.height - PLOT.top - PLOT.bottom);

  function showReadout(): void {
    const cursor = plot.querySelector('#plot-cursor');
    cursor?.setAttribute('x1', String(xOf(cursorHz)));
    cursor?.setAttribute('x2', String(xOf(cursorHz)));
    if (shown.length === 0) {
      readout.textContent = 'Nothing plotted yet: tick "plot" on any rows.';
      return;
    }
    readout.textContent = `At ${formatHz(cursorHz)}: ${shown.map((curve) => `${curve.label} ${formatDb(responseAt(curve.frequenciesHz, curve.responseDb, cursorHz))}`).join(', ')}`;
  }

  function draw(curves: readonly PlottedCurve[]): void {
    shown = curves;
    plot.replaceChildren();
    legend.replaceChildren();
    const all = curves.flatMap((curve) => curve.responseDb.filter((db) => Number.isFinite(db)));
    const top = all.length ? Math.ceil((all.reduce((high, value) => Math.max(high, value), Number.NEGATIVE_INFINITY) + 1) / DB_STEP) * DB_STEP : 12;
    const bottom = all.length ? Math.floor(all.reduce((low, value) => Math.min(low, value), Number.POSITIVE_INFINITY) / DB_STEP) * DB_STEP : -36;
    range = { top, bottom: Math.max(bottom, top - DB_RANGE_MAX) };
    const grid = svg('g', { class: 'grid' }, plot);
    for (const hz of FREQUENCY_TICKS) {
      svg('line', { x1: xOf(hz), x2: xOf(hz), y1: PLOT.top, y2: PLOT.height - PLOT.bottom }, grid);
      svg('text', { x: xOf(hz), y: PLOT.height - PLOT.bottom + 16, 'text-anchor': 'middle' }, grid).textContent = hz >= 1000 ? `${hz / 1000}k` : String(hz);
    }
    const step = range.top - range.bottom > 42 ? 2 * DB_STEP : DB_STEP;
    for (let db = range.bottom; db <= range.top; db += step) {
      svg('line', { x1: PLOT.left, x2: PLOT.width - PLOT.right, y1: yOf(db), y2: yOf(db), class: db === 0 ? 'zero' : '' }, grid);
      svg('text', { x: PLOT.left - 6, y: yOf(db) + 4, 'text-anchor': 'end' }, grid).textContent = `${db > 0 ? '+' : db < 0 ? '\u2212' : ''}${Math.abs(db)}`;
    }
    svg('text', { x: (PLOT.left + PLOT.width - PLOT.right) / 2, y: PLOT.height - 6, 'text-anchor': 'middle', class: 'axis' }, grid).textContent = 'frequency (Hz)';
    const lines = svg('g', {}, plot);
    curves.forEach((curve, index) => {
      const colour = COLOURS[index % COLOURS.length] as string;
      const points: string[] = [];
      curve.frequenciesHz.forEach((hz, i) => {
        const db = curve.responseDb[i] as number;
        if (hz >= PLOT.minHz && hz <= PLOT.maxHz && Number.isFinite(db)) points.push(`${xOf(hz).toFixed(1)},${yOf(Math.max(range.bottom, db)).toFixed(1)}`);
      });
      svg('polyline', { points: points.join(' '), fill: 'none', stroke: colour, 'stroke-width': 2, class: 'curve', 'data-wiring': curve.id }, lines);
      const item = document.createElement('li');
      const swatch = svg('svg', { width: 28, height: 10, 'aria-hidden': 'true' }, item);
      svg('line', { x1: 0, x2: 28, y1: 5, y2: 5, stroke: colour, 'stroke-width': 3 }, swatch);
      const words = document.createElement('span');
      words.textContent = `${curve.label} \u2014 ${curve.peakHz === null ? 'no peak in the audio band' : `peak at ${formatHz(curve.peakHz)}, ${formatDb(curve.peakDb)}`}`;
      item.appendChild(words);
      legend.appendChild(item);
      if (curve.peakHz !== null && curve.peakDb !== null) {
        const marker = svg('circle', { cx: xOf(curve.peakHz), cy: yOf(curve.peakDb), r: 5, fill: colour, class: 'peak-marker', tabindex: 0, role: 'img', 'data-wiring': curve.id }, plot);
        const label = `${curve.label}: resonant peak at ${formatHz(curve.peakHz)}, ${formatDb(curve.peakDb)} above 100 Hz`;
        marker.setAttribute('aria-label', label);
        svg('title', {}, marker).textContent = label;
        marker.addEventListener('focus', () => {
          readout.textContent = label;
        });
      }
    });
    svg('line', { id: 'plot-cursor', class: 'cursor', x1: xOf(cursorHz), x2: xOf(cursorHz), y1: PLOT.top, y2: PLOT.height - PLOT.bottom }, plot);
    showReadout();
  }

  plot.addEventListener('pointermove', (event) => {
    const box = plot.getBoundingClientRect();
    cursorHz = hzOf(((event.clientX - box.left) / box.width) * PLOT.width);
    showReadout();
  });
  plot.addEventListener('keydown', (event) => {
    if (event.key === 'ArrowRight') cursorHz = Math.min(PLOT.maxHz, cursorHz * SEMITONE);
    else if (event.key === 'ArrowLeft') cursorHz = Math.max(PLOT.minHz, cursorHz / SEMITONE);
    else return;
    event.preventDefault();
    showReadout();
  });
  return { draw };
}

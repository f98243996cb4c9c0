/**
 * The knobs' bar both pages share (markup: renderKnobs in
 * src/report/render-listening-page.ts): volume and tone positions, tone
 * capacitor, cable and chain. Reads the fields into Knobs, shows the knob
 * positions beside the sliders, fills the chain choice, and calls `changed`
 * on every move, so the page renders the sound again at the new settings.
 */
import { type ChainName, CHAIN_NAMES } from '../render/portable/index.js';
import { byId } from './transport-bar.js';
import type { Knobs } from './wiring-engine.js';

/** Farads per nanofarad and picofarad (the fields' units). */
const NANO = 1e-9;
const PICO = 1e-12;

export interface KnobFields {
  /** The knobs as the fields now stand. */
  knobs(): Knobs;
}

/**
 * Join the knob fields, shown at `initial`, to the page. A field left empty
 * or at zero keeps the last good value; the tone fields exist only when
 * `initial` has a tone control.
 */
export function connectKnobFields(initial: Knobs, changed: (knobs: Knobs) => void): KnobFields {
  let knobs = initial;
  const hasTone = initial.toneSetting !== null;
  const read = (): Knobs => {
    const volume = Number(byId<HTMLInputElement>('knob-volume').value);
    const tone = hasTone ? Number(byId<HTMLInputElement>('knob-tone').value) : null;
    const capacitor = hasTone ? Number(byId<HTMLInputElement>('knob-tone-capacitor').value) * NANO : null;
    const cable = Number(byId<HTMLInputElement>('knob-cable').value) * PICO;
    const chain = byId<HTMLSelectElement>('knob-chain').value as ChainName;
    return {
      volumeSetting: volume,
      toneSetting: tone,
      toneCapacitorF: capacitor !== null && capacitor > 0 ? capacitor : knobs.toneCapacitorF,
      cableCapacitanceF: cable > 0 ? cable : knobs.cableCapacitanceF,
      chain: CHAIN_NAMES.includes(chain) ? chain : knobs.chain,
    };
  };
  const chainSelect = byId<HTMLSelectElement>('knob-chain');
  chainSelect.replaceChildren(
    ...CHAIN_NAMES.map((name) => {
      const option = document.createElement('option');
      option.value = name;
      option.textContent = name;
      return option;
    }),
  );
  chainSelect.value = knobs.chain;
  byId('knobs').addEventListener('input', () => {
    knobs = read();
    byId('knob-volume-value').textContent = knobs.volumeSetting.toFixed(1);
    if (hasTone) byId('knob-tone-value').textContent = (knobs.toneSetting ?? 0).toFixed(1);
    changed(knobs);
  });
  byId('knobs').addEventListener('submit', (event) => event.preventDefault());
  return { knobs: () => knobs };
}

/**
 * The knobs for one set of the comparison page: the set's own render knobs,
 * with every knob the listener moved away from `shown` (the bar's starting
 * positions) taken from `now`. Tone knobs apply only to a set with a tone
 * control.
 */
export function knobsForSet(own: Knobs, shown: Knobs, now: Knobs): Knobs {
  const hasTone = own.toneSetting !== null;
  return {
    volumeSetting: now.volumeSetting !== shown.volumeSetting ? now.volumeSetting : own.volumeSetting,
    toneSetting: hasTone && now.toneSetting !== null && now.toneSetting !== shown.toneSetting ? now.toneSetting : own.toneSetting,
    toneCapacitorF: hasTone && now.toneCapacitorF !== null && now.toneCapacitorF !== shown.toneCapacitorF ? now.toneCapacitorF : own.toneCapacitorF,
    cableCapacitanceF: now.cableCapacitanceF !== shown.cableCapacitanceF ? now.cableCapacitanceF : own.cableCapacitanceF,
    chain: now.chain !== shown.chain ? now.chain : own.chain,
  };
}

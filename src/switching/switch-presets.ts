/**
 * Generic switches named by their geometry, never by a maker:
 *
 * - `lever-5-position-P-pole`: three contact lugs per pole; positions touch
 *   lug 1, lugs 1+2, lug 2, lugs 2+3, lug 3 (the wiper bridges two adjacent
 *   lugs in the in-between positions; common practice).
 * - `lever-3-position-P-pole`: three lugs, one per position.
 * - `rotary-N-position-P-pole`: N lugs, one per position.
 * - `toggle-2-position-P-pole` (on-on) and `push-pull-P-pole` (a push-pull
 *   pot's switch, also on-on): two lugs, one per position.
 * - `toggle-3-position-P-pole`: on-off-on, two lugs; the middle position
 *   touches neither (common practice; a switch that does something else in
 *   the middle is written out in full).
 */
import { InputError } from '../errors/index.js';
import type { SwitchDefinition } from './switch-kit.js';

/** Largest pole count and position count a preset accepts (common practice: rotary switches of up to a dozen positions and six poles exist). */
export const MAX_POLES = 6;
export const MAX_POSITIONS = 12;
/** Contact lugs of a lever pole (common practice). */
const LEVER_LUGS = 3;
/** Contact lugs of a toggle or push-pull pole. */
const TOGGLE_LUGS = 2;

export const PRESET_NAMES_TEXT =
  'lever-5-position-P-pole, lever-3-position-P-pole, rotary-N-position-P-pole, toggle-2-position-P-pole, toggle-3-position-P-pole or push-pull-P-pole (P poles from 1 to 6, N positions from 2 to 12)';

function definition(name: string, poles: number, contactLugs: number, positions: number[][]): SwitchDefinition {
  return { name, poles, contactLugs, positions };
}

/** The preset's switch, or null when `name` is no preset. */
export function presetSwitch(name: string): SwitchDefinition | null {
  const match = /^(lever-5-position|lever-3-position|rotary-(\d+)-position|toggle-2-position|toggle-3-position|push-pull)-(\d+)-pole$/u.exec(name.trim());
  if (match === null) return null;
  const poles = Number(match[3]);
  if (!(poles >= 1 && poles <= MAX_POLES)) return null;
  const kind = match[1] as string;
  const text = name.trim();
  if (kind === 'lever-5-position') return definition(text, poles, LEVER_LUGS, [[0], [0, 1], [1], [1, 2], [2]]);
  if (kind === 'lever-3-position') return definition(text, poles, LEVER_LUGS, [[0], [1], [2]]);
  if (kind === 'toggle-2-position' || kind === 'push-pull') return definition(text, poles, TOGGLE_LUGS, [[0], [1]]);
  if (kind === 'toggle-3-position') return definition(text, poles, TOGGLE_LUGS, [[0], [], [1]]);
  const count = Number(match[2]);
  if (!(count >= 2 && count <= MAX_POSITIONS)) return null;
  return definition(text, poles, count, Array.from({ length: count }, (_, k) => [k]));
}

/** The preset's switch; InputError naming `path` when there is none of that name. */
export function parsePresetSwitch(name: string, path: string): SwitchDefinition {
  const found = presetSwitch(name);
  if (found === null) throw InputError.at(path, `a switch preset: ${PRESET_NAMES_TEXT}`, name);
  return found;
}

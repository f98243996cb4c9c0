/**
 * Switch kits from the guitar file's `switching` section or from the
 * command line. A switch is a preset name (switch-presets.ts) or written out:
 *
 *   file:  { "name": "my rotary", "poles": 2, "lugs": 4, "positions": [[1], [2], [3], [4]] }
 *   text:  "2-pole: 1 / 1,2 / 2 / 2,3 / 3"   (positions split by "/", lugs by ",", "-" for none)
 *
 * Lugs are numbered from 1 as people count them; positions list the contact
 * lugs the common touches.
 */
import { InputError, type InputProblem, problemAt } from '../errors/index.js';
import { MAX_POLES, MAX_POSITIONS, PRESET_NAMES_TEXT, presetSwitch } from './switch-presets.js';
import { MAX_KIT_POSITIONS, type SwitchDefinition, type SwitchKit, countKitPositions } from './switch-kit.js';
import { maxOf } from '../math/index.js';

/** Most switches in one kit (our choice: a selector and a few mini toggles or push-pulls). */
export const MAX_SWITCHES = 4;
/** Most contact lugs per pole (a twelve-position rotary). */
export const MAX_CONTACT_LUGS = 12;

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function checkPositions(positions: readonly (readonly number[])[], lugs: number, path: string, problems: InputProblem[]): void {
  if (positions.length < 2 || positions.length > MAX_POSITIONS) problems.push(problemAt(path, `2 to ${MAX_POSITIONS} positions`, positions.length));
  positions.forEach((touched, p) => {
    touched.forEach((lug, k) => {
      if (!Number.isInteger(lug) || lug < 0 || lug >= lugs) problems.push(problemAt(`${path}[${p}][${k}]`, `a lug number from 1 to ${lugs}`, lug + 1));
    });
    if (new Set(touched).size !== touched.length) problems.push(problemAt(`${path}[${p}]`, 'each lug at most once', touched.map((lug) => lug + 1)));
  });
  if (positions.every((touched) => touched.length === 0)) problems.push(problemAt(path, 'a switch that touches some lug in some position', 'none'));
}

function checkWhole(value: unknown, min: number, max: number, path: string, what: string, problems: InputProblem[]): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
    problems.push(problemAt(path, `${what}, a whole number from ${min} to ${max}`, value));
    return min;
  }
  return value;
}

/** One switch of the file's `switching.switches` list. */
function parseFileSwitch(raw: unknown, path: string, problems: InputProblem[]): SwitchDefinition | null {
  if (!isRecord(raw)) {
    problems.push(problemAt(path, 'a switch: { "preset": … } or { "poles": …, "lugs": …, "positions": … }', raw));
    return null;
  }
  if (raw['preset'] !== undefined) {
    const found = typeof raw['preset'] === 'string' ? presetSwitch(raw['preset']) : null;
    if (found === null) {
      problems.push(problemAt(`${path}.preset`, PRESET_NAMES_TEXT, raw['preset']));
      return null;
    }
    return typeof raw['name'] === 'string' ? { ...found, name: raw['name'] } : found;
  }
  const before = problems.length;
  const poles = checkWhole(raw['poles'], 1, MAX_POLES, `${path}.poles`, 'the number of poles', problems);
  const lugs = checkWhole(raw['lugs'], 1, MAX_CONTACT_LUGS, `${path}.lugs`, 'contact lugs per pole', problems);
  const positionsRaw = raw['positions'];
  if (!Array.isArray(positionsRaw) || !positionsRaw.every((item) => Array.isArray(item) && item.every((lug) => typeof lug === 'number'))) {
    problems.push(problemAt(`${path}.positions`, 'a list of positions, each a list of lug numbers like [[1], [1, 2], [2]]', positionsRaw));
    return null;
  }
  const positions = (positionsRaw as number[][]).map((touched) => touched.map((lug) => lug - 1).sort((a, b) => a - b));
  checkPositions(positions, lugs, `${path}.positions`, problems);
  if (problems.length > before) return null;
  const name = typeof raw['name'] === 'string' ? raw['name'] : `switch ${path.replace(/^.*\[(\d+)\]$/u, (_, k: string) => String(Number(k) + 1))}`;
  return { name, poles, contactLugs: lugs, positions };
}

function checkKitSize(kit: SwitchKit, path: string): void {
  const count = countKitPositions(kit);
  if (count > MAX_KIT_POSITIONS) throw InputError.at(path, `a kit of at most ${MAX_KIT_POSITIONS} positions`, count);
}

/** The kit of a guitar file's `switching` section (already shape-checked by the guitar file's validator), or null when absent. */
export function parseSwitchingSection(raw: unknown, path = 'switching'): SwitchKit | null {
  if (raw === undefined || raw === null) return null;
  const problems: InputProblem[] = [];
  const list = isRecord(raw) ? raw['switches'] : undefined;
  if (!Array.isArray(list) || list.length < 1 || list.length > MAX_SWITCHES) {
    throw InputError.at(`${path}.switches`, `a list of 1 to ${MAX_SWITCHES} switches`, list);
  }
  const switches = list.map((item, k) => parseFileSwitch(item, `${path}.switches[${k}]`, problems));
  if (problems.length > 0) throw new InputError(problems);
  const kit = { switches: switches as SwitchDefinition[] };
  checkKitSize(kit, path);
  return kit;
}

/** One switch written on the command line: a preset name or "P-pole: lugs / lugs / …". */
export function parseSwitchText(text: string, path: string): SwitchDefinition {
  const trimmed = text.trim();
  const preset = presetSwitch(trimmed);
  if (preset !== null) return preset;
  const match = /^(\d+)-pole\s*:(.*)$/u.exec(trimmed);
  if (match === null) throw InputError.at(path, `a switch: ${PRESET_NAMES_TEXT}, or written out like "2-pole: 1 / 1,2 / 2 / 2,3 / 3"`, text);
  const problems: InputProblem[] = [];
  const poles = checkWhole(Number(match[1]), 1, MAX_POLES, path, 'the number of poles', problems);
  const positions = (match[2] as string).split('/').map((part) => {
    const words = part.trim();
    if (words === '-' || words === '') return [];
    return words.split(',').map((word) => (/^\s*\d+\s*$/u.test(word) ? Number(word) - 1 : Number.NaN)).sort((a, b) => a - b);
  });
  const lugs = maxOf([1, ...positions.flat().filter(Number.isFinite).map((lug) => lug + 1)]);
  checkPositions(positions, Math.min(lugs, MAX_CONTACT_LUGS), path, problems);
  if (positions.flat().some((lug) => Number.isNaN(lug))) problems.push(problemAt(path, 'lug numbers like 1,2 between the "/"', text));
  if (problems.length > 0) throw new InputError(problems);
  return { name: `${poles}-pole switch`, poles, contactLugs: lugs, positions };
}

/** A kit from the command line's switches. */
export function parseSwitchTexts(texts: readonly string[], path = '--switch'): SwitchKit {
  if (texts.length > MAX_SWITCHES) throw InputError.at(path, `at most ${MAX_SWITCHES} switches`, texts.length);
  const kit = { switches: texts.map((text) => parseSwitchText(text, path)) };
  checkKitSize(kit, path);
  return kit;
}

/**
 * Checks raw JSON against a field description, collecting every problem with
 * its path, and returns the value normalised: quantities in SI units, pitches
 * in Hz, defaults filled in. Cross-field rules live in `parse-guitar.ts`.
 */
import { type InputProblem, listWithSuggestion, oneOfChoices, problemAt } from '../errors/index.js';
import { QUANTITY_EXAMPLES, QuantityError, midiToHz, parseNoteName, parseQuantity } from '../units/index.js';
import type { FieldSpec, ObjectSpec, QuantitySpec } from './field-spec.js';

/** Lowest and highest pitch accepted for an open string, in Hz (a wide range around the guitar family; common practice). */
export const PITCH_MIN_HZ = 20;
export const PITCH_MAX_HZ = 2000;

/** Control characters no text field may hold (C0 and C1 controls and DEL; line breaks and tabs are allowed, in notes). */
const CONTROL_CHARACTER = /[\u0000-\u0008\u000B-\u001F\u007F-\u009F]/u;

/** Normalised value: plain JSON with numbers in SI units. */
export type Normalised = unknown;

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function article(word: string): string {
  return /^[aeiou]/iu.test(word) ? `an ${word}` : `a ${word}`;
}

function validateQuantity(spec: QuantitySpec, raw: unknown, path: string, problems: InputProblem[]): number | undefined {
  let value: number;
  try {
    value = parseQuantity(raw, spec.quantity);
  } catch (error) {
    if (error instanceof QuantityError) {
      problems.push(problemAt(path, error.expected, raw));
      return undefined;
    }
    throw error;
  }
  const examples = QUANTITY_EXAMPLES[spec.quantity];
  if (value < 0 || (value === 0 && !spec.zeroAllowed)) {
    const adjective = spec.zeroAllowed ? 'non-negative' : 'positive';
    problems.push(problemAt(path, `a ${adjective} ${spec.quantity} like ${examples}`, raw));
    return undefined;
  }
  if (value < spec.min || value > spec.max) {
    problems.push(problemAt(path, `${article(spec.quantity)} between ${spec.rangeText}`, raw));
    return undefined;
  }
  return value;
}

function validatePitch(raw: unknown, path: string, problems: InputProblem[]): number | undefined {
  const expected = `a note like "E2" or "F#3", or a frequency in Hz between ${PITCH_MIN_HZ} and ${PITCH_MAX_HZ}`;
  let hz: number | undefined;
  if (typeof raw === 'string') {
    const midi = parseNoteName(raw);
    if (midi !== undefined) hz = midiToHz(midi);
    else {
      try {
        hz = parseQuantity(raw, 'frequency');
      } catch {
        hz = undefined;
      }
    }
  } else if (typeof raw === 'number' && Number.isFinite(raw)) {
    hz = raw;
  }
  if (hz === undefined || !(hz >= PITCH_MIN_HZ && hz <= PITCH_MAX_HZ)) {
    problems.push(problemAt(path, expected, raw));
    return undefined;
  }
  return hz;
}

/**
 * Validate `raw` against `spec`; push problems; return the normalised value or
 * undefined when invalid. Paths where a default stood in for a missing field
 * are pushed to `assumed` when given.
 */
export function validateField(
  spec: FieldSpec,
  raw: unknown,
  path: string,
  problems: InputProblem[],
  assumed?: string[],
): Normalised {
  switch (spec.type) {
    case 'quantity':
      return validateQuantity(spec, raw, path, problems);
    case 'pitch':
      return validatePitch(raw, path, problems);
    case 'number': {
      const inRange =
        typeof raw === 'number' &&
        Number.isFinite(raw) &&
        (spec.minExclusive ? raw > spec.min : raw >= spec.min) &&
        raw <= spec.max &&
        (!spec.integer || Number.isInteger(raw));
      if (!inRange) {
        const low = spec.minExclusive ? `above ${spec.min}` : `from ${spec.min}`;
        problems.push(problemAt(path, `${spec.noun} ${low} to ${spec.max}`, raw));
        return undefined;
      }
      return raw;
    }
    case 'string': {
      if (typeof raw !== 'string' || raw.trim() === '' || raw.length > spec.maxLength) {
        problems.push(problemAt(path, `a non-empty text of at most ${spec.maxLength} characters`, raw));
        return undefined;
      }
      if (CONTROL_CHARACTER.test(raw)) {
        problems.push(problemAt(path, 'text without control characters (line breaks and tabs are allowed)', raw));
        return undefined;
      }
      if (spec.pattern && !spec.pattern.test(raw)) {
        problems.push(problemAt(path, spec.patternText ?? `text matching ${spec.pattern.source}`, raw));
        return undefined;
      }
      return raw;
    }
    case 'enum': {
      if (!spec.values.includes(raw as string | number)) {
        problems.push(problemAt(path, oneOfChoices(raw, spec.values, true), raw));
        return undefined;
      }
      return raw;
    }
    case 'array': {
      if (!Array.isArray(raw)) {
        problems.push(problemAt(path, `a list of ${spec.minItems} to ${spec.maxItems} items`, raw));
        return undefined;
      }
      if (raw.length < spec.minItems || raw.length > spec.maxItems) {
        problems.push(problemAt(path, `a list of ${spec.minItems} to ${spec.maxItems} items`, `${raw.length} items`));
        return undefined;
      }
      return raw.map((item, index) => validateField(spec.items, item, `${path}[${index}]`, problems, assumed));
    }
    case 'record': {
      if (!isPlainObject(raw)) {
        problems.push(problemAt(path, 'an object of named entries', raw));
        return undefined;
      }
      const out: Record<string, unknown> = {};
      for (const [key, value] of Object.entries(raw)) {
        const keyPath = `${path}.${key}`;
        if (!spec.keyPattern.test(key)) {
          problems.push(problemAt(keyPath, `a name that is ${spec.keyPatternText}`, key));
          continue;
        }
        out[key] = validateField(spec.values, value, keyPath, problems, assumed);
      }
      return out;
    }
    case 'scalar-or-object':
      return isPlainObject(raw)
        ? validateField(spec.object, raw, path, problems, assumed)
        : validateField(spec.scalar, raw, path, problems, assumed);
    case 'object':
      return validateObject(spec, raw, path, problems, assumed);
  }
}

function validateObject(
  spec: ObjectSpec,
  raw: unknown,
  path: string,
  problems: InputProblem[],
  assumed?: string[],
): Normalised {
  if (!isPlainObject(raw)) {
    problems.push(problemAt(path === '' ? '(top level)' : path, 'an object with fields', raw));
    return undefined;
  }
  const out: Record<string, unknown> = {};
  const known = Object.keys(spec.fields);
  for (const key of Object.keys(raw)) {
    if (!(key in spec.fields)) {
      const at = path === '' ? key : `${path}.${key}`;
      problems.push({ path: at, expected: `one of the known fields (${listWithSuggestion(key, known)})`, got: 'an unknown field' });
    }
  }
  for (const [name, entry] of Object.entries(spec.fields)) {
    const at = path === '' ? name : `${path}.${name}`;
    const present = Object.prototype.hasOwnProperty.call(raw, name);
    const value = raw[name];
    if (!present || value === undefined) {
      if (entry.required) {
        problems.push({ path: at, expected: describeRequired(entry.spec), got: 'nothing (the field is required)' });
      } else if (entry.default !== undefined) {
        if (entry.spec.type !== 'object' && !entry.quietDefault) assumed?.push(at);
        out[name] = validateField(entry.spec, entry.default, at, problems, assumed);
      }
      continue;
    }
    if (value === null) {
      if (entry.nullable) out[name] = null;
      else problems.push(problemAt(at, describeRequired(entry.spec), value));
      continue;
    }
    out[name] = validateField(entry.spec, value, at, problems, assumed);
  }
  return out;
}

/** What a field expects, in a few words, for "missing" messages. */
function describeRequired(spec: FieldSpec): string {
  switch (spec.type) {
    case 'quantity':
      return `${article(spec.quantity)} like ${QUANTITY_EXAMPLES[spec.quantity]}`;
    case 'scalar-or-object':
      return describeRequired(spec.scalar);
    case 'array':
      return `a list of ${spec.minItems} to ${spec.maxItems} items`;
    case 'string':
      return spec.patternText ?? 'a non-empty text';
    case 'enum':
      return `one of ${spec.values.map((v) => JSON.stringify(v)).join(' or ')}`;
    case 'number':
      return `${spec.noun} from ${spec.min} to ${spec.max}`;
    case 'pitch':
      return 'a note like "E2"';
    case 'object':
    case 'record':
      return 'an object with fields';
  }
}

/**
 * A small description language for the guitar file's fields. One description
 * drives both the validator (`validate-fields.ts`) and the JSON Schema shipped
 * for editors (`json-schema.ts`), so the two can never disagree.
 */
import type { QuantityKind } from '../units/index.js';

/** A number in SI units, written as a number or as engineers write it. */
export interface QuantitySpec {
  readonly type: 'quantity';
  readonly quantity: QuantityKind;
  readonly description: string;
  /** Smallest plausible value in SI units (exclusive when 0: the value must be positive). */
  readonly min: number;
  /** Largest plausible value in SI units. */
  readonly max: number;
  /** How the plausible range reads in messages, e.g. "1 mH to 100 H". */
  readonly rangeText: string;
  /** May the value be exactly zero? */
  readonly zeroAllowed?: boolean;
}

/** A plain number (knob settings, relative sensitivities). */
export interface NumberSpec {
  readonly type: 'number';
  readonly description: string;
  readonly min: number;
  readonly max: number;
  readonly minExclusive?: boolean;
  readonly integer?: boolean;
  /** The kind of number in messages, e.g. "a knob setting". */
  readonly noun: string;
}

export interface StringSpec {
  readonly type: 'string';
  readonly description: string;
  readonly pattern?: RegExp;
  /** Words for what the pattern allows, used in messages. */
  readonly patternText?: string;
  readonly maxLength: number;
}

export interface EnumSpec {
  readonly type: 'enum';
  readonly description: string;
  readonly values: readonly (string | number)[];
}

/** A musical pitch: a note name in scientific pitch notation ("E2", "F#3") or a frequency in Hz. */
export interface PitchSpec {
  readonly type: 'pitch';
  readonly description: string;
}

export interface FieldEntry {
  readonly spec: FieldSpec;
  readonly required?: boolean;
  /** Value used when the field is missing, written as in the file. */
  readonly default?: unknown;
  /** Where the default comes from ("common practice", "from memory", a source). */
  readonly defaultSource?: string;
  /** A neutral default not worth pointing out when it is used (relative sensitivities, structure). */
  readonly quietDefault?: boolean;
  /** May the field be `null` to say "this part is absent"? */
  readonly nullable?: boolean;
}

export interface ObjectSpec {
  readonly type: 'object';
  readonly description: string;
  readonly fields: Readonly<Record<string, FieldEntry>>;
}

export interface ArraySpec {
  readonly type: 'array';
  readonly description: string;
  readonly items: FieldSpec;
  readonly minItems: number;
  readonly maxItems: number;
}

/** An object whose keys are names chosen by the user. */
export interface RecordSpec {
  readonly type: 'record';
  readonly description: string;
  readonly keyPattern: RegExp;
  readonly keyPatternText: string;
  readonly values: FieldSpec;
}

/** Either a scalar form or an object form, told apart by whether the value is an object. */
export interface ScalarOrObjectSpec {
  readonly type: 'scalar-or-object';
  readonly description: string;
  readonly scalar: FieldSpec;
  readonly object: ObjectSpec;
}

export type FieldSpec =
  | QuantitySpec
  | NumberSpec
  | StringSpec
  | EnumSpec
  | PitchSpec
  | ObjectSpec
  | ArraySpec
  | RecordSpec
  | ScalarOrObjectSpec;

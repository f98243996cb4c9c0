/**
 * The JSON Schema (draft 2020-12) for guitar files, generated from the same
 * field description the validator uses, so editors complete and check exactly
 * what coilbench accepts (the schema cannot express unit ranges inside
 * strings; coilbench checks those itself).
 */
import type { FieldEntry, FieldSpec, ObjectSpec } from './field-spec.js';
import { GUITAR_SPEC } from './guitar-spec.js';

/** Where the schema sits in the package, relative to the package root; guitar files point at it with "$schema". */
export const SCHEMA_PATH = 'schema/guitar.schema.json';

type JsonSchema = Record<string, unknown>;

/** String forms accepted for each quantity (checked fully by coilbench; the pattern only guides editors). */
const QUANTITY_PATTERNS: Readonly<Record<string, string>> = Object.freeze({
  resistance: '^\\s*[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?\\s*(k|K|M|meg|Meg|MEG|m)?\\s*(\u03A9|\u2126|[oO][hH][mM][sS]?)?\\s*$|^\\d+[kKM]\\d+\\s*(\u03A9|\u2126|[oO][hH][mM][sS]?)?$',
  capacitance: '^\\s*[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?\\s*[pnuµμm]?[Ff]?\\s*$|^\\d\\d[0-6][FGJKM]?$|^\\d+[pnuµμ]\\d+[Ff]?$',
  inductance: '^\\s*[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?\\s*[muµμ]?[Hh]?\\s*$',
  length: '^\\s*[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?\\s*(m|cm|mm|in|inch|inches|")\\s*$',
  frequency: '^\\s*[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?\\s*(k)?([hH][zZ])?\\s*$',
});

function schemaFor(spec: FieldSpec): JsonSchema {
  switch (spec.type) {
    case 'quantity':
      return {
        description: `${spec.description} A number in SI units, or text such as engineers write (plausible range ${spec.rangeText}).`,
        anyOf: [
          { type: 'number', ...(spec.zeroAllowed ? { minimum: 0 } : { exclusiveMinimum: 0 }) },
          { type: 'string', pattern: QUANTITY_PATTERNS[spec.quantity] },
        ],
      };
    case 'number':
      return {
        description: spec.description,
        type: spec.integer ? 'integer' : 'number',
        ...(spec.minExclusive ? { exclusiveMinimum: spec.min } : { minimum: spec.min }),
        maximum: spec.max,
      };
    case 'string':
      return {
        description: spec.description,
        type: 'string',
        minLength: 1,
        maxLength: spec.maxLength,
        ...(spec.pattern ? { pattern: spec.pattern.source } : {}),
      };
    case 'enum':
      return { description: spec.description, enum: [...spec.values] };
    case 'pitch':
      return {
        description: spec.description,
        anyOf: [
          { type: 'string', pattern: '^\\s*[A-Ga-g]([#♯]{0,2}|[b♭]{0,2})-?\\d+\\s*$' },
          { type: 'string', pattern: '^\\s*\\d+(\\.\\d*)?\\s*(k)?[hH][zZ]\\s*$' },
          { type: 'number', exclusiveMinimum: 0 },
        ],
      };
    case 'array':
      return { description: spec.description, type: 'array', items: schemaFor(spec.items), minItems: spec.minItems, maxItems: spec.maxItems };
    case 'record':
      return {
        description: spec.description,
        type: 'object',
        propertyNames: { pattern: spec.keyPattern.source },
        additionalProperties: schemaFor(spec.values),
      };
    case 'scalar-or-object':
      return { description: spec.description, anyOf: [schemaFor(spec.scalar), schemaFor(spec.object)] };
    case 'object':
      return objectSchema(spec);
  }
}

function entrySchema(entry: FieldEntry): JsonSchema {
  const inner = schemaFor(entry.spec);
  const withDefault =
    entry.default !== undefined && entry.spec.type !== 'object'
      ? { ...inner, default: entry.default, description: `${String(inner.description)} Default: ${JSON.stringify(entry.default)} (${entry.defaultSource ?? 'default'}).` }
      : inner;
  return entry.nullable ? { anyOf: [withDefault, { type: 'null' }], description: withDefault.description } : withDefault;
}

function objectSchema(spec: ObjectSpec): JsonSchema {
  const properties: Record<string, JsonSchema> = {};
  const required: string[] = [];
  for (const [name, entry] of Object.entries(spec.fields)) {
    properties[name] = entrySchema(entry);
    if (entry.required) required.push(name);
  }
  return {
    description: spec.description,
    type: 'object',
    properties,
    ...(required.length > 0 ? { required } : {}),
    additionalProperties: false,
  };
}

/** The whole schema document for guitar files. */
export function renderGuitarSchema(): JsonSchema {
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    title: 'coilbench guitar',
    ...objectSchema(GUITAR_SPEC),
  };
}

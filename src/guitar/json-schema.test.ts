/**
 * The shipped JSON Schema is generated from the validator's own field
 * description; here it is checked to be current, and checked by an outside
 * implementation of JSON Schema (Ajv, draft 2020-12) against the samples and
 * the malformed files whose mistake a schema can see.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import { SCHEMA_PATH, renderGuitarSchema } from './json-schema.js';

const root = join(import.meta.dirname, '..', '..');

describe('guitar JSON Schema', () => {
  const shipped = JSON.parse(readFileSync(join(root, SCHEMA_PATH), 'utf8')) as Record<string, unknown>;

  it('is current (run `npm run schema` after changing guitar-spec.ts)', () => {
    expect(shipped).toEqual(renderGuitarSchema());
  });

  const ajv = new Ajv2020.default({ allErrors: true, strict: false });
  const validate = ajv.compile(shipped);

  it('accepts every sample (checked by Ajv)', () => {
    for (const file of readdirSync(join(root, 'samples')).filter((name) => name.endsWith('.json'))) {
      const document = JSON.parse(readFileSync(join(root, 'samples', file), 'utf8')) as unknown;
      expect(validate(document), `${file}: ${JSON.stringify(validate.errors)}`).toBe(true);
    }
  });

  it.each(['unknown-top-field', 'unknown-coil-field', 'missing-name', 'bad-winding', 'volume-setting-too-high', 'bad-taper', 'empty-coils'])(
    'refuses malformed/%s.json (checked by Ajv)',
    (name) => {
      const document = JSON.parse(readFileSync(join(root, 'test', 'malformed', `${name}.json`), 'utf8')) as unknown;
      expect(validate(document)).toBe(false);
    },
  );
});

/** Writes schema/guitar.schema.json from the validator's field description. Run with `npm run schema`. */
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { SCHEMA_PATH, renderGuitarSchema } from '../src/guitar/index.js';

const target = join(import.meta.dirname, '..', SCHEMA_PATH);
mkdirSync(dirname(target), { recursive: true });
writeFileSync(`${target}.tmp`, `${JSON.stringify(renderGuitarSchema(), null, 2)}\n`);
renameSync(`${target}.tmp`, target);
console.log(`wrote ${SCHEMA_PATH}`);

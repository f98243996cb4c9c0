/**
 * Random valid guitars (test/support/random-guitar.ts: 1 to 5 wiring
 * elements, every field drawn across its whole accepted range, limits
 * included) through analyze's computations in-process: no exception, no NaN
 * or Infinity in any raw figure (checked before JSON, which would turn NaN
 * into null and hide it), and the number of wirings 1, 6, 47, 572, 9997 by
 * element count (OEIS A006351 networks times phase patterns, summed over the
 * subsets of elements).
 *
 * The circuit figures are computed for every guitar; the audio figures
 * (each wiring rendered: level, loudness, centroid, checked raw) for a
 * subset, since they are the costly part (about a second per small guitar
 * on a busy 2-core machine); and the whole `analyze` command (in-process
 * through `main`, JSON read back) for a few. Past failures, shrunk, live in
 * test/property-regressions/ and run first.
 *
 * Default: 2,000 guitars (900/700/370/27/3 with 1/2/3/4/5 elements); 24 of
 * them more through the audio figures (10/10/4 with 1/2/3 elements: 258
 * wirings rendered when none is silent) and 3 through the whole analyze
 * command. COILBENCH_PROPERTY_SCALE multiplies every count;
 * COILBENCH_PROPERTY_SEED changes the seed.
 */
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { measureCircuitMetrics } from '../src/circuit/index.js';
import { captureIo, main } from '../src/cli/index.js';
import { parseGuitar } from '../src/guitar/index.js';
import { measureWiringAudio } from '../src/render/index.js';
import { enumerateWirings } from '../src/wiring/index.js';
import { randomGuitar } from './support/random-valid-guitar.js';
import { countFromEnvironment, seededRandom } from './support/seeded-random.js';
import { temporaryFolder } from './support/temporary-folder.js';

const SCALE = countFromEnvironment('COILBENCH_PROPERTY_SCALE', 1);
const SEED = countFromEnvironment('COILBENCH_PROPERTY_SEED', 4242);
/** Guitars per element count (1 to 5) in the default run: cheap ones many, costly ones few. */
const PER_ELEMENT_COUNT = [900, 700, 370, 27, 3].map((count) => count * SCALE);
const FULL_ANALYZE_RUNS = 3 * SCALE;
/** Guitars through the audio figures per element count (1 to 3): each wiring rendered, so small guitars. */
const AUDIO_RUNS = [10, 10, 4].map((count) => count * SCALE);
/** Wirings of 1 to 5 elements (OEIS A006351 series–parallel networks × 2^(n−1) phase patterns, summed over subsets). */
const EXPECTED_WIRINGS = [1, 6, 47, 572, 9997];
/** Fields of a wiring's circuit figures that may be null without a `…Reason` when the guitar is not silent (docs: measure-circuit-metrics.ts). */
const NULLABLE_WHEN_SOUNDING = new Set<string>([]);

const regressions = join(import.meta.dirname, 'property-regressions');
const work = temporaryFolder('property');

/** Faults in one guitar's circuit figures: non-finite numbers, and nulls where a number is due. */
function circuitFaults(document: unknown): string[] {
  const guitar = parseGuitar(document);
  const wirings = enumerateWirings(guitar.elements);
  const faults: string[] = [];
  const expected = EXPECTED_WIRINGS[guitar.elements.length - 1];
  if (wirings.length !== expected) faults.push(`${wirings.length} wirings for ${guitar.elements.length} elements, expected ${expected}`);
  const analysis = measureCircuitMetrics(guitar, wirings);
  analysis.wirings.forEach((figures, index) => {
    const record = figures as unknown as Record<string, unknown>;
    for (const [name, value] of Object.entries(record)) {
      if (name.endsWith('Reason')) continue; // checked with its figure below
      const reason = record[`${name}Reason`];
      if (typeof value === 'number' && !Number.isFinite(value)) faults.push(`${wirings[index]?.expression}: ${name} = ${value}`);
      // A figure that does not exist says why; one that exists carries no reason.
      if (value === null && !analysis.silent && !NULLABLE_WHEN_SOUNDING.has(name) && typeof reason !== 'string') faults.push(`${wirings[index]?.expression}: ${name} is null without a reason`);
      if (value !== null && typeof reason === 'string') faults.push(`${wirings[index]?.expression}: ${name} = ${String(value)} with a reason "${reason}"`);
    }
  });
  return faults;
}

describe('random valid guitars through analyze', () => {
  const cases = readdirSync(regressions).filter((name) => name.endsWith('.json'));
  it.each(cases)('regression %s: finite figures', (name) => {
    const document = JSON.parse(readFileSync(join(regressions, name), 'utf8')) as unknown;
    expect(circuitFaults(document)).toEqual([]);
  });

  it(`${PER_ELEMENT_COUNT.reduce((a, b) => a + b, 0)} random guitars: no exception, every circuit figure finite, counts 1/6/47/572/9997`, () => {
    const random = seededRandom(SEED);
    const failures: string[] = [];
    let tried = 0;
    PER_ELEMENT_COUNT.forEach((count, index) => {
      for (let n = 0; n < count; n += 1) {
        const { document } = randomGuitar(random, index + 1);
        tried += 1;
        let faults: string[];
        try {
          faults = circuitFaults(document);
        } catch (error) {
          faults = [`threw ${error instanceof Error ? error.message : String(error)}`];
        }
        if (faults.length > 0 && failures.length < 5) {
          // Kept for shrinking into test/property-regressions/.
          const file = join(work, `failure-${failures.length}.json`);
          writeFileSync(file, JSON.stringify(document, null, 2));
          failures.push(`${faults.slice(0, 3).join('; ')} (guitar kept in ${file}: ${JSON.stringify(document).slice(0, 300)})`);
        }
      }
    });
    expect(tried).toBeGreaterThanOrEqual(2000 * SCALE);
    expect(failures, failures.join('\n')).toEqual([]);
  }, 300_000 * SCALE); // about 20 s on an idle 2-core machine; a minute or more under load

  it(`${AUDIO_RUNS.reduce((a, b) => a + b, 0)} random guitars through the audio figures: every raw level, loudness and centroid finite`, () => {
    const random = seededRandom(SEED + 2);
    const failures: string[] = [];
    let rendered = 0;
    let silent = 0;
    AUDIO_RUNS.forEach((count, index) => {
      for (let n = 0; n < count; n += 1) {
        const { document } = randomGuitar(random, index + 1);
        try {
          const guitar = parseGuitar(document);
          const wirings = enumerateWirings(guitar.elements);
          // analyze renders nothing when the volume at 0 leaves the output silent; neither does this check.
          if (measureCircuitMetrics(guitar, wirings.slice(0, 1)).silent) {
            silent += 1;
            continue;
          }
          // Raw audio figures, before JSON could hide a NaN as null.
          for (const [id, figures] of measureWiringAudio(guitar, wirings, wirings, {})) {
            rendered += 1;
            for (const [name, value] of Object.entries(figures)) {
              if (!Number.isFinite(value)) failures.push(`${id}: ${name} = ${value} in ${JSON.stringify(document).slice(0, 300)}`);
            }
          }
        } catch (error) {
          failures.push(`threw ${error instanceof Error ? error.message : String(error)} in ${JSON.stringify(document).slice(0, 300)}`);
        }
      }
    });
    console.log(`audio figures: ${AUDIO_RUNS.reduce((a, b) => a + b, 0)} random guitars, ${silent} silent (volume at 0), ${rendered} wirings rendered`);
    expect(failures.slice(0, 5), failures.slice(0, 5).join('\n')).toEqual([]);
    // Most random guitars sound (the volume is at 0 in only a few): the check must have rendered many wirings.
    expect(rendered, `${silent} silent guitars`).toBeGreaterThanOrEqual(100 * SCALE);
  }, 300_000 * SCALE);

  it(`${FULL_ANALYZE_RUNS} random guitars through the whole analyze command: exit 0, every figure a number`, async () => {
    const random = seededRandom(SEED + 1);
    const failures: string[] = [];
    for (let n = 0; n < FULL_ANALYZE_RUNS; n += 1) {
      const { document } = randomGuitar(random, 1 + (n % 2));
      writeFileSync(join(work, 'guitar.json'), JSON.stringify(document));
      const io = captureIo(work);
      const status = await main(['analyze', 'guitar.json', '--json'], io);
      if (status !== 0) {
        failures.push(`analyze exited ${status}: ${io.err().slice(0, 300)}`);
        continue;
      }
      const report = JSON.parse(io.out()) as { silent: boolean; wirings: Array<Record<string, unknown>> };
      if (report.silent) continue;
      for (const row of report.wirings) {
        for (const name of ['levelDb', 'loudnessLufs', 'centroidHz', 'peakDb', 'humDb']) {
          if (typeof row[name] !== 'number') failures.push(`${String(row.id)}: ${name} is ${String(row[name])}`);
        }
      }
    }
    expect(failures.slice(0, 5), failures.slice(0, 5).join('\n')).toEqual([]);
  });
});

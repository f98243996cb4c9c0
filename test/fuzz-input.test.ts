/**
 * Fuzzed bad input, in-process through `main(argv, io)`: malformed guitar
 * files, malformed phrase files and bad option sets, from a seeded generator
 * (the seed is printed with any failure, so a case can be replayed). Every
 * one must exit 2 with one line per problem, each `coilbench: <where>:
 * expected <what>, got <value>` naming the field, no stack trace, and nothing
 * written.
 *
 * Counts per run: 1,000 guitar files, 200 phrase files, 200 option sets;
 * COILBENCH_FUZZ_GUITARS, COILBENCH_FUZZ_PHRASES and COILBENCH_FUZZ_OPTIONS
 * raise them, COILBENCH_FUZZ_SEED changes the seed.
 */
import { existsSync, readFileSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';
import { countFromEnvironment, seededRandom, type Random } from './support/seeded-random.js';
import { temporaryFolder } from './support/temporary-folder.js';

const GUITARS = countFromEnvironment('COILBENCH_FUZZ_GUITARS', 1000);
const PHRASES = countFromEnvironment('COILBENCH_FUZZ_PHRASES', 200);
const OPTION_SETS = countFromEnvironment('COILBENCH_FUZZ_OPTIONS', 200);
const SEED = countFromEnvironment('COILBENCH_FUZZ_SEED', 20261202);

const samples = join(import.meta.dirname, '..', 'samples');
const work = temporaryFolder('fuzz');
const SAMPLE_FILES = ['three-single-coil.json', 'two-humbucker.json', 'humbucker-two-single-coil.json', 'two-lead-humbucker.json'];
const bases = SAMPLE_FILES.map((file) => JSON.parse(readFileSync(join(samples, file), 'utf8')) as Record<string, unknown>);

/** A problem line: `coilbench: <where>: expected <what>, got <value>`, on one line. */
const PROBLEM_LINE = /^coilbench: (.+?): expected (.+), got (.+)$/u;
/** Characters that must never reach the terminal raw: controls and bidi/format marks. */
const HIDDEN = /[\p{Cc}\p{Cf}]/u;

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Path = Array<string | number>;

function clone<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

function pathText(path: Path): string {
  return path.reduce<string>((text, part) => (typeof part === 'number' ? `${text}[${part}]` : text === '' ? part : `${text}.${part}`), '');
}

/** Every place in a document: objects, lists and leaves, with their paths. */
function places(value: Json, path: Path = []): Array<{ path: Path; value: Json }> {
  const here = [{ path, value }];
  if (Array.isArray(value)) return [...here, ...value.flatMap((item, index) => places(item, [...path, index]))];
  if (value !== null && typeof value === 'object') return [...here, ...Object.entries(value).flatMap(([key, item]) => places(item, [...path, key]))];
  return here;
}

function setAt(root: Json, path: Path, value: Json | undefined): void {
  let target = root as Record<string | number, Json>;
  for (const part of path.slice(0, -1)) target = target[part] as Record<string | number, Json>;
  const last = path[path.length - 1] as string | number;
  if (value === undefined) delete target[last];
  else target[last] = value;
}

/** Deeply nested JSON text (built as text: JSON.stringify itself overflows the stack on such values). */
function deepText(depth: number, random: Random): string {
  const opens: string[] = [];
  const closes: string[] = [];
  for (let i = 0; i < depth; i += 1) {
    const list = random.next() < 0.5;
    opens.push(list ? '[' : '{"a":');
    closes.push(list ? ']' : '}');
  }
  return `${opens.join('')}1${closes.reverse().join('')}`;
}

/** A placeholder replaced by deep text after stringifying. */
const DEEP = '@@deep@@';

/** Text that should be shown escaped: line breaks, escape sequences, right-to-left overrides, NUL. */
const NASTY_TEXTS = ['line\nbreak', 'esc\u001b[31mred', 'rtl\u202egnp.exe', 'nul\u0000x', 'zero\u200bwidth', '\u2066isolate\u2069'];
/** Values no leaf of a guitar file accepts (text fields get the non-text ones). */
const BAD_LEAVES: Json[] = [-1, 'abc', '', true, [], {}, '1e999', '-2H', '5.9kΩΩ', 1e308, 'NaN', 'Infinity', ...NASTY_TEXTS];
const BAD_TEXT_LEAVES: Json[] = [-1, true, [], {}, '', '   ', 1e308];
const TEXT_FIELDS = new Set(['name', 'notes', 'id', 'pickup']);
/** Fields every guitar or coil must have. */
const REQUIRED = [['name'], ['coils'], ['coils', 0, 'id'], ['coils', 0, 'position'], ['coils', 0, 'resistance'], ['coils', 0, 'inductance']];

interface Malformed {
  readonly kind: string;
  readonly text: string;
  /** Where the mistake is (a path some message must name), or undefined for file-level faults. */
  readonly at?: string;
}

function malformedGuitar(random: Random): Malformed {
  const base = clone(random.pick(bases)) as Json & Record<string, Json>;
  delete base.$schema;
  const good = JSON.stringify(base, null, 2);
  const kind = random.pick([
    'syntax', 'wrong value', 'wrong value', 'unknown field', 'missing field', 'duplicate id', 'wiring-number id', 'bad id text',
    'deep nesting', 'huge text', 'too many coils', 'outside the scale', 'not an object', 'nasty key',
  ]);
  const coils = base.coils as Array<Record<string, Json>>;
  const coilIndex = random.below(coils.length);
  switch (kind) {
    case 'syntax': {
      const cut = 1 + random.below(good.length - 2);
      const edit = random.pick(['cut', 'comma', 'comment', 'quote', 'brace']);
      const text =
        edit === 'cut' ? good.slice(0, cut)
        : edit === 'comma' ? good.replace(/\n\s*\}\s*$/u, ',\n}')
        : edit === 'comment' ? `// guitar\n${good}`
        : edit === 'quote' ? good.replace('"name"', "'name'")
        : `${good}}`;
      return { kind, text };
    }
    case 'wrong value': {
      const leaves = places(base).filter((place) => place.path.length > 0 && (place.value === null || typeof place.value !== 'object'));
      const place = random.pick(leaves);
      const last = place.path[place.path.length - 1];
      const isText = typeof last === 'string' && TEXT_FIELDS.has(last);
      setAt(base, place.path, random.pick(isText ? BAD_TEXT_LEAVES : BAD_LEAVES));
      return { kind, text: JSON.stringify(base), at: pathText(place.path) };
    }
    case 'unknown field': {
      const objects = places(base).filter((place) => place.value !== null && typeof place.value === 'object' && !Array.isArray(place.value) && place.path[0] !== 'pickups');
      const place = random.pick(objects);
      const key = random.pick(['colour', 'zzz', 'Id', 'resistence', 'inductence', '__proto__x']);
      (place.value as Record<string, Json>)[key] = random.pick([1, 'x', true]);
      return { kind, text: JSON.stringify(base), at: pathText([...place.path, key]) };
    }
    case 'missing field': {
      const path = random.pick(REQUIRED).map((part) => (part === 0 ? coilIndex : part));
      setAt(base, path, undefined);
      return { kind, text: JSON.stringify(base), at: pathText(path) };
    }
    case 'duplicate id': {
      const other = (coilIndex + 1) % coils.length;
      if (other === coilIndex) {
        coils.push(clone(coils[0] as Record<string, Json>));
        return { kind, text: JSON.stringify(base), at: 'coils[1].id' };
      }
      (coils[Math.max(coilIndex, other)] as Record<string, Json>).id = (coils[Math.min(coilIndex, other)] as Record<string, Json>).id as Json;
      return { kind, text: JSON.stringify(base), at: `coils[${Math.max(coilIndex, other)}].id` };
    }
    case 'wiring-number id': {
      (coils[coilIndex] as Record<string, Json>).id = `w${1 + random.below(50)}`;
      return { kind, text: JSON.stringify(base), at: `coils[${coilIndex}].id` };
    }
    case 'bad id text': {
      (coils[coilIndex] as Record<string, Json>).id = random.pick(['neck coil', '1neck', 'neck+mid', 'neck//mid', '~neck', 'x'.repeat(40), ...NASTY_TEXTS]);
      return { kind, text: JSON.stringify(base), at: `coils[${coilIndex}].id` };
    }
    case 'deep nesting': {
      setAt(base, random.pick([['name'], ['controls'], ['coils', coilIndex, 'position'], ['cable']]), DEEP);
      return { kind, text: JSON.stringify(base).replace(`"${DEEP}"`, deepText(40 + random.below(20000), random)) };
    }
    case 'huge text': {
      const huge = `${random.pick(NASTY_TEXTS)}${'x'.repeat(10_000 + random.below(20_000))}`;
      if (random.next() < 0.5) {
        base.name = huge;
        return { kind, text: JSON.stringify(base), at: 'name' };
      }
      (coils[coilIndex] as Record<string, Json>)[huge] = 1;
      return { kind, text: JSON.stringify(base), at: `coils[${coilIndex}]` };
    }
    case 'too many coils': {
      const extra = 7 + random.below(4);
      base.coils = Array.from({ length: extra }, (_, index) => ({ ...(coils[0] as Record<string, Json>), id: `coil_${index}`, pickup: null }) as unknown as Json).map((coil) => {
        delete (coil as Record<string, Json>).pickup;
        return coil;
      });
      delete base.pickups;
      return { kind, text: JSON.stringify(base), at: 'coils' };
    }
    case 'outside the scale': {
      (coils[coilIndex] as Record<string, Json>).position = random.pick(['700mm', '2m', '30in', '0.7']);
      return { kind, text: JSON.stringify(base), at: `coils[${coilIndex}].position` };
    }
    case 'not an object':
      return { kind, text: JSON.stringify(random.pick([[], 1, 'guitar', null, true, [base]])) };
    default: {
      // a key with hidden characters in a record of named entries (pickups) or a coil
      const key = random.pick(NASTY_TEXTS);
      (coils[coilIndex] as Record<string, Json>)[key] = 1;
      return { kind, text: JSON.stringify(base), at: `coils[${coilIndex}]` };
    }
  }
}

/** Tally of tried and held cases per class, printed at the end for the record. */
function tally(): { add(kind: string, held: boolean): void; text(): string } {
  const counts = new Map<string, { tried: number; held: number }>();
  return {
    add(kind, held) {
      const entry = counts.get(kind) ?? { tried: 0, held: 0 };
      entry.tried += 1;
      if (held) entry.held += 1;
      counts.set(kind, entry);
    },
    text: () => [...counts.entries()].map(([kind, { tried, held }]) => `${kind}: ${held}/${tried}`).join('; '),
  };
}

/** Faults in a refused run's output, as readable strings (empty when it held). */
function faultsOf(status: number, out: string, err: string, at: string | undefined): string[] {
  const faults: string[] = [];
  if (status !== 2) faults.push(`status ${status}`);
  if (out !== '') faults.push('output on stdout');
  if (/\n\s+at /u.test(err) || /internal error/u.test(err)) faults.push('stack trace or internal error');
  const lines = err.endsWith('\n') ? err.slice(0, -1).split('\n') : [err];
  if (lines.length === 0 || err === '') faults.push('no message');
  for (const line of lines) {
    if (!PROBLEM_LINE.test(line)) faults.push(`not a problem line: ${JSON.stringify(line.slice(0, 200))}`);
    if (HIDDEN.test(line)) faults.push(`raw hidden character in ${JSON.stringify(line.slice(0, 200))}`);
    if (line.length > 1200) faults.push(`a line of ${line.length} characters`);
  }
  if (at !== undefined) {
    const named = lines.some((line) => {
      const where = PROBLEM_LINE.exec(line)?.[1] ?? '';
      return where.startsWith(at) || at.startsWith(where) || (where.includes('…') && at.startsWith(where.split('…')[0] ?? ''));
    });
    if (!named) faults.push(`no line names ${at}`);
  }
  return faults;
}

function listing(folder: string): string {
  return readdirSync(folder).sort().join(',');
}

describe('fuzzed input: every malformed file or option set is refused cleanly', () => {
  it(`${GUITARS} malformed guitar files exit 2 with one line per problem, naming the field, writing nothing`, async () => {
    const random = seededRandom(SEED);
    const counts = tally();
    const failures: string[] = [];
    const before = listing(work);
    for (let n = 0; n < GUITARS; n += 1) {
      const bad = malformedGuitar(random);
      writeFileSync(join(work, 'bad.json'), bad.text);
      // Most through `check`; some through the commands that write, which must write nothing.
      const command = n % 10 === 0 ? ['analyze', 'bad.json', '--no-audio', '--csv', 'out.csv'] : n % 10 === 1 ? ['render', 'bad.json', '-o', 'out'] : ['check', 'bad.json'];
      // A file `check` accepts would start a real render: report it as a fault instead of running it.
      const checked = await main(['check', 'bad.json'], captureIo(work));
      const io = captureIo(work);
      const status = checked === 0 ? 0 : await main(command, io);
      const faults = faultsOf(status, io.out(), io.err(), bad.at);
      if (existsSync(join(work, 'out.csv')) || existsSync(join(work, 'out'))) faults.push('wrote output');
      counts.add(bad.kind, faults.length === 0);
      if (faults.length > 0 && failures.length < 10) failures.push(`case ${n} (${bad.kind}${bad.at ? ` at ${bad.at}` : ''}): ${faults.join('; ')}\n  ${io.err().slice(0, 400)}`);
    }
    expect(listing(work)).toBe(`${before ? `${before},` : ''}bad.json`);
    console.info(`guitar files, held/tried per class (seed ${SEED}): ${counts.text()}`);
    expect(failures, failures.join('\n')).toEqual([]);
  });

  it(`${PHRASES} malformed phrase files exit 2 and write nothing`, async () => {
    const random = seededRandom(SEED + 1);
    writeFileSync(join(work, 'guitar.json'), readFileSync(join(samples, 'three-single-coil.json')));
    const counts = tally();
    const failures: string[] = [];
    const good = { name: 'a phrase', notes: [{ time: 0, string: 6, fret: 0, velocity: 1 }, { time: 0.5, string: 1, fret: 3, velocity: 0.5, pluck: '60mm', direction: 'up' }] };
    for (let n = 0; n < PHRASES; n += 1) {
      const phrase = clone(good) as { notes: Array<Record<string, Json>> } & Record<string, Json>;
      const note = phrase.notes[random.below(2)] as Record<string, Json>;
      const kind = random.pick(['syntax', 'wrong value', 'out of range', 'pluck beyond the string', 'unknown field', 'empty', 'deep nesting', 'not an object', 'nasty text']);
      let text: string;
      let at: string | undefined;
      const index = phrase.notes.indexOf(note);
      switch (kind) {
        case 'syntax':
          text = JSON.stringify(phrase).slice(0, 5 + random.below(60));
          break;
        case 'wrong value': {
          const field = random.pick(['time', 'string', 'fret', 'velocity', 'pluck', 'direction']);
          note[field] = random.pick(field === 'pluck' ? [-1, true, [], {}, 'abc', '0mm'] : [-1, 'abc', true, [], {}, null, 1e308]);
          if (field === 'direction' || field === 'pluck' || note[field] !== null) at = `notes[${index}].${field}`;
          else at = `notes[${index}].${field}`;
          text = JSON.stringify(phrase);
          break;
        }
        case 'out of range': {
          const [field, value] = random.pick<[string, Json]>([['string', 7], ['string', 0], ['fret', 25], ['fret', 1.5], ['velocity', 0], ['velocity', 1.5], ['time', -0.1], ['time', 1e9]]);
          note[field] = value;
          at = `notes[${index}].${field}`;
          text = JSON.stringify(phrase);
          break;
        }
        case 'pluck beyond the string':
          Object.assign(note, { fret: 12 + random.below(13), pluck: random.pick(['400mm', '500mm', '1.5m', '30in']) });
          at = `notes[${index}].pluck`;
          text = JSON.stringify(phrase);
          break;
        case 'unknown field':
          note[random.pick(['pitch', 'vel', 'Time'])] = 1;
          at = `notes[${index}]`;
          text = JSON.stringify(phrase);
          break;
        case 'empty':
          phrase.notes = [];
          at = 'notes';
          text = JSON.stringify(phrase);
          break;
        case 'deep nesting':
          text = JSON.stringify({ notes: [DEEP] }).replace(`"${DEEP}"`, deepText(40 + random.below(10000), random));
          break;
        case 'not an object':
          text = JSON.stringify(random.pick([[], 3, 'strum', null]));
          break;
        default:
          phrase.name = random.pick([...NASTY_TEXTS.map((nasty) => ({ nasty }) as Json), 5, '']);
          at = 'name';
          text = JSON.stringify(phrase);
      }
      writeFileSync(join(work, 'phrase.json'), text);
      const io = captureIo(work);
      const status = await main(['render', 'guitar.json', '--phrase', 'phrase.json', '-o', 'out', '--only', 'w1'], io);
      const faults = faultsOf(status, io.out(), io.err(), at);
      if (existsSync(join(work, 'out'))) faults.push('wrote output');
      counts.add(kind, faults.length === 0);
      if (faults.length > 0 && failures.length < 10) failures.push(`case ${n} (${kind}): ${faults.join('; ')}\n  ${io.err().slice(0, 400)}`);
    }
    console.info(`phrase files, held/tried per class (seed ${SEED + 1}): ${counts.text()}`);
    expect(failures, failures.join('\n')).toEqual([]);
  });

  it(`${OPTION_SETS} bad option sets exit 2 and write nothing`, async () => {
    const random = seededRandom(SEED + 2);
    writeFileSync(join(work, 'guitar.json'), readFileSync(join(samples, 'three-single-coil.json')));
    const link = join(work, 'link.json');
    if (!existsSync(link)) symlinkSync(join(work, 'guitar.json'), link);
    const counts = tally();
    const failures: string[] = [];
    const guitarBytes = readFileSync(join(work, 'guitar.json'));
    const bad: Array<[string, string[], string]> = [
      ['value', ['--volume', random.pick(['11', '-1', 'loud', '1e999', ''])], '--volume'],
      ['value', ['--tone', random.pick(['11', '-0.5', 'x'])], '--tone'],
      ['value', ['--cable', random.pick(['-1n', 'abc', '5H', '0'])], '--cable'],
      ['value', ['--mains', random.pick(['55', '0', 'x'])], '--mains'],
      ['value', ['--level-threshold', random.pick(['-1', 'x', '0'])], '--level-threshold'],
      ['value', ['--brightness-threshold', random.pick(['-3', 'y'])], '--brightness-threshold'],
    ];
    for (let n = 0; n < OPTION_SETS; n += 1) {
      const command = random.pick(['analyze', 'render']);
      const kind = random.pick(['circuit value', 'command value', 'output onto an input', 'output unusable', 'nasty value']);
      let argv: string[];
      let at: string | undefined;
      if (kind === 'circuit value') {
        const [, extra, option] = random.pick(bad);
        argv = [command, 'guitar.json', ...extra];
        at = option;
      } else if (kind === 'command value') {
        const [option, value] = command === 'analyze'
          ? random.pick<[string, string]>([['--sort', 'loudest'], ['--sort', ''], ['--csv', ' ']])
          : random.pick<[string, string]>([['--rate', '44'], ['--format', 'mp3'], ['--level', 'loud'], ['--hum', '55'], ['--seed', '-1'], ['--seed', '1.5'], ['--only', 'w999'], ['--only', 'neck + nope'], ['--chain', 'fuzz'], ['--phrase', 'no-such-phrase']]);
        argv = [command, 'guitar.json', option, value];
        at = option;
      } else if (kind === 'output onto an input') {
        argv = command === 'analyze' ? ['analyze', random.pick(['guitar.json', 'link.json']), '--no-audio', '--csv', random.pick(['guitar.json', 'link.json', './guitar.json'])] : ['render', 'guitar.json', '-o', random.pick(['guitar.json', 'link.json'])];
        at = command === 'analyze' ? '--csv' : '--output';
      } else if (kind === 'output unusable') {
        const option = command === 'analyze' ? '--csv' : '-o';
        const target = random.pick(command === 'analyze' ? ['.', work, 'missing/out.csv', `${'a'.repeat(300)}.csv`] : [`${'b'.repeat(300)}`, 'guitar.json/x']);
        argv = command === 'analyze' ? ['analyze', 'guitar.json', '--no-audio', option, target] : ['render', 'guitar.json', option, target, '--only', 'w1'];
        at = command === 'analyze' ? '--csv' : '--output';
      } else {
        argv = [command, 'guitar.json', random.pick(['--sort', '--volume', '--cable']), random.pick(NASTY_TEXTS)];
        if (command === 'render' && random.next() < 0.5) argv = ['render', 'guitar.json', '--only', random.pick(NASTY_TEXTS)];
      }
      const before = listing(work);
      const io = captureIo(work);
      const status = await main(argv, io);
      const faults = faultsOf(status, io.out(), io.err(), at);
      if (listing(work) !== before) faults.push('wrote something');
      if (!readFileSync(join(work, 'guitar.json')).equals(guitarBytes)) faults.push('changed the guitar file');
      counts.add(kind, faults.length === 0);
      if (faults.length > 0 && failures.length < 10) failures.push(`case ${n} (${kind}: ${argv.join(' ').slice(0, 120)}): ${faults.join('; ')}\n  ${io.err().slice(0, 400)}`);
    }
    console.info(`option sets, held/tried per class (seed ${SEED + 2}): ${counts.text()}`);
    expect(failures, failures.join('\n')).toEqual([]);
  });
});

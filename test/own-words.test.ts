/**
 * The project speaks in its own words and stands alone: every tracked text
 * file is scanned for references to notes outside the repository, sample
 * coil ids with "-" inside (it reads as a minus sign in an expression), and
 * single-letter placeholders for coils in the notation (our notation names
 * coils by their full ids). The user-facing text of the command line
 * (`--help` of every command) and of the pages is scanned too.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { captureIo, main } from '../src/cli/index.js';

const root = join(import.meta.dirname, '..');

/** Every file git tracks or would track, as text, outside generated folders. */
function trackedTextFiles(): Array<{ path: string; text: string }> {
  const listing = execFileSync('git', ['ls-files', '-co', '--exclude-standard'], { cwd: root, encoding: 'utf8' });
  return listing
    .split('\n')
    .filter((path) => path !== '' && !/(^|\/)(node_modules|dist|renders|test-output)\//u.test(path) && !/\.(wav|png|lock)$|package-lock\.json$/u.test(path))
    .flatMap((path) => {
      try {
        return [{ path, text: readFileSync(join(root, path), 'utf8') }];
      } catch {
        return []; // deleted in the working tree
      }
    });
}

/** Notes that live beside the repository, never in it: the repository must not point at them. */
const OUTSIDE_NOTES = /\b(REFERENCES|USER-NEEDS|CONVENTIONS|TOOLING)\.md\b|\bDESIGN\.md\b|\.\.\/shared\//u;

/** A coil placeholder of one letter in an expression: `a + b`, `a // b`, `~a` in code spans or quotes. */
const SINGLE_LETTER_NOTATION = /[`'"]~?[a-z] ?(\+|\/\/) ?~?[a-z][`'"]|`~[a-z]`/u;

/** Lines that may name the patterns because they define or test for them. */
const SCANNER_FILES = new Set(['test/own-words.test.ts']);

describe('the repository stands alone', () => {
  const files = trackedTextFiles();

  it('scans a real tree', () => {
    // A scan of nothing would pass anything: the tree has its README, docs and sources.
    expect(files.map((file) => file.path)).toEqual(expect.arrayContaining(['README.md', 'DEVELOPERS.md', 'docs/physics.md', 'docs/sources.md']));
  });

  it('no file refers to notes outside the repository', () => {
    const hits = files
      .filter((file) => !SCANNER_FILES.has(file.path))
      .flatMap((file) => file.text.split('\n').flatMap((line, index) => (OUTSIDE_NOTES.test(line) ? [`${file.path}:${index + 1}: ${line.trim()}`] : [])));
    expect(hits).toEqual([]);
  });

  it('sample, test and doc coil ids have no "-" inside', () => {
    const hits: string[] = [];
    for (const file of files.filter((candidate) => candidate.path.endsWith('.json') && !candidate.path.startsWith('schema/'))) {
      for (const match of file.text.matchAll(/"id"\s*:\s*"([^"]*)"/gu)) if (match[1]?.includes('-')) hits.push(`${file.path}: ${match[1]}`);
    }
    expect(hits).toEqual([]);
  });

  it('the notation is explained with real coil names, never one-letter placeholders', () => {
    const hits = files
      .filter((file) => !SCANNER_FILES.has(file.path) && /\.(md|ts|json)$/u.test(file.path))
      .flatMap((file) => file.text.split('\n').flatMap((line, index) => (SINGLE_LETTER_NOTATION.test(line) ? [`${file.path}:${index + 1}: ${line.trim()}`] : [])));
    expect(hits).toEqual([]);
  });
});

/** Words of a published author's peak scale and the labels of existing blind-test tools: the project uses its own. */
const BORROWED_WORDS = /\bpiercing\b|\bbrittle\b|\bPlay [ABX]\b|\bX is [AB]\b/u;

/** Text a user reads: README, the guide, docs, and the pages' code and words. */
const USER_FACING = /^(README\.md|DEVELOPERS\.md|docs\/.*\.md|src\/page\/.*\.ts|src\/report\/.*\.ts)$/u;

describe('user-facing text uses our own words and points only inside the repository', () => {
  const files = trackedTextFiles();

  it('no borrowed peak words or blind-test labels in the README, docs or pages', () => {
    const scanned = files.filter((file) => USER_FACING.test(file.path) && !file.path.endsWith('.test.ts'));
    expect(scanned.length).toBeGreaterThan(10);
    const hits = scanned.flatMap((file) => file.text.split('\n').flatMap((line, index) => (BORROWED_WORDS.test(line) ? [`${file.path}:${index + 1}: ${line.trim()}`] : [])));
    expect(hits).toEqual([]);
  });

  it('every relative link in the README, the guide and docs names a file in the repository', () => {
    const present = new Set(files.map((file) => file.path));
    const missing: string[] = [];
    for (const file of files.filter((candidate) => /^(README|DEVELOPERS)\.md$|^docs\/.*\.md$/u.test(candidate.path))) {
      for (const match of file.text.matchAll(/\]\(([^)#\s]+)(#[^)]*)?\)/gu)) {
        const target = match[1] as string;
        if (/^[a-z]+:/u.test(target)) continue; // an address, not a file
        const base = file.path.includes('/') ? file.path.slice(0, file.path.lastIndexOf('/') + 1) : '';
        const parts: string[] = [];
        for (const part of `${base}${target}`.split('/')) {
          if (part === '..') parts.pop();
          else if (part !== '.' && part !== '') parts.push(part);
        }
        const resolved = parts.join('/');
        const isFolder = [...present].some((path) => path.startsWith(`${resolved}/`));
        if (!present.has(resolved) && !isFolder) missing.push(`${file.path}: ${target}`);
      }
    }
    expect(missing).toEqual([]);
  });
});

describe('the command line speaks in its own words', () => {
  it('no --help text uses one-letter coil placeholders or points outside the repository', async () => {
    const io = captureIo(root);
    expect(await main(['--help'], io)).toBe(0);
    const commands = [...io.out().matchAll(/^ {2}([a-z-]+)\b/gmu)].map((match) => match[1] as string).filter((name) => name !== 'help');
    // The command list itself is read from the help text: it must name the documented commands.
    expect(commands).toEqual(expect.arrayContaining(['check', 'wirings', 'analyze', 'render', 'netlist', 'compare', 'shortlist', 'demo']));
    for (const command of commands) {
      const commandIo = captureIo(root);
      expect(await main([command, '--help'], commandIo), command).toBe(0);
      const text = commandIo.out();
      expect(text.length, command).toBeGreaterThan(0);
      expect(SINGLE_LETTER_NOTATION.test(text), `${command}: ${text}`).toBe(false);
      expect(OUTSIDE_NOTES.test(text), command).toBe(false);
    }
  });
});

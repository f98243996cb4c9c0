/**
 * The numeric core does no I/O (DEVELOPERS.md, how code is written): files under guitar/, wiring/,
 * circuit/, string/, pickup/ and analysis/ (and the units, errors and math
 * they rest on) never import node:fs, process, the clock or the console. And
 * other folders import a folder only through its index.ts.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const src = join(import.meta.dirname, '..', 'src');
const CORE = ['units', 'errors', 'math', 'guitar', 'wiring', 'circuit', 'string', 'pickup', 'analysis', 'switching'];
const FORBIDDEN = [
  /from ['"]node:/u,
  /from ['"](fs|path|os|child_process|worker_threads)['"]/u,
  /\bprocess\./u,
  /\bconsole\./u,
  /\bDate\.now\(/u,
  /\bperformance\.now\(/u,
  /\bMath\.random\(/u,
];

function sourceFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return name.endsWith('.ts') && !name.endsWith('.test.ts') ? [path] : [];
  });
}

describe('architecture', () => {
  const coreFiles = CORE.flatMap((folder) => {
    try {
      return sourceFiles(join(src, folder));
    } catch {
      return [];
    }
  });

  it('finds the core', () => {
    expect(coreFiles.length).toBeGreaterThan(10);
  });

  it.each(coreFiles.map((file) => [relative(src, file), file]))('%s does no I/O', (_, file) => {
    const text = readFileSync(file, 'utf8');
    for (const pattern of FORBIDDEN) expect(text, `${pattern}`).not.toMatch(pattern);
  });

  it('imports other folders only through their index.ts', () => {
    const offenders: string[] = [];
    for (const file of sourceFiles(src)) {
      const folder = relative(src, file).split('/')[0];
      for (const match of readFileSync(file, 'utf8').matchAll(/from '(\.\.\/[^']+)'/gu)) {
        const target = match[1] ?? '';
        const parts = target.split('/').filter((part) => part !== '..');
        if (parts[0] !== folder && parts.length > 1 && parts[parts.length - 1] !== 'index.js') offenders.push(`${relative(src, file)} → ${target}`);
      }
    }
    expect(offenders).toEqual([]);
  });

  // Start-up: an ES module loads every module its imports name, so a command pays for what its
  // barrels pull in. The entry and `analyze` must not reach the render pipeline, the chain or the pages.
  it('keeps the render pipeline, the effects chain and the pages out of the entry and analyze', () => {
    const reached = new Set<string>();
    const visit = (file: string): void => {
      if (reached.has(file)) return;
      reached.add(file);
      for (const match of readFileSync(file, 'utf8').matchAll(/^(?:import|export)\s[^;]*?from '(\.[^']+)'/gmu)) {
        visit(resolve(dirname(file), (match[1] ?? '').replace(/\.js$/u, '.ts')));
      }
    };
    visit(join(src, 'cli', 'main.ts'));
    const fromMain = reached.size;
    visit(join(src, 'cli', 'commands', 'analyze.ts'));
    const heavy = ['render/render-guitar.ts', 'render/render-pass.ts', 'render/effects-chain.ts', 'report/render-listening-page.ts', 'switching/index.ts'];
    expect([...reached].map((file) => relative(src, file)).filter((file) => heavy.includes(file))).toEqual([]);
    expect(fromMain).toBeLessThan(20);
  });
});


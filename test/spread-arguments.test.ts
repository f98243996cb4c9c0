/**
 * No array is spread into a function's arguments (`Math.max(...values)`,
 * `list.push(...items)`): every argument takes a stack slot, and a spread of
 * a few hundred thousand values (the wirings of six elements) overflows the
 * call stack. src/math/extremes.ts has maxOf, minOf and appendAll instead.
 * Read with the TypeScript parser, so comments and strings do not count.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..');
/** Calls whose arguments may be any number of values. */
const VARIADIC = /^(Math\.(max|min|hypot)|.*\.(push|unshift|splice|concat)|String\.fromCharCode|String\.fromCodePoint)$/u;

function sourceFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return name === 'node_modules' ? [] : sourceFiles(path);
    return name.endsWith('.ts') ? [path] : [];
  });
}

describe('spread arguments', () => {
  it('no array is spread into Math.max/min, push, unshift, splice, concat or fromCharCode anywhere in src, test or scripts', () => {
    const found: string[] = [];
    for (const path of ['src', 'test', 'scripts'].flatMap((folder) => sourceFiles(join(root, folder)))) {
      if (path.endsWith('extremes.test.ts')) continue; // shows that such a spread overflows
      const source = ts.createSourceFile(path, readFileSync(path, 'utf8'), ts.ScriptTarget.Latest, true);
      const visit = (node: ts.Node): void => {
        const { line } = source.getLineAndCharacterOfPosition(node.getStart(source));
        // A spread of a slice of fixed, small length may say so on the line above ("bounded spread: …").
        const bounded = /bounded spread/u.test(source.text.split('\n')[line - 1] ?? '');
        if (ts.isCallExpression(node) && !bounded && node.arguments.some(ts.isSpreadElement) && VARIADIC.test(node.expression.getText(source))) {
          found.push(`${relative(root, path)}:${line + 1}: ${node.getText(source).slice(0, 80)}`);
        }
        ts.forEachChild(node, visit);
      };
      visit(source);
    }
    expect(found).toEqual([]);
  });
});

import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import * as acorn from 'acorn';
import { describe, expect, it } from 'vitest';
import { analyzeFile, analyzeSnippet } from '../../analyzers';
import type { FileAnalysis, Fragment } from '../../analyzers/types';
import { analyzeFixture, readFixture } from './languages/fixture';

/**
 * Token ranges (Fragment.tokenStart / tokenEnd): the index range of a fragment's tokens in its
 * file's token stream, so that token metrics can count each source token once by position.
 */

/** Whether a's source range (lines and columns, inclusive) contains b's. */
function containsSource(a: Fragment, b: Fragment): boolean {
  const before = (l1: number, c1: number, l2: number, c2: number) => l1 < l2 || (l1 === l2 && c1 <= c2);
  return before(a.startLine, a.startColumn, b.startLine, b.startColumn) && before(b.endLine, b.endColumn, a.endLine, a.endColumn);
}

/** The properties every file's ranges must have; returns how many nested pairs were seen. */
function checkRanges(result: FileAnalysis): number {
  expect(result.error).toBeUndefined();
  let nested = 0;
  for (const f of result.fragments) {
    expect(f.tokenStart).toBeGreaterThanOrEqual(0);
    expect(f.tokenEnd - f.tokenStart, f.name).toBe(f.tokens);
  }
  for (const a of result.fragments) {
    for (const b of result.fragments) {
      if (a === b) continue;
      if (containsSource(a, b)) {
        // b nests in a: its tokens lie inside a's range.
        expect(a.tokenStart <= b.tokenStart && b.tokenEnd <= a.tokenEnd, `${b.name} in ${a.name}`).toBe(true);
        nested++;
      } else if (!containsSource(b, a)) {
        // Neither nests in the other: the ranges do not overlap.
        expect(a.tokenEnd <= b.tokenStart || b.tokenEnd <= a.tokenStart, `${a.name} / ${b.name}`).toBe(true);
      }
    }
  }
  return nested;
}

/** Offset of a 1-based line and column (lines end with \n). */
function offsetOf(text: string, line: number, column: number): number {
  let offset = 0;
  for (let l = 1; l < line; l++) offset = text.indexOf('\n', offset) + 1;
  return offset + column - 1;
}

describe('fragment token ranges', () => {
  it('nest for nested JavaScript functions, do not overlap for siblings, and span `tokens` tokens', async () => {
    const result = await analyzeFixture('shipments.js');
    expect(checkRanges(result)).toBeGreaterThanOrEqual(2); // surcharge and the reduce callback in quoteShipment
    const outer = result.fragments.find((f) => f.name === 'quoteShipment')!;
    const inner = result.fragments.find((f) => f.name === 'surcharge')!;
    expect(inner.tokenStart).toBeGreaterThan(outer.tokenStart);
    expect(inner.tokenEnd).toBeLessThan(outer.tokenEnd);
  });

  it('equal the index of the fragment in the token stream of a different tokenizer, acorn@8.19.0, on express@5.3.0 lib/*.js', async () => {
    // express's lib is real published CommonJS (no JSX, no private names), where Babel's tokens
    // and acorn's coincide one for one; acorn is the reference stream here.
    const require = createRequire(import.meta.url);
    const lib = path.join(path.dirname(require.resolve('express/package.json')), 'lib');
    let checked = 0;
    for (const name of fs.readdirSync(lib).filter((f) => f.endsWith('.js'))) {
      const text = fs.readFileSync(path.join(lib, name), 'utf8');
      const starts = [...acorn.tokenizer(text, { ecmaVersion: 'latest', sourceType: 'script', allowHashBang: true })].map((t) => t.start);
      const result = await analyzeFile(`lib/${name}`, text, { minTokens: 1 });
      checkRanges(result);
      for (const f of result.fragments) {
        const start = offsetOf(text, f.startLine, f.startColumn);
        const end = offsetOf(text, f.endLine, f.endColumn) + 1;
        expect(f.tokenStart, `${name} ${f.name}`).toBe(starts.filter((s) => s < start).length);
        expect(f.tokenEnd, `${name} ${f.name}`).toBe(starts.filter((s) => s < end).length);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });

  it('nest and do not overlap for Python (tree-sitter), decorated methods and nested classes included', async () => {
    const result = await analyzeFixture('dockside.py');
    expect(checkRanges(result)).toBeGreaterThanOrEqual(1); // fits inside berth_window
    // berth_window comes right after `import functools`, the file's first two tokens.
    expect(result.fragments[0]!.tokenStart).toBe(2);
  });

  it('count the tokens of one stream: `def f(x): return x` is 8 tokens, the next function starts at 8', async () => {
    const result = await analyzeFile('a.py', 'def f(x):\n    return x\n\ndef g(y):\n    return y\n', { minTokens: 1 });
    expect(result.fragments.map((f) => [f.name, f.tokenStart, f.tokenEnd])).toEqual([
      ['f', 0, 8],
      ['g', 8, 16],
    ]);
  });

  it('index the stream without annotations when TypeScript annotations are dropped, and the full one when kept', async () => {
    const text = readFixture('tariffs.ts.txt');
    const dropped = await analyzeFile('tariffs.ts', text, { minTokens: 1 });
    const kept = await analyzeFile('tariffs.ts', text, { minTokens: 1, includeTypeAnnotations: true });
    checkRanges(dropped);
    checkRanges(kept);
    expect(dropped.fragments.map((f) => f.name)).toEqual(kept.fragments.map((f) => f.name));
    // Annotations before and inside each fragment only add tokens: every index grows or stays.
    dropped.fragments.forEach((f, i) => {
      expect(kept.fragments[i]!.tokenStart).toBeGreaterThanOrEqual(f.tokenStart);
      expect(kept.fragments[i]!.tokenEnd).toBeGreaterThanOrEqual(f.tokenEnd);
    });
    expect(kept.fragments.some((f, i) => f.tokens > dropped.fragments[i]!.tokens)).toBe(true);
  });

  describe('edge cases', () => {
    it('index the whole stream, not the kept fragments: dropping small fragments does not shift the others', async () => {
      const text = 'function a() { return 1; }\nfunction b(x) { const y = x * 2; return [x, y, x + y, x - y]; }\n';
      const all = await analyzeFile('a.js', text, { minTokens: 1 });
      const big = await analyzeFile('a.js', text, { minTokens: 20 });
      expect(all.fragments.map((f) => [f.tokenStart, f.tokenEnd])).toEqual([
        [0, 9],
        [9, 38],
      ]);
      expect(big.fragments.map((f) => [f.name, f.tokenStart, f.tokenEnd])).toEqual([['b', 9, 38]]);
    });

    it('make a whole-snippet fragment cover the snippet stream [0, n)', async () => {
      const [whole] = await analyzeSnippet('javascript', 'const total = crates.length;\ntotal * 2;');
      expect(whole!.name).toBe('<snippet>');
      expect([whole!.tokenStart, whole!.tokenEnd, whole!.tokens]).toEqual([0, 11, 11]);
    });

    it('ignore comments: a comment between two functions shifts no index', async () => {
      const plain = await analyzeFile('a.js', 'function a() { return 1; }\nfunction b() { return 2; }\n', { minTokens: 1 });
      const commented = await analyzeFile('a.js', 'function a() { return 1; }\n/* crane two */\nfunction b() { return 2; } // end\n', { minTokens: 1 });
      expect(commented.fragments.map((f) => [f.tokenStart, f.tokenEnd])).toEqual(plain.fragments.map((f) => [f.tokenStart, f.tokenEnd]));
    });
  });
});

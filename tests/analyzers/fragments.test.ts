import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { createHash } from 'node:crypto';
import * as acorn from 'acorn';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeFile, analyzeSnippet, shingleSet } from '../../analyzers';
import { buildFragments, resolveOptions, type FragmentSpan } from '../../analyzers/fragments';
import { tokenForm, type TokenClass, type TokenStream } from '../../analyzers/tokens';
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

describe('buildFragments', () => {
  // Token texts chosen to stress the per-file shingle table: tokens that extend others (`=`,
  // `==`, `a`, `a#`, `a"`), texts that need escaping (`x#2`), and few of them, so windows repeat
  // ten times and more (`s#10` sorts before `s#2`).
  const TEXTS = ['=', '==', '===', 'a', 'a#', 'a"', 'a!', '#', 'x#2', 'b', ' '];
  const CLASSES: TokenClass[] = ['other', 'other', 'identifier', 'string'];

  it('gives every fragment exactly the shingle set, hashes and range of its own tokens (oracle: shingleSet and a plain join)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: TEXTS.length - 1 }), fc.integer({ min: 0, max: CLASSES.length - 1 })), { maxLength: 120 }),
        fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 8 }),
        fc.integer({ min: 1, max: 4 }),
        fc.boolean(),
        (picked, rawSpans, k, normalize) => {
          const n = picked.length;
          const tokens: TokenStream = { starts: [], ends: [], texts: [], classes: [] };
          picked.forEach(([t, c], i) => {
            tokens.starts.push(2 * i);
            tokens.ends.push(2 * i + 1);
            tokens.texts.push(TEXTS[t]!);
            tokens.classes.push(CLASSES[c]!);
          });
          const spans: FragmentSpan[] = rawSpans.map(([a, b]) => {
            const start = a % (2 * n + 1);
            return { name: `f${a}`, kind: 'function', start, end: start + (b % (2 * n + 2 - start)) };
          });
          const options = resolveOptions({ shingleSize: k, minTokens: 1, normalize });
          const fragments = buildFragments(' '.repeat(2 * n + 1), tokens, spans, options);
          const forms = (norm: boolean) => tokens.texts.map((t, i) => tokenForm(t, tokens.classes[i]!, norm));
          const sha1 = (parts: string[]) => createHash('sha1').update(parts.join('\u0000')).digest('hex');
          for (const f of fragments) {
            const from = f.tokenStart;
            const to = f.tokenEnd;
            expect(to - from).toBe(f.tokens);
            expect(f.shingles).toEqual(shingleSet(forms(normalize).slice(from, to), k));
            expect(f.rawHash).toBe(sha1(forms(false).slice(from, to)));
            expect(f.normalizedHash).toBe(sha1(forms(true).slice(from, to)));
          }
          // Every span with tokens became a fragment (minTokens 1), each at its own token range
          // (token i starts at offset 2i).
          const expected = spans
            .map((sp) => [Math.min(n, Math.ceil(sp.start / 2)), Math.min(n, Math.ceil(sp.end / 2))] as const)
            .filter(([a, b]) => b > a)
            .map(([a, b]) => `${a}-${b}`)
            .sort();
          expect(fragments.map((f) => `${f.tokenStart}-${f.tokenEnd}`).sort()).toEqual(expected);
        },
      ),
      { numRuns: 400 },
    );
  });

  describe('edge cases', () => {
    it('gives the same sets when one window repeats more than ten times', () => {
      const texts = Array.from({ length: 40 }, (_, i) => (i % 2 === 0 ? '=' : '=='));
      const tokens: TokenStream = { starts: texts.map((_, i) => i), ends: texts.map((_, i) => i + 1), texts, classes: texts.map(() => 'other') };
      const [whole, tail] = buildFragments(' '.repeat(41), tokens, [
        { name: 'whole', kind: 'function', start: 0, end: 40 },
        { name: 'tail', kind: 'function', start: 25, end: 40 },
      ], resolveOptions({ shingleSize: 2, minTokens: 1 }));
      expect(whole!.shingles).toEqual(shingleSet(texts, 2));
      expect(whole!.shingles).toContain('=\u001f==#10');
      expect(tail!.shingles).toEqual(shingleSet(texts.slice(25), 2));
    });

    it('returns no fragments for spans without tokens', () => {
      const tokens: TokenStream = { starts: [0], ends: [1], texts: ['a'], classes: ['identifier'] };
      expect(buildFragments('a  ', tokens, [{ name: 'empty', kind: 'function', start: 1, end: 3 }], resolveOptions({ minTokens: 0 }))).toEqual([]);
    });
  });
});

import { describe, expect, it } from 'vitest';
import { analyzeFile, analyzeSnippet, jaccard, languageForPath } from '../../analyzers';

// The same fragment written twice by different hands (invented: a freight quote).
const QUOTE_A = `function quote(order) {
  let total = 0;
  for (const crate of order.crates) {
    if (crate.kg > 30) total += crate.kg * 1.5;
    else total += crate.kg;
  }
  return total + order.fee;
}`;
const QUOTE_RENAMED = `function price(ship) {
  let sum = 10;
  for (const box of ship.boxes) {
    if (box.weight > 45) sum += box.weight * 2.25;
    else sum += box.weight;
  }
  return sum + ship.charge;
}`;
const QUOTE_TS = `function quote(order: Order): number {
  let total: number = 0;
  for (const crate of order.crates as Crate[]) {
    if (crate.kg > 30) total += crate.kg * 1.5;
    else total += crate.kg;
  }
  return total + order.fee!;
}`;
const QUOTE_EDITED = QUOTE_A.replace('return total + order.fee;', 'log(total);\n  return total + order.fee;');

const opts = { minTokens: 1 };

describe('analyzeFile identities', () => {
  it('gives renamed identifiers and changed literals the same normalised hash and similarity 1.0', async () => {
    const [a] = (await analyzeFile('a.js', QUOTE_A, opts)).fragments;
    const [b] = (await analyzeFile('b.js', QUOTE_RENAMED, opts)).fragments;
    expect(a!.rawHash).not.toBe(b!.rawHash);
    expect(a!.normalizedHash).toBe(b!.normalizedHash);
    expect(jaccard(a!.shingles, b!.shingles)).toBe(1);
  });

  it('matches a type-annotated TS function with its plain JS twin (type 1) when annotations are ignored', async () => {
    const [js] = (await analyzeFile('quote.js', QUOTE_A, opts)).fragments;
    const [ts] = (await analyzeFile('quote.ts', QUOTE_TS, opts)).fragments;
    expect(ts!.tokens).toBe(js!.tokens);
    expect(ts!.rawHash).toBe(js!.rawHash);
    expect(jaccard(js!.shingles, ts!.shingles)).toBe(1);
    const [counted] = (await analyzeFile('quote.ts', QUOTE_TS, { ...opts, includeTypeAnnotations: true })).fragments;
    expect(jaccard(js!.shingles, counted!.shingles)).toBeLessThan(1);
  });

  it('gives an edited copy a similarity strictly between 0 and 1', async () => {
    const [a] = (await analyzeFile('a.js', QUOTE_A, opts)).fragments;
    const [e] = (await analyzeFile('e.js', QUOTE_EDITED, opts)).fragments;
    const s = jaccard(a!.shingles, e!.shingles);
    expect(s).toBeGreaterThan(0.7);
    expect(s).toBeLessThan(1);
  });

  it('with normalisation off, only type-1 copies match fully', async () => {
    const off = { ...opts, normalize: false };
    const [a] = (await analyzeFile('a.js', QUOTE_A, off)).fragments;
    const [b] = (await analyzeFile('b.js', QUOTE_RENAMED, off)).fragments;
    const [a2] = (await analyzeFile('c.js', `${QUOTE_A}\n`, off)).fragments;
    expect(jaccard(a!.shingles, a2!.shingles)).toBe(1);
    expect(jaccard(a!.shingles, b!.shingles)).toBeLessThan(0.5);
  });

  it('uses the shingle size asked for', async () => {
    const [k1] = (await analyzeFile('a.js', QUOTE_A, { ...opts, shingleSize: 1 })).fragments;
    const [k5] = (await analyzeFile('a.js', QUOTE_A, { ...opts, shingleSize: 5 })).fragments;
    expect(k1!.shingles).toHaveLength(k1!.tokens);
    expect(k5!.shingles).toHaveLength(k5!.tokens - 4);
  });

  it('normalises identifiers and literals the same way in a tree-sitter language', async () => {
    const a = 'def quote(order):\n    total = 0\n    for c in order.crates:\n        total += c.kg * 1.5\n    return total\n';
    const b = 'def price(ship):\n    s = 7\n    for b in ship.boxes:\n        s += b.weight * 2\n    return s\n';
    const [fa] = (await analyzeFile('a.py', a, opts)).fragments;
    const [fb] = (await analyzeFile('b.py', b, opts)).fragments;
    expect(fa!.normalizedHash).toBe(fb!.normalizedHash);
    expect(fa!.rawHash).not.toBe(fb!.rawHash);
  });

  describe('edge cases', () => {
    it('reports files of unknown language as an error record, and rejects bad options with a clear message', async () => {
      expect((await analyzeFile('notes.txt', 'x')).error).toBe('no analyzer for .txt');
      expect((await analyzeFile('Makefile', 'x')).error).toBe('no analyzer for files without an extension');
      await expect(analyzeFile('a.js', '', { shingleSize: 0 })).rejects.toThrow(/options.shingleSize must be a positive integer, got 0/);
      await expect(analyzeFile('a.js', '', { minTokens: -1 })).rejects.toThrow(/options.minTokens/);
    });

    it('maps extensions case-insensitively', () => {
      expect(languageForPath('src/App.TSX')).toBe('typescript');
      expect(languageForPath('a/b.cjs')).toBe('javascript');
      expect(languageForPath('x.cs')).toBe('csharp');
      expect(languageForPath('x.go')).toBe('go');
      expect(languageForPath('x.c')).toBe('c');
      expect(languageForPath('x.unknown')).toBeUndefined();
      expect(languageForPath('.gitignore')).toBeUndefined();
    });
  });
});

describe('analyzeSnippet', () => {
  it('returns the functions of a pasted function', async () => {
    const fragments = await analyzeSnippet('javascript', QUOTE_RENAMED);
    expect(fragments.map((f) => f.name)).toEqual(['price']);
    const [file] = (await analyzeFile('a.js', QUOTE_A, opts)).fragments;
    expect(fragments[0]!.normalizedHash).toBe(file!.normalizedHash);
  });

  it('treats a pasted body (no function around it) as one fragment, even when indented', async () => {
    const body = '    let total = 0;\n    for (const c of crates) total += c.kg;\n    return total;\n';
    const fragments = await analyzeSnippet('javascript', body);
    expect(fragments.map((f) => [f.name, f.startLine, f.endLine])).toEqual([['<snippet>', 1, 3]]);
    const py = await analyzeSnippet('python', '        total = 0\n        for c in crates:\n            total += c.kg\n');
    expect(py.map((f) => f.name)).toEqual(['<snippet>']);
  });

  it('reads a Java method pasted without its class', async () => {
    const fragments = await analyzeSnippet('java', 'public long fee(long kg) {\n  return kg * 3;\n}\n');
    expect(fragments.map((f) => f.name)).toEqual(['fee']);
  });

  describe('edge cases', () => {
    it('rejects an unknown language, naming the known ones', async () => {
      await expect(analyzeSnippet('cobol', 'x')).rejects.toThrow(/unknown language "cobol"; expected one of javascript, typescript/);
    });

    it('returns nothing for an empty snippet', async () => {
      expect(await analyzeSnippet('go', '   \n')).toEqual([]);
    });
  });
});

import { describe, expect, it } from 'vitest';
import { analyzeFile, analyzeFiles, analyzeSnippet, LANGUAGES } from '../../analyzers';
import { AnalysisLimitError, checkFragmentWork, checkNestingDepth } from '../../analyzers/limits';
import { ANALYSIS_LIMITS } from '../../shared/constants';

const encode = (s: string) => new TextEncoder().encode(s);
const DEPTH = ANALYSIS_LIMITS.maxNestingDepth;

/** The nested-lambda input of the hardening report: each lambda is a fragment holding all the inner ones. */
const nestedLambdas = (n: number) => `f = ${'lambda: '.repeat(n)}1\n`;

/**
 * `depth` functions (or classes around one method, where the language nests no named functions
 * in functions) nested in each other, plus enough flat code outside them that the fragments' tokens stay within the
 * nested-token limit: only the depth is on trial.
 */
const NESTED: Record<string, { path: string; nest: (depth: number) => string }> = {
  javascript: { path: 'a.js', nest: (d) => `${'function f() { let a = 1;\n'.repeat(d)}${'}\n'.repeat(d)}${'let b = [1, 2, 3];\n'.repeat(d * d)}` },
  typescript: { path: 'a.ts', nest: (d) => `${'function f(): void { let a = 1;\n'.repeat(d)}${'}\n'.repeat(d)}${'let b = [1, 2, 3];\n'.repeat(d * d)}` },
  python: {
    path: 'a.py',
    nest: (d) => `${Array.from({ length: d }, (_, i) => `${' '.repeat(i)}def f${i}():\n${' '.repeat(i + 1)}a = 1\n`).join('')}${'b = [1, 2, 3]\n'.repeat(d * d)}`,
  },
  java: { path: 'A.java', nest: (d) => `${'class C { int a = 1;\n'.repeat(d - 1)}void m() { int x = 1; }\n${'}\n'.repeat(d - 1)}class D { int[] b = {${'1, '.repeat(d * d * 4)}}; }\n` },
  go: { path: 'a.go', nest: (d) => `package a\nfunc f() {\n${'_ = func() { a := 1; _ = a\n'.repeat(d - 1)}${'}\n'.repeat(d)}var b = []int{${'1, '.repeat(d * d * 4)}}\n` },
  csharp: { path: 'A.cs', nest: (d) => `${'class C { int a = 1;\n'.repeat(d - 1)}void M() { int x = 1; }\n${'}\n'.repeat(d - 1)}class D { int[] b = {${'1, '.repeat(d * d * 4)}}; }\n` },
  // GNU C nested functions; tree-sitter's C grammar reads them as function definitions.
  c: { path: 'a.c', nest: (d) => `${'int f(int a) { int x = a;\n'.repeat(d)}${'}\n'.repeat(d)}int b[] = {${'1, '.repeat(d * d * 4)}};\n` },
  cpp: { path: 'a.cpp', nest: (d) => `${'struct S { int a = 1;\n'.repeat(d - 1)}void m() { int x = 1; }\n${'};\n'.repeat(d - 1)}int b[] = {${'1, '.repeat(d * d * 4)}};\n` },
};

describe('the nesting limit', () => {
  it('covers every language', () => {
    expect(Object.keys(NESTED).sort()).toEqual(LANGUAGES.map((l) => l.id).sort());
  });

  for (const [language, { path, nest }] of Object.entries(NESTED)) {
    it(`refuses ${language} nested one level past the limit, naming it, and analyses it at the limit`, async () => {
      const over = await analyzeFile(path, nest(DEPTH + 1), { minTokens: 1 });
      expect(over.fragments).toEqual([]);
      expect(over.error).toBe(`functions and classes nested more than ${DEPTH} deep (nesting limit)`);
      const at = await analyzeFile(path, nest(DEPTH), { minTokens: 1 });
      expect(at.error).toBeUndefined();
      expect(at.fragments.length).toBeGreaterThan(0);
    });
  }
});

describe('the fragment and nested-token limits', () => {
  it('refuse the nested-lambda input of the hardening report in a fraction of a second, naming the limit', async () => {
    const started = performance.now();
    await expect(analyzeSnippet('python', nestedLambdas(24_999))).rejects.toThrow(/\(nesting limit\)$/);
    const shallow = await analyzeFile('f.py', nestedLambdas(40), { minTokens: 1 });
    expect(shallow.error).toMatch(/^nested fragments hold [\d.]+ times the file's tokens, more than 8 times \(nested-token limit\)$/);
    expect(performance.now() - started).toBeLessThan(10_000);
  });

  it('refuse a file with more fragments than the limit, and a snippet with more than the snippet limit', async () => {
    const many = (n: number) => 'function f() {}\n'.repeat(n);
    expect((await analyzeFile('a.js', many(ANALYSIS_LIMITS.maxFragmentsPerFile + 1), { minTokens: 1 })).error).toBe(
      '10,001 fragments, more than 10,000 (fragment limit)',
    );
    expect((await analyzeFile('a.js', many(ANALYSIS_LIMITS.maxFragmentsPerFile), { minTokens: 1 })).fragments).toHaveLength(10_000);
    await expect(analyzeSnippet('javascript', many(ANALYSIS_LIMITS.maxSnippetFragments + 1))).rejects.toThrow('1,001 fragments, more than 1,000 (fragment limit)');
  });

  it('report a file over a limit inside analyzeFiles with its reason, and analyse the others', async () => {
    const { files, skipped } = await analyzeFiles(
      [
        // On one line of 200 kB the report's input is skipped before analysis, as machine-written.
        { path: 'attack.py', content: encode(nestedLambdas(24_999)) },
        { path: 'deep.py', content: encode(NESTED.python.nest(DEPTH + 1)) },
        { path: 'crates.py', content: encode('def crates(n):\n    return n * 2\n') },
        { path: 'shallow.py', content: encode(nestedLambdas(40)) },
        { path: 'fee.js', content: encode('function fee(kg) { return kg * 3; }\n') },
      ],
      { minTokens: 1, workers: 1 },
    );
    expect(skipped).toEqual([{ path: 'attack.py', reason: 'minified file (long lines)' }]);
    expect(files.map((f) => [f.path, f.error?.replace(/[\d.]+ times the/, 'N times the')])).toEqual([
      ['deep.py', `functions and classes nested more than ${DEPTH} deep (nesting limit)`],
      ['crates.py', undefined],
      ['shallow.py', "nested fragments hold N times the file's tokens, more than 8 times (nested-token limit)"],
      ['fee.js', undefined],
    ]);
    expect(files[0]?.fragments).toEqual([]);
    expect(files[1]?.fragments.map((f) => f.name)).toEqual(['crates']);
    expect(files[3]?.fragments.map((f) => f.name)).toEqual(['fee']);
  }, 60_000);

  describe('edge cases', () => {
    it('let work exactly at the bounds through and stop one past them', () => {
      expect(() => checkNestingDepth(DEPTH)).not.toThrow();
      expect(() => checkNestingDepth(DEPTH + 1)).toThrow(AnalysisLimitError);
      expect(() => checkFragmentWork(10, 800, 100)).not.toThrow();
      expect(() => checkFragmentWork(10, 801, 100)).toThrow('(nested-token limit)');
    });
  });
});

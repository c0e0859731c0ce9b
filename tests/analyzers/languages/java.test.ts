import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('java analyzer', () => {
  it('finds constructors, annotated methods, lambdas and methods of nested classes; skips bodiless interface methods', async () => {
    const result = await analyzeFixture('Ledger.java');
    expect(result.language).toBe('java');
    expect(outline(result)).toEqual([
      ['Ledger.Ledger', 'constructor', 9, 5, 11, 5],
      ['Ledger.toString', 'method', 13, 5, 16, 5],
      ['Ledger.balance', 'method', 18, 5, 22, 5],
      ['<anonymous>', 'lambda', 20, 24, 20, 33],
      ['Ledger.Audit.check', 'method', 29, 9, 33, 9],
      ['<anonymous>', 'lambda', 30, 26, 32, 13],
    ]);
  });

  describe('edge cases', () => {
    it('keeps the good methods of a class with a broken one', async () => {
      const text = 'class A {\n  int ok() { return 1; }\n  int bad( { return 2; }\n  int fine() { return 3; }\n}\n';
      const result = await analyzeFile('A.java', text, { minTokens: 1 });
      expect(result.syntaxErrors).toBeGreaterThan(0);
      expect(result.fragments.map((f) => f.name)).toContain('A.ok');
    });
  });
});

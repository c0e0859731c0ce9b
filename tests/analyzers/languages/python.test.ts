import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('python analyzer', () => {
  it('finds functions, nested functions, methods (from the first decorator), nested classes and named lambdas', async () => {
    const result = await analyzeFixture('dockside.py');
    expect(result.language).toBe('python');
    expect(result.syntaxErrors).toBeUndefined();
    expect(outline(result)).toEqual([
      ['berth_window', 'function', 5, 1, 9, 44],
      ['fits', 'function', 6, 5, 7, 38],
      ['Crane.__init__', 'constructor', 13, 5, 14, 32],
      ['Crane.lifts_needed', 'method', 16, 5, 19, 37],
      ['Crane.Spreader.lock', 'method', 22, 9, 23, 23],
      ['heavier', 'lambda', 26, 11, 26, 40],
    ]);
  });

  it('makes one token of a string, f-string interpolations included', async () => {
    const a = await analyzeFile('a.py', 'def f(x):\n    return f"{x} crates"\n', { minTokens: 1 });
    const b = await analyzeFile('a.py', 'def f(x):\n    return "crates"\n', { minTokens: 1 });
    expect(a.fragments[0]!.tokens).toBe(b.fragments[0]!.tokens);
    expect(a.fragments[0]!.normalizedHash).toBe(b.fragments[0]!.normalizedHash);
  });

  describe('edge cases', () => {
    it('keeps the functions before a syntax error and reports the error count', async () => {
      const result = await analyzeFixture('broken.py');
      expect(result.error).toBeUndefined();
      expect(result.syntaxErrors).toBeGreaterThan(0);
      expect(outline(result)[0]).toEqual(['good', 'function', 1, 1, 2, 16]);
    });

    it('does not take the `lambda` keyword for a second lambda', async () => {
      const result = await analyzeFile('a.py', 'f = lambda: 1\n', { minTokens: 1 });
      expect(outline(result)).toEqual([['f', 'lambda', 1, 5, 1, 13]]);
    });
  });
});

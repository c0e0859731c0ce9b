import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('go analyzer', () => {
  it('finds functions, methods named after their receiver type (pointer or value) and function literals', async () => {
    const result = await analyzeFixture('routes.go');
    expect(result.language).toBe('go');
    expect(outline(result)).toEqual([
      ['NewPlanner', 'function', 10, 1, 12, 1],
      ['Planner.Legs', 'method', 14, 1, 19, 1],
      ['<anonymous>', 'lambda', 15, 11, 17, 2],
      ['Planner.Label', 'method', 21, 1, 23, 1],
    ]);
  });

  describe('edge cases', () => {
    it('skips a function declared without a body (implemented in assembly)', async () => {
      const result = await analyzeFile('a.go', 'package a\nfunc fast(x int) int\n', { minTokens: 1 });
      expect(result.fragments).toEqual([]);
    });

    it('reads a raw string as one literal token', async () => {
      const a = await analyzeFile('a.go', 'package a\nfunc f() string { return `x\ny` }\n', { minTokens: 1 });
      // func f ( ) string { return `…` }: nine tokens, the two-line raw string one of them.
      expect(a.fragments[0]!.tokens).toBe(9);
    });
  });
});

import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('c analyzer', () => {
  it('finds function definitions, through pointer declarators', async () => {
    const result = await analyzeFixture('pallet.c');
    expect(result.language).toBe('c');
    expect(outline(result)).toEqual([
      ['pallets_for', 'function', 4, 1, 7, 1],
      ['pallet_label', 'function', 9, 1, 12, 1],
      ['main', 'function', 14, 1, 18, 1],
    ]);
  });

  describe('edge cases', () => {
    it('ignores prototypes and function pointer declarations', async () => {
      const text = 'int add(int a, int b);\nstatic int (*pick)(void);\n';
      expect((await analyzeFile('a.c', text, { minTokens: 1 })).fragments).toEqual([]);
    });
  });
});

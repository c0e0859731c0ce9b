import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('csharp analyzer', () => {
  it('finds constructors, accessors, expression-bodied properties, attributed methods, local functions and lambdas', async () => {
    const result = await analyzeFixture('Invoice.cs');
    expect(result.language).toBe('csharp');
    expect(outline(result)).toEqual([
      ['Invoice.Invoice', 'constructor', 10, 9, 13, 9],
      ['Invoice.Gross', 'getter', 17, 13, 17, 38],
      ['Invoice.Gross', 'setter', 18, 13, 18, 39],
      ['Invoice.Tax', 'getter', 21, 9, 21, 41],
      ['Invoice.Total', 'method', 23, 9, 29, 9],
      ['Round', 'function', 26, 13, 26, 65],
      ['<anonymous>', 'lambda', 27, 43, 27, 52],
    ]);
  });

  describe('edge cases', () => {
    it('skips auto-properties and abstract methods (nothing written to copy)', async () => {
      const text = 'abstract class A { public int X { get; set; } public abstract int Y(); }';
      expect((await analyzeFile('A.cs', text, { minTokens: 1 })).fragments).toEqual([]);
    });
  });
});

import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline, readFixture } from './fixture';

describe('typescript analyzer', () => {
  it('finds methods (decorators included), constructors with parameter properties and generic arrows; skips abstract methods', async () => {
    const result = await analyzeFixture('tariffs.ts.txt', 'tariffs.ts');
    expect(result.language).toBe('typescript');
    expect(outline(result)).toEqual([
      ['TariffTable.constructor', 'constructor', 7, 3, 7, 49],
      ['TariffTable.factorFor', 'method', 9, 3, 13, 3],
      ['<anonymous>', 'arrow', 11, 34, 11, 67],
      ['roundFee', 'arrow', 18, 25, 18, 87],
    ]);
  });

  it('leaves type annotations out of the token count by default and counts them on request', async () => {
    const text = readFixture('tariffs.ts.txt');
    const plain = await analyzeFile('tariffs.ts', text, { minTokens: 1 });
    const typed = await analyzeFile('tariffs.ts', text, { minTokens: 1, includeTypeAnnotations: true });
    const round = (r: typeof plain) => r.fragments.find((f) => f.name === 'roundFee')!.tokens;
    // ( fee ) => Math . round ( fee ): `<N extends number>`, `: N`, `: number`, `as number` dropped.
    expect(round(plain)).toBe(10);
    expect(round(typed)).toBe(21);
  });

  it('reads .tsx with JSX', async () => {
    const text = 'export function Row({ id }: { id: string }): JSX.Element {\n  return <tr key={id}><td>{id}</td></tr>;\n}\n';
    const result = await analyzeFile('row.tsx', text, { minTokens: 1 });
    expect(outline(result)).toEqual([['Row', 'function', 1, 8, 3, 1]]);
  });

  describe('edge cases', () => {
    it('does not drop a modifier word used as a variable name', async () => {
      const text = 'function f(declare: number) { const abstract = declare; return abstract; }';
      const withWords = await analyzeFile('a.ts', text, { minTokens: 1 });
      const renamed = await analyzeFile('a.js', 'function f(declare) { const abstract = declare; return abstract; }', { minTokens: 1 });
      expect(withWords.fragments[0]!.rawHash).toBe(renamed.fragments[0]!.rawHash);
    });

    it('treats `<T>x` as a cast in .ts but JSX is refused there, not silently mis-read', async () => {
      const cast = 'const f = (x: unknown) => <number>x;';
      const asCast = await analyzeFile('a.ts', cast, { minTokens: 1 });
      expect(asCast.error).toBeUndefined();
      expect(asCast.syntaxErrors).toBeUndefined();
      expect(asCast.fragments.map((f) => f.name)).toEqual(['f']);
      // The same text in .tsx is an unclosed JSX element, so .ts really was read without JSX.
      expect((await analyzeFile('a.tsx', cast, { minTokens: 1 })).error).toEqual(expect.any(String));

      const jsx = await analyzeFile('a.ts', 'const f = () => <div>x</div>;', { minTokens: 1 });
      expect(jsx.error).toEqual(expect.stringMatching(/\S/));
      expect(jsx.fragments).toEqual([]);
    });
  });
});

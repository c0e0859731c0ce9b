import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('javascript analyzer', () => {
  it('finds functions, nested functions, class and object methods, accessors and arrows with exact ranges', async () => {
    const result = await analyzeFixture('shipments.js');
    expect(result.language).toBe('javascript');
    expect(result.error).toBeUndefined();
    expect(outline(result)).toEqual([
      ['quoteShipment', 'function', 4, 8, 10, 1],
      ['<anonymous>', 'arrow', 5, 38, 5, 67],
      ['surcharge', 'function', 6, 3, 8, 3],
      ['Manifest.constructor', 'constructor', 14, 3, 16, 3],
      ['Manifest.count', 'getter', 17, 3, 19, 3],
      ['Manifest.captain', 'setter', 20, 3, 22, 3],
      ['Manifest.add', 'method', 23, 3, 25, 3],
      ['Manifest.empty', 'method', 26, 3, 28, 3],
      ['Manifest.printLabel', 'arrow', 29, 16, 29, 37],
      ['desk.open', 'method', 33, 3, 35, 3],
      ['desk.close', 'function', 36, 10, 38, 3],
      ['module.exports.legacyQuote', 'arrow', 41, 30, 42, 7],
    ]);
  });

  it('counts a nested function inside its enclosing function too', async () => {
    const result = await analyzeFixture('shipments.js');
    const outer = result.fragments.find((f) => f.name === 'quoteShipment')!;
    const inner = result.fragments.find((f) => f.name === 'surcharge')!;
    const arrow = result.fragments.find((f) => f.startLine === 5)!;
    // quoteShipment's own tokens plus both nested ones: the outer count exceeds their sum.
    expect(outer.tokens).toBeGreaterThan(inner.tokens + arrow.tokens);
    expect(outer.tokens).toBe(61);
  });

  it('drops fragments below minTokens (default 50)', async () => {
    const text = 'function small(a) { return a + 1; }\n';
    expect((await analyzeFile('a.js', text)).fragments).toEqual([]);
    expect((await analyzeFile('a.js', text, { minTokens: 12 })).fragments).toHaveLength(1);
    expect((await analyzeFile('a.js', text, { minTokens: 13 })).fragments).toHaveLength(0);
  });

  it('reads .mjs, .cjs and .jsx, JSX included', async () => {
    const jsx = 'export const Badge = ({ label }) => <span className="badge">{label}</span>;\n';
    const result = await analyzeFile('badge.jsx', jsx, { minTokens: 1 });
    expect(outline(result)).toEqual([['Badge', 'arrow', 1, 22, 1, 74]]);
    const cjs = await analyzeFile('a.cjs', 'with (obj) { module.exports = function go() { return 1; }; }', { minTokens: 1 });
    expect(cjs.fragments.map((f) => f.name)).toEqual(['go']);
    expect((await analyzeFile('a.mjs', 'export default () => 1;', { minTokens: 1 })).fragments[0]!.name).toBe('default');
  });

  describe('edge cases', () => {
    it('returns an error record, not an exception, for a file that cannot be parsed', async () => {
      const result = await analyzeFixture('broken.js');
      expect(result.fragments).toEqual([]);
      expect(result.error).toMatch(/\(6:\d+\)/);
    });

    it('keeps fragments and counts errors the parser recovered from', async () => {
      const result = await analyzeFile('a.js', 'function twice() { let x = 1; let x = 2; return x; }', { minTokens: 1 });
      expect(result.syntaxErrors).toBe(1);
      expect(result.fragments.map((f) => f.name)).toEqual(['twice']);
    });

    it('handles an empty file and a file of comments', async () => {
      expect((await analyzeFile('a.js', '')).fragments).toEqual([]);
      expect((await analyzeFile('a.js', '// only a comment\n/* and another */')).fragments).toEqual([]);
    });

    it('reports columns in UTF-16 code units and lines across CRLF', async () => {
      const result = await analyzeFile('a.js', 'const s = "é😀";\r\nfunction f() {\r\n  return s;\r\n}\r\n', { minTokens: 1 });
      expect(outline(result)).toEqual([['f', 'function', 2, 1, 4, 1]]);
    });
  });
});

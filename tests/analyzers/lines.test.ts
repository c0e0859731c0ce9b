import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../analyzers';
import { LineIndex, splitLines } from '../../analyzers/lines';

/**
 * Three small JavaScript functions joined by the given line breaks. JavaScript, because its
 * grammar makes a lone CR a line terminator too (ECMAScript LineTerminator), so the parser and
 * the splitter agree on every ending.
 */
function javascriptSource(breaks: readonly string[]): string {
  const lines = [
    'function alpha(a) {',
    '  return a + 1; }',
    '',
    'function beta(b) {',
    '  const total = b * 2;',
    '  return total; }',
    '',
    'function gamma(c) {',
    '  return c - 3; }',
  ];
  return lines.map((line, i) => line + (breaks[i % breaks.length] ?? '\n')).join('');
}

describe('splitLines', () => {
  it('breaks at \\n, \\r\\n and a lone \\r, and keeps an empty last line after a final break', () => {
    expect(splitLines('a\nb\r\nc\rd')).toEqual(['a', 'b', 'c', 'd']);
    expect(splitLines('a\r\r\nb\n')).toEqual(['a', '', 'b', '']);
  });

  describe('edge cases', () => {
    it('gives one empty line for an empty text', () => {
      expect(splitLines('')).toEqual(['']);
    });
  });
});

describe('LineIndex', () => {
  it('puts every character on the line splitLines puts it on', () => {
    const text = 'ab\rcd\r\nef\n\rg\r\r\nh';
    const lines = splitLines(text);
    const index = new LineIndex(text);
    for (let offset = 0; offset < text.length; offset++) {
      const c = text[offset];
      if (c === '\r' || c === '\n') continue;
      const { line, column } = index.position(offset);
      expect(lines[line - 1]?.[column - 1], `offset ${offset}`).toBe(c);
    }
  });
});

describe('fragment lines and the code cut for them', () => {
  for (const [name, breaks] of [
    ['LF', ['\n']],
    ['CR only', ['\r']],
    ['CRLF', ['\r\n']],
    ['mixed', ['\r', '\r\n', '\n', '\r\n']],
  ] as const) {
    it(`agree with ${name} line endings`, async () => {
      const text = javascriptSource(breaks);
      const { fragments, error } = await analyzeFile('ledger.js', text, { minTokens: 1 });
      expect(error).toBeUndefined();
      expect(fragments.map((f) => [f.name, f.startLine, f.endLine])).toEqual([
        ['alpha', 1, 2],
        ['beta', 4, 6],
        ['gamma', 8, 9],
      ]);
      const lines = splitLines(text);
      const cut = (f: { startLine: number; endLine: number }) => lines.slice(f.startLine - 1, f.endLine).join('\n');
      expect(fragments.map(cut)).toEqual([
        'function alpha(a) {\n  return a + 1; }',
        'function beta(b) {\n  const total = b * 2;\n  return total; }',
        'function gamma(c) {\n  return c - 3; }',
      ]);
    });
  }
});

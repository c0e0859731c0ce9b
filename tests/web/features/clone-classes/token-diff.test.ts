import { describe, expect, it } from 'vitest';
import { alignLines } from '@/features/clone-classes/lib/align-lines';
import { diffTokens, type ChangeMark } from '@/features/clone-classes/lib/token-diff';
import { tokenize } from '@/features/clone-classes/lib/tokenize';

/** The marked text of each mark, with its kind: what a reader sees highlighted. */
function marked(code: string, marks: ChangeMark[]): string[] {
  return marks.map((m) => `${m.change}:${code.slice(m.start, m.end)}`);
}

function compare(left: string, right: string) {
  const diff = diffTokens(tokenize(left), tokenize(right));
  return { left: marked(left, diff.left), right: marked(right, diff.right), renames: Object.fromEntries(diff.renames) };
}

describe('tokenize', () => {
  it('splits identifiers, keywords, numbers, strings, comments and punctuation with their offsets', () => {
    const code = "const fee = rate * 0.15; // per tonne\nlabel = 'a \\' b' + `x`;";
    const tokens = tokenize(code);
    expect(tokens.map((t) => `${t.kind}:${t.text}`)).toEqual([
      'keyword:const', 'identifier:fee', 'punctuation:=', 'identifier:rate', 'punctuation:*', 'number:0.15', 'punctuation:;',
      'comment:// per tonne',
      'identifier:label', 'punctuation:=', "string:'a \\' b'", 'punctuation:+', 'string:`x`', 'punctuation:;',
    ]);
    for (const t of tokens) expect(code.slice(t.start, t.end)).toBe(t.text);
  });

  it('reads multi-character operators as one token', () => {
    expect(tokenize('a ?? b === c => d').map((t) => t.text)).toEqual(['a', '??', 'b', '===', 'c', '=>', 'd']);
  });

  describe('edge cases', () => {
    it('gives no tokens for empty or blank text', () => {
      expect(tokenize('')).toEqual([]);
      expect(tokenize(' \n\t ')).toEqual([]);
    });

    it('ends an unterminated string or comment at the end of the text', () => {
      expect(tokenize('x = "abc').map((t) => t.kind)).toEqual(['identifier', 'punctuation', 'string']);
      expect(tokenize('/* open').map((t) => t.kind)).toEqual(['comment']);
    });
  });
});

// Hand-worked pairs: each expected mark was worked out by reading the two snippets.
describe('diffTokens', () => {
  it('marks nothing when the copies are identical', () => {
    const code = 'function total(xs) {\n  return xs.length * 2;\n}';
    expect(compare(code, code)).toEqual({ left: [], right: [], renames: {} });
  });

  it('marks one inserted statement on the right and nothing on the left', () => {
    const left = 'let sum = 0;\nreturn sum;';
    const right = 'let sum = 0;\nsum += fee;\nreturn sum;';
    expect(compare(left, right)).toEqual({ left: [], right: ['inserted:sum += fee;'], renames: {} });
  });

  it('marks a removed statement on the left only', () => {
    expect(compare('a();\nb();\nc();', 'a();\nc();')).toEqual({ left: ['removed:b();'], right: [], renames: {} });
  });

  it('marks a consistently renamed identifier as renamed at every place, on both sides', () => {
    const left = 'for (const wagon of wagons) total += wagon.axles;';
    const right = 'for (const car of wagons) total += car.axles;';
    expect(compare(left, right)).toEqual({
      left: ['renamed:wagon', 'renamed:wagon'],
      right: ['renamed:car', 'renamed:car'],
      renames: { wagon: 'car' },
    });
  });

  it('marks a changed literal as changed on both sides', () => {
    expect(compare('const hazard = base * 0.15;', 'const hazard = base * 0.2;')).toEqual({
      left: ['changed:0.15'],
      right: ['changed:0.2'],
      renames: {},
    });
  });

  it('keeps a rename and a changed literal apart in one pair', () => {
    const left = 'price(wagons, 3);\nlog(wagons);';
    const right = 'price(units, 4);\nlog(units);';
    expect(compare(left, right)).toEqual({
      left: ['renamed:wagons', 'changed:3', 'renamed:wagons'],
      right: ['renamed:units', 'changed:4', 'renamed:units'],
      renames: { wagons: 'units' },
    });
  });

  it('keeps a rename when the old name also sits in removed code', () => {
    // The demo's drift: the copy lost `+ contract.fixedFee`, and `contract` became `agreement` elsewhere.
    const left = 'return round(contract.rate) + contract.fixedFee;';
    const right = 'return round(agreement.rate);';
    expect(compare(left, right)).toEqual({
      left: ['renamed:contract', 'removed:+ contract.fixedFee'],
      right: ['renamed:agreement'],
      renames: { contract: 'agreement' },
    });
  });

  describe('edge cases', () => {
    it('does not call a name renamed when it is replaced by different names at different places', () => {
      // `x` becomes `y` once and `z` once: not one consistent new name, so both are changes.
      expect(compare('f(x); g(x);', 'f(y); g(z);')).toEqual({
        left: ['changed:x', 'changed:x'],
        right: ['changed:y', 'changed:z'],
        renames: {},
      });
    });

    it('never treats a keyword swap as a rename', () => {
      expect(compare('let a = 1;', 'const a = 1;')).toEqual({ left: ['changed:let'], right: ['changed:const'], renames: {} });
    });

    it('marks everything inserted when the left copy is empty', () => {
      expect(compare('', 'a + b')).toEqual({ left: [], right: ['inserted:a + b'], renames: {} });
    });
  });
});

describe('alignLines', () => {
  it('pairs anchored lines and faces the longer side with blank rows', () => {
    expect(alignLines([[0, 0], [2, 3]], 3, 4)).toEqual([[0, 0], [1, 1], [null, 2], [2, 3]]);
  });

  describe('edge cases', () => {
    it('skips an anchor that would cross an earlier one and keeps every line once, in order', () => {
      const rows = alignLines([[1, 2], [2, 0], [3, 3]], 4, 4);
      expect(rows.map((r) => r[0]).filter((x) => x !== null)).toEqual([0, 1, 2, 3]);
      expect(rows.map((r) => r[1]).filter((x) => x !== null)).toEqual([0, 1, 2, 3]);
      expect(rows).toContainEqual([3, 3]);
    });

    it('gives no rows for two empty copies', () => {
      expect(alignLines([], 0, 0)).toEqual([]);
    });
  });
});

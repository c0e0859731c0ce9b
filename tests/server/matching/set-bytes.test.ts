import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rankFlatIntegerSets, rankIntegerSets } from '../../../server/matching/order';
import { parseSetBytes, SetSyntaxError, type FlatSets } from '../../../server/matching/set-bytes';

/** The reading parseSetBytes replaces, written the obvious way with strings: the reference. */
function parseWithStrings(text: string): number[][] {
  const lines = text.split(/\r?\n/);
  if (lines[lines.length - 1] === '') lines.pop();
  return lines.map((line) => (line.trim() === '' ? [] : line.trim().split(/[ \t]+/).map(Number)));
}

function sets({ tokens, offsets }: FlatSets): number[][] {
  return Array.from({ length: offsets.length - 1 }, (_, s) => Array.from(tokens.subarray(offsets[s], offsets[s + 1])));
}

const parse = (text: string) => parseSetBytes(Buffer.from(text, 'utf8'));

/** Why parsing `text` failed: the 0-based set and the token. */
function failure(text: string): { set: number; token: string } {
  try {
    parse(text);
  } catch (error) {
    if (error instanceof SetSyntaxError) return { set: error.set, token: error.token };
    throw error;
  }
  throw new Error('parsed');
}

describe('parseSetBytes', () => {
  it('reads what the string reading reads, for any spacing, empty lines and line ends', () => {
    const token = fc.integer({ min: 0, max: 0x7fffffff }).map(String);
    const gap = fc.constantFrom(' ', '\t', '  ', ' \t ');
    const line = fc.tuple(fc.constantFrom('', ' ', '\t'), fc.array(fc.tuple(token, gap), { maxLength: 8 }), fc.constantFrom('', ' ')).map(
      ([lead, tokens, trail]) => `${lead}${tokens.map(([t, g], i) => (i === 0 ? t : `${g}${t}`)).join('')}${trail}`,
    );
    fc.assert(
      fc.property(fc.array(line, { maxLength: 12 }), fc.constantFrom('\n', '\r\n'), fc.boolean(), (lines, end, finalNewline) => {
        const text = lines.join(end) + (finalNewline && lines.length > 0 ? end : '');
        expect(sets(parse(text))).toEqual(parseWithStrings(text));
      }),
    );
  });

  it('ranks flat sets exactly as rankIntegerSets ranks the same sets', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.oneof(fc.integer({ min: 0, max: 40 }), fc.integer({ min: 0, max: 0x7fffffff })), { maxLength: 10 }), { maxLength: 15 }), (raw) => {
        const flat = rankFlatIntegerSets(parse(raw.map((set) => `${set.join(' ')}\n`).join('')));
        const reference = rankIntegerSets(raw);
        expect(flat.ranked).toEqual(reference.ranked);
        expect(new Map(Array.from(flat.tokenOfRank, (token, rank) => [token, rank]))).toEqual(reference.dictionary);
      }),
    );
  });

  describe('edge cases', () => {
    it('reads no sets from empty input, and an empty line as an empty set', () => {
      expect(sets(parse(''))).toEqual([]);
      expect(sets(parse('\n'))).toEqual([[]]);
      expect(sets(parse('3 1 3\n\n7'))).toEqual([[3, 1, 3], [], [7]]);
      expect(sets(parse('1\r'))).toEqual([[1]]);
    });

    it('names the set and the token of a malformed line', () => {
      expect(failure('1 2\n4 -5 6\n')).toEqual({ set: 1, token: '-5' });
      expect(failure('1\n1.5')).toEqual({ set: 1, token: '1.5' });
      expect(failure('2147483648')).toEqual({ set: 0, token: '2147483648' });
      expect(failure('00000000001')).toEqual({ set: 0, token: '00000000001' });
      expect(failure('7 x7')).toEqual({ set: 0, token: 'x7' });
      expect(failure(`${'9'.repeat(30)}`)).toEqual({ set: 0, token: `${'9'.repeat(20)}…` });
      expect(sets(parse('2147483647 0000000001'))).toEqual([[2147483647, 1]]);
    });

    it('refuses a carriage return that does not end a line, so "\\r"-only line ends are not one set', () => {
      expect(failure('1\r2\r3\n')).toEqual({ set: 0, token: '1\r2\r3' });
      expect(() => parse('1\r2\n')).toThrow('line 1 (set 0): "1\\r2" is not');
      expect(sets(parse('1 \r\n2\r\n'))).toEqual([[1], [2]]);
    });

    it('says which line in the message, 1-based beside the 0-based set', () => {
      expect(() => parse('1\n\nz')).toThrow('line 3 (set 2): "z" is not an integer in 0..2147483647');
    });
  });
});

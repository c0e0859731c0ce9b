import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rankIntegerSets, rankShingles } from '../../../server/matching/order';

/** Document frequency of each token, repeats inside a set counted once. */
function frequencies<T>(sets: readonly (readonly T[])[]): Map<T, number> {
  const df = new Map<T, number>();
  for (const set of sets) for (const token of new Set(set)) df.set(token, (df.get(token) ?? 0) + 1);
  return df;
}

function isStrictlyAscending(set: Int32Array): boolean {
  for (let i = 1; i < set.length; i++) if (set[i] <= set[i - 1]) return false;
  return true;
}

describe('rankShingles', () => {
  it('ranks rarest first, ties by first-seen order', () => {
    const { ranked, dictionary } = rankShingles([['x', 'y'], ['y', 'z', 'w'], ['w', 'y']]);
    // df: x 1, y 3, z 1, w 2 → x, z (first seen order), w, y
    expect([...dictionary]).toEqual([['x', 0], ['y', 3], ['z', 1], ['w', 2]]);
    expect(ranked.map((set) => [...set])).toEqual([[0, 3], [1, 2, 3], [2, 3]]);
  });

  it('gives ascending, duplicate-free sets whose ranks follow document frequency', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.constantFrom<string>('a', 'b', 'c', 'd', 'e', 'f#2'), { maxLength: 12 }), { maxLength: 20 }), (sets) => {
        const { ranked, dictionary } = rankShingles(sets);
        const df = frequencies(sets);
        expect(dictionary.size).toBe(df.size);
        expect(new Set(dictionary.values()).size).toBe(df.size); // a bijection onto 0..size−1
        for (const [s, set] of ranked.entries()) {
          expect(isStrictlyAscending(set)).toBe(true);
          expect([...set].sort((u, v) => u - v)).toEqual([...new Set(sets[s].map((x) => dictionary.get(x)!))].sort((u, v) => u - v));
        }
        const byRank = [...dictionary].sort((u, v) => u[1] - v[1]);
        for (let r = 1; r < byRank.length; r++) expect(df.get(byRank[r][0])!).toBeGreaterThanOrEqual(df.get(byRank[r - 1][0])!);
      }),
    );
  });

  describe('edge cases', () => {
    it('handles no sets and empty sets', () => {
      expect(rankShingles([])).toEqual({ ranked: [], dictionary: new Map() });
      expect(rankShingles([[], []]).ranked.map((set) => set.length)).toEqual([0, 0]);
    });

    it('counts a repeat inside one set once', () => {
      const { dictionary } = rankShingles([['a', 'a', 'a'], ['b'], ['b']]);
      expect(dictionary.get('a')).toBe(0);
      expect(dictionary.get('b')).toBe(1);
    });
  });
});

describe('rankIntegerSets', () => {
  it('ranks rarest first, ties by token value, and deduplicates', () => {
    const { ranked, dictionary } = rankIntegerSets([[7, 3, 3], [3, 9]]);
    expect(dictionary).toEqual(new Map([[7, 0], [9, 1], [3, 2]]));
    expect(ranked.map((set) => [...set])).toEqual([[0, 2], [1, 2]]);
  });

  it('gives the same ranks through the large-token path as through the direct one', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.integer({ min: 0, max: 30 }), { maxLength: 10 }), { maxLength: 15 }), (sets) => {
        const small = rankIntegerSets(sets);
        // shifting every token by 2^30 keeps value order and frequencies, so ranks must not change
        const large = rankIntegerSets(sets.map((set) => set.map((v) => v + 2 ** 30)));
        expect(large.ranked).toEqual(small.ranked);
      }),
    );
  });

  describe('edge cases', () => {
    it('refuses negative, fractional and too large tokens, naming the set', () => {
      expect(() => rankIntegerSets([[1], [-1]])).toThrow(/set 1: token -1/);
      expect(() => rankIntegerSets([[1.5]])).toThrow(/set 0/);
      expect(() => rankIntegerSets([[2 ** 31]])).toThrow(/2\^31/);
    });

    it('accepts typed arrays', () => {
      expect(rankIntegerSets([Int32Array.of(5, 5, 1)]).ranked[0]).toEqual(Int32Array.of(0, 1));
    });
  });
});

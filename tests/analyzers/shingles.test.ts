import { describe, expect, it } from 'vitest';
import { jaccard, SHINGLE_SEPARATOR, shingleSet } from '../../analyzers';
import { tokenForm } from '../../analyzers/tokens';

const S = SHINGLE_SEPARATOR;

/** Multiset Jaccard by counting, the definition the numbered shingles must reproduce. */
function multisetJaccard(a: string[], b: string[], k: number): number {
  const grams = (xs: string[]) => {
    const m = new Map<string, number>();
    for (let i = 0; i + k <= xs.length; i++) {
      const g = xs.slice(i, i + k).join(S);
      m.set(g, (m.get(g) ?? 0) + 1);
    }
    return m;
  };
  const ga = grams(a);
  const gb = grams(b);
  let min = 0;
  let max = 0;
  for (const key of new Set([...ga.keys(), ...gb.keys()])) {
    min += Math.min(ga.get(key) ?? 0, gb.get(key) ?? 0);
    max += Math.max(ga.get(key) ?? 0, gb.get(key) ?? 0);
  }
  return max === 0 ? 1 : min / max;
}

describe('shingleSet', () => {
  it('numbers repeats so the set keeps multiset counts', () => {
    expect(shingleSet(['a', 'b', 'a', 'b', 'a', 'b'], 2)).toEqual([`a${S}b`, `a${S}b#2`, `a${S}b#3`, `b${S}a`, `b${S}a#2`]);
  });

  it('makes set Jaccard equal multiset Jaccard on random token streams', () => {
    let seed = 7;
    const next = () => (seed = (seed * 1103515245 + 12345) % 2147483648);
    for (let round = 0; round < 200; round++) {
      const a = Array.from({ length: 5 + (next() % 30) }, () => 'xyz'[next() % 3]!);
      const b = Array.from({ length: 5 + (next() % 30) }, () => 'xyz'[next() % 3]!);
      const k = 1 + (round % 4);
      expect(jaccard(shingleSet(a, k), shingleSet(b, k))).toBeCloseTo(multisetJaccard(a, b, k), 12);
    }
  });

  it('returns the shingles sorted and without duplicates', () => {
    const set = shingleSet(['c', 'b', 'a', 'c', 'b', 'a'], 3);
    expect([...set].sort()).toEqual(set);
    expect(new Set(set).size).toBe(set.length);
  });

  describe('edge cases', () => {
    it('gives one shingle for a stream shorter than k and none for an empty one', () => {
      expect(shingleSet(['a', 'b'], 3)).toEqual([`a${S}b`]);
      expect(shingleSet([], 3)).toEqual([]);
    });

    it('rejects a shingle size that is not a positive integer', () => {
      expect(() => shingleSet(['a'], 0)).toThrow(/positive integer, got 0/);
      expect(() => shingleSet(['a'], 1.5)).toThrow(/positive integer/);
    });

    it('cannot be fooled by a token that looks like a repeat marker or holds the separator', () => {
      // A template chunk spelled `b#2` is escaped, so it differs from the second `a b` shingle.
      const tricky = ['a', tokenForm('b#2', 'string', false)];
      const repeated = shingleSet(['a', 'b', 'a', 'b'], 2);
      expect(repeated).not.toContain(shingleSet(tricky, 2)[0]);
      expect(tokenForm(`x${S}y`, 'string', false)).not.toContain(S);
    });
  });
});

describe('jaccard', () => {
  it('is |A∩B| / |A∪B|', () => {
    expect(jaccard(['a', 'b'], ['b', 'c'])).toBeCloseTo(1 / 3, 15);
    expect(jaccard(['a'], ['a'])).toBe(1);
    expect(jaccard(['a'], ['b'])).toBe(0);
  });

  describe('edge cases', () => {
    it('calls two empty sets equal and an empty and a non-empty set disjoint', () => {
      expect(jaccard([], [])).toBe(1);
      expect(jaccard([], ['a'])).toBe(0);
    });
  });
});

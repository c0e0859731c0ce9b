import { describe, expect, it } from 'vitest';
import { selfJoin } from '../../server/matching/join';
import { parseThreshold, sizeBounds } from '../../server/matching/threshold';

/**
 * The length filter checked against a fact of the trade (common practice; no published source,
 * stated from memory): at Jaccard distance 0.1 (similarity 0.9) a set of size L can only pair
 * with sets whose size lies between 0.9·L and L/0.9 ≈ 1.11·L.
 */

const t = parseThreshold('0.9');

describe('length filter at Jaccard distance 0.1 (common practice)', () => {
  it('gives [90, 111] for L = 100, as the rule of thumb says', () => {
    expect(sizeBounds(t, 100)).toEqual([90, 111]);
  });

  it('matches 0.9·L ≤ size ≤ L/0.9 for every L up to 2000', () => {
    for (let L = 1; L <= 2000; L++) {
      const [lower, upper] = sizeBounds(t, L);
      // integer forms of 0.9·L ≤ m and m ≤ L/0.9: 10m ≥ 9L and 9m ≤ 10L
      expect(10 * lower >= 9 * L && 10 * (lower - 1) < 9 * L, `lower for ${L}`).toBe(true);
      expect(9 * upper <= 10 * L && 9 * (upper + 1) > 10 * L, `upper for ${L}`).toBe(true);
    }
  });

  it('is tight: the join pairs a set of size 100 with nested sets of sizes 90..111 and no others', () => {
    const sizes = Array.from({ length: 40 }, (_, i) => 80 + i); // 80..119, all nested in each other
    const sets = [Int32Array.from({ length: 100 }, (_, i) => i), ...sizes.map((n) => Int32Array.from({ length: n }, (_, i) => i))];
    const partners = selfJoin(sets, t)
      .filter(({ a }) => a === 0)
      .map(({ b }) => sets[b].length);
    expect(partners).toEqual(Array.from({ length: 111 - 90 + 1 }, (_, i) => 90 + i));
  });

  describe('edge cases', () => {
    it('lets a set of size 1 pair only with size 1', () => {
      expect(sizeBounds(t, 1)).toEqual([1, 1]);
    });
  });
});

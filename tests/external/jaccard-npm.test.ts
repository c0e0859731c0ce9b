import fc from 'fast-check';
import jaccardLib from 'jaccard';
import { describe, expect, it } from 'vitest';
import { jaccard, selfJoin } from '../../server/matching/join';
import { rankShingles } from '../../server/matching/order';
import { parseThreshold } from '../../server/matching/threshold';

/**
 * Similarities checked against an outside implementation: the npm package `jaccard@0.4.0`
 * (node_modules/jaccard/jaccard.js, `index(a, b)` = intersection / union by indexOf).
 * It counts duplicates in its first array and gives NaN for two empty arrays, so every input
 * is deduplicated first and empty sets are left out of the comparison.
 */

const shingle = fc.constantFrom('( id )', '= id ;', 'return id ;', 'id . id', 'if ( id', '{ return id', ') { id', 'id , id', 'num ;');
const shingleSet = fc.array(fc.oneof(shingle, shingle.map((s) => `${s}#2`)), { maxLength: 20 });

describe('jaccard (against npm jaccard@0.4.0)', () => {
  it('gives the same similarity as jaccard.index for every pair the join reports', () => {
    fc.assert(
      fc.property(fc.array(shingleSet, { maxLength: 25 }), fc.constantFrom('0.5', '0.8', '1'), (sets, text) => {
        const { ranked } = rankShingles(sets);
        for (const { a, b, overlap } of selfJoin(ranked, parseThreshold(text))) {
          const reference = jaccardLib.index([...new Set(sets[a])], [...new Set(sets[b])]);
          expect(jaccard(overlap, ranked[a].length, ranked[b].length)).toBe(reference);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('misses no pair that jaccard.index puts clearly above the threshold', () => {
    fc.assert(
      fc.property(fc.array(shingleSet, { maxLength: 25 }), fc.constantFrom('0.5', '0.8'), (sets, text) => {
        const t = parseThreshold(text);
        const { ranked } = rankShingles(sets);
        const found = new Set(selfJoin(ranked, t).map(({ a, b }) => `${a} ${b}`));
        for (let a = 0; a < sets.length; a++) {
          for (let b = a + 1; b < sets.length; b++) {
            if (sets[a].length === 0 || sets[b].length === 0) continue;
            const reference = jaccardLib.index([...new Set(sets[a])], [...new Set(sets[b])]);
            // a margin, because the reference is a double and the join's test is exact
            if (reference > t.p / t.q + 1e-9) expect(found.has(`${a} ${b}`)).toBe(true);
            if (reference < t.p / t.q - 1e-9) expect(found.has(`${a} ${b}`)).toBe(false);
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  describe('edge cases', () => {
    it('agrees on a worked pair, once duplicates are removed for the library', () => {
      const x = ['a', 'b', 'b', 'c'];
      const y = ['b', 'c', 'd'];
      expect(jaccardLib.index(x, y)).not.toBe(0.5); // the library counts the repeated 'b' twice
      const { ranked } = rankShingles([x, y]);
      const [pair] = selfJoin(ranked, parseThreshold('0.5'));
      expect(jaccard(pair.overlap, ranked[0].length, ranked[1].length)).toBe(jaccardLib.index([...new Set(x)], y));
    });

    it('gives 0 where the library gives NaN (two empty sets)', () => {
      expect(jaccardLib.index([], [])).toBeNaN();
      expect(jaccard(0, 0, 0)).toBe(0);
    });
  });
});

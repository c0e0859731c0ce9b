import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bruteJoinAgainst, bruteSelfJoin } from '../../../server/matching/brute';
import { JOIN_METHODS, jaccard, joinAgainst, newJoinStats, selfJoin, type JoinMethod } from '../../../server/matching/join';
import { rankIntegerSets } from '../../../server/matching/order';
import { parseThreshold, type Threshold } from '../../../server/matching/threshold';

/**
 * The join against the brute-force oracle: same pairs, same overlaps, same similarities, for
 * every method, on random collections shaped to hit the corners (empty sets, singletons,
 * identical sets, near copies, tokens repeated inside a set).
 */

const THRESHOLDS = ['0.5', '0.8', '0.95', '1'].map((text) => parseThreshold(text));

/** Few distinct tokens make overlaps (and repeats inside a line) common. */
const token = fc.oneof(fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 80 }));
const rawSet = fc.oneof(
  { weight: 1, arbitrary: fc.constant<number[]>([]) },
  { weight: 1, arbitrary: fc.array(token, { minLength: 1, maxLength: 1 }) },
  { weight: 6, arbitrary: fc.array(token, { maxLength: 45 }) },
);
/** Copy operations: duplicate set `from`, then optionally drop one token or add one. */
const copy = fc.record({ from: fc.nat(), drop: fc.nat(), add: fc.option(token, { nil: undefined }) });
const collection = fc
  .tuple(fc.array(rawSet, { maxLength: 28 }), fc.array(copy, { maxLength: 12 }))
  .map(([sets, copies]) => {
    const out = sets.map((set) => [...set]);
    for (const { from, drop, add } of copies) {
      if (out.length === 0) break;
      const next = [...out[from % out.length]];
      if (next.length > 0 && drop % 3 === 1) next.splice(drop % next.length, 1);
      if (add !== undefined) next.push(add);
      out.push(next);
    }
    return out;
  });
const threshold = fc.oneof(
  fc.constantFrom(...THRESHOLDS),
  fc.integer({ min: 1, max: 20 }).chain((q) => fc.integer({ min: 1, max: q }).map((p) => parseThreshold(`${p}/${q}`))),
);

/** Jaccard of two raw token lists as sets, straight from the definition (no ranks, no merge). */
function definitionJaccard(x: number[], y: number[]): number {
  const a = new Set(x);
  const b = new Set(y);
  let shared = 0;
  for (const v of a) if (b.has(v)) shared++;
  const union = a.size + b.size - shared;
  return union === 0 ? 0 : shared / union;
}

describe('selfJoin', () => {
  it('returns exactly the brute-force pairs for every method', () => {
    fc.assert(
      fc.property(collection, threshold, (raw, t) => {
        const { ranked } = rankIntegerSets(raw);
        const oracle = bruteSelfJoin(ranked, t);
        for (const method of JOIN_METHODS) {
          expect(selfJoin(ranked, t, { method }), method).toEqual(oracle);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('reports the similarity of the raw sets, and only pairs at or above t', () => {
    fc.assert(
      fc.property(collection, fc.constantFrom(...THRESHOLDS), (raw, t) => {
        const { ranked } = rankIntegerSets(raw);
        const pairs = selfJoin(ranked, t);
        const reported = new Set(pairs.map(({ a, b }) => `${a} ${b}`));
        for (const { a, b, overlap } of pairs) {
          const similarity = jaccard(overlap, ranked[a].length, ranked[b].length);
          expect(similarity).toBe(definitionJaccard(raw[a], raw[b]));
          expect(similarity * t.q).toBeGreaterThanOrEqual(t.p - 1e-9);
        }
        // and every pair clearly above t by the definition is reported
        for (let a = 0; a < raw.length; a++) {
          for (let b = a + 1; b < raw.length; b++) {
            if (definitionJaccard(raw[a], raw[b]) > t.p / t.q + 1e-9) expect(reported.has(`${a} ${b}`)).toBe(true);
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  it('does not depend on the input order', () => {
    fc.assert(
      fc.property(
        collection.chain((raw) => fc.tuple(fc.constant(raw), fc.shuffledSubarray([...raw.keys()], { minLength: raw.length }))),
        threshold,
        fc.constantFrom<JoinMethod>('prefix', 'position', 'auto'),
        ([raw, permutation], t, method) => {
          const expected = selfJoin(rankIntegerSets(raw).ranked, t, { method });
          const shuffled = permutation.map((i) => raw[i]);
          const back = selfJoin(rankIntegerSets(shuffled).ranked, t, { method }).map(({ a, b, overlap }) => {
            const [u, v] = [permutation[a], permutation[b]];
            return u < v ? { a: u, b: v, overlap } : { a: v, b: u, overlap };
          });
          back.sort((x, y) => x.a - y.a || x.b - y.b);
          expect(back).toEqual(expected);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('is exact under any global order, not only rarest-first', () => {
    fc.assert(
      fc.property(collection, threshold, (raw, t) => {
        // Ranks = the token values themselves: a valid total order that ignores frequency.
        const plain = raw.map((set) => Int32Array.from(new Set(set)).sort());
        expect(selfJoin(plain, t)).toEqual(bruteSelfJoin(plain, t));
      }),
      { numRuns: 200 },
    );
  });

  it('keeps candidates ≥ verified ≥ results, and each filter verifies no more than the one before', () => {
    fc.assert(
      fc.property(collection, fc.constantFrom(...THRESHOLDS), (raw, t) => {
        const { ranked } = rankIntegerSets(raw);
        const verified: number[] = [];
        for (const method of ['brute', 'length', 'prefix', 'position'] as const) {
          const stats = newJoinStats();
          const pairs = selfJoin(ranked, t, { method, stats });
          expect(stats.results).toBe(pairs.length);
          expect(stats.candidates).toBeGreaterThanOrEqual(stats.verified);
          expect(stats.verified).toBeGreaterThanOrEqual(stats.results);
          verified.push(stats.verified);
        }
        for (let i = 1; i < verified.length; i++) expect(verified[i]).toBeLessThanOrEqual(verified[i - 1]);
      }),
      { numRuns: 150 },
    );
  });

  it('finds sizes 31 and 32 sharing 28 at t = 0.8 (J = 28/35 exactly), where doubles give α = 29', () => {
    const x = Int32Array.from({ length: 31 }, (_, i) => i);
    const y = Int32Array.from({ length: 32 }, (_, i) => (i < 28 ? i : 100 + i));
    const t = parseThreshold('0.8');
    expect(Math.ceil((0.8 / 1.8) * 63)).toBe(29); // the floating point trap this guards against
    for (const method of JOIN_METHODS) {
      expect(selfJoin([x, y], t, { method }), method).toEqual([{ a: 0, b: 1, overlap: 28 }]);
      expect(joinAgainst([y], [x], t, { method }), method).toEqual([{ a: 0, b: 0, overlap: 28 }]);
    }
    // one shared id fewer (27/36 = 0.75) must not pass
    const z = Int32Array.from({ length: 32 }, (_, i) => (i < 27 ? i : 100 + i));
    for (const method of JOIN_METHODS) expect(selfJoin([x, z], t, { method }), method).toEqual([]);
  });

  describe('edge cases', () => {
    const t = parseThreshold('0.8');

    it('returns nothing for no sets, one set, or only empty sets', () => {
      for (const method of JOIN_METHODS) {
        expect(selfJoin([], t, { method })).toEqual([]);
        expect(selfJoin([Int32Array.of(1, 2)], t, { method })).toEqual([]);
        expect(selfJoin([new Int32Array(0), new Int32Array(0)], t, { method })).toEqual([]);
      }
    });

    it('pairs identical sets at t = 1 and nothing else', () => {
      const sets = [Int32Array.of(1, 2, 3), Int32Array.of(1, 2, 3, 4), Int32Array.of(1, 2, 3), Int32Array.of(5)];
      for (const method of JOIN_METHODS) {
        expect(selfJoin(sets, parseThreshold('1'), { method })).toEqual([{ a: 0, b: 2, overlap: 3 }]);
      }
    });

    it('pairs identical singletons', () => {
      for (const method of JOIN_METHODS) {
        expect(selfJoin([Int32Array.of(7), Int32Array.of(8), Int32Array.of(7)], t, { method })).toEqual([
          { a: 0, b: 2, overlap: 1 },
        ]);
      }
    });

    it('refuses sets that are not ascending and duplicate-free, naming the set', () => {
      expect(() => selfJoin([Int32Array.of(1, 2), Int32Array.of(3, 3)], t)).toThrow(/set 1 is not ascending/);
      expect(() => selfJoin([Int32Array.of(2, 1)], t)).toThrow(/set 0/);
      expect(() => selfJoin([Int32Array.of(-1, 2)], t)).toThrow(/negative/);
      expect(() => selfJoin([Int32Array.of(1)], t, { method: 'fastest' as JoinMethod })).toThrow(/unknown method/);
    });

    it('adds to the counters it is given', () => {
      const stats = newJoinStats();
      const sets = [Int32Array.of(1, 2, 3, 4), Int32Array.of(1, 2, 3, 4)];
      selfJoin(sets, t, { stats });
      selfJoin(sets, t, { stats });
      expect(stats.results).toBe(2);
    });
  });
});

/**
 * Larger sets than above (up to 300 ids, near copies with a few edits): long prefixes, several
 * shared prefix ids per pair, the size cut at late prefix positions and saturated 128-bit
 * signatures all come into play here.
 */
const largeCollection = fc
  .tuple(
    fc.array(fc.uniqueArray(fc.integer({ min: 0, max: 1500 }), { minLength: 1, maxLength: 300 }), { minLength: 1, maxLength: 12 }),
    fc.array(fc.record({ from: fc.nat(), edits: fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 1500 })), { maxLength: 12 }) }), {
      maxLength: 14,
    }),
  )
  .map(([sets, copies]) => {
    const out = sets.map((set) => [...set]);
    for (const { from, edits } of copies) {
      const next = [...out[from % out.length]];
      for (const [at, id] of edits) {
        if (next.length > 1 && at % 2 === 0) next.splice(at % next.length, 1);
        else next.push(id);
      }
      out.push(next);
    }
    return out;
  });

describe('selfJoin on larger sets', () => {
  it('returns exactly the brute-force pairs for the filtered methods', () => {
    fc.assert(
      fc.property(largeCollection, fc.constantFrom(...THRESHOLDS, parseThreshold('0.7'), parseThreshold('9/10')), (raw, t) => {
        const { ranked } = rankIntegerSets(raw);
        const oracle = bruteSelfJoin(ranked, t);
        for (const method of ['prefix', 'position', 'bitmap', 'auto'] as const) {
          expect(selfJoin(ranked, t, { method }), method).toEqual(oracle);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('verifies no more pairs with the bitmap filter than without it (position)', () => {
    fc.assert(
      fc.property(largeCollection, fc.constantFrom(...THRESHOLDS), (raw, t) => {
        const { ranked } = rankIntegerSets(raw);
        const position = newJoinStats();
        const bitmap = newJoinStats();
        selfJoin(ranked, t, { method: 'position', stats: position });
        selfJoin(ranked, t, { method: 'bitmap', stats: bitmap });
        expect(bitmap.verified).toBeLessThanOrEqual(position.verified);
        expect(bitmap.results).toBe(position.results);
      }),
      { numRuns: 100 },
    );
  });

  describe('edge cases', () => {
    it('finds a copy of a 300-id set that lost exactly enough ids to sit at t = 0.8', () => {
      // 300 ids against the first 240 of them: J = 240/300 = 0.8 exactly; one id fewer falls below
      const x = Int32Array.from({ length: 300 }, (_, i) => i);
      const y = x.slice(0, 240);
      const z = x.slice(0, 239);
      const t = parseThreshold('0.8');
      for (const method of JOIN_METHODS) {
        expect(selfJoin([x, y], t, { method }), method).toEqual([{ a: 0, b: 1, overlap: 240 }]);
        expect(selfJoin([x, z], t, { method }), method).toEqual([]);
      }
    });
  });
});

describe('joinAgainst', () => {
  it('equals the brute-force cross pairs, and the cross part of the self-join of both', () => {
    fc.assert(
      fc.property(collection, fc.nat(), threshold, (raw, cut, t) => {
        // Both sides are ranked together: one global order, as in an index.
        const { ranked } = rankIntegerSets(raw);
        const split = raw.length === 0 ? 0 : cut % (raw.length + 1);
        const probe = ranked.slice(0, split);
        const indexed = ranked.slice(split);
        const oracle = bruteJoinAgainst(probe, indexed, t);
        const cross = bruteSelfJoin(ranked, t)
          .filter(({ a, b }) => a < split && b >= split)
          .map(({ a, b, overlap }) => ({ a, b: b - split, overlap }));
        expect(oracle).toEqual(cross);
        for (const method of JOIN_METHODS) {
          expect(joinAgainst(probe, indexed, t, { method }), method).toEqual(oracle);
        }
      }),
      { numRuns: 300 },
    );
  });

  describe('edge cases', () => {
    const t = parseThreshold('0.8');

    it('handles an empty side and probe ids the index never saw', () => {
      for (const method of JOIN_METHODS) {
        expect(joinAgainst([], [Int32Array.of(1)], t, { method })).toEqual([]);
        expect(joinAgainst([Int32Array.of(1)], [], t, { method })).toEqual([]);
        expect(joinAgainst([Int32Array.of(50, 60)], [Int32Array.of(1, 2)], t, { method })).toEqual([]);
        expect(joinAgainst([new Int32Array(0)], [new Int32Array(0)], t, { method })).toEqual([]);
      }
    });

    it('reports a probe set against itself when it is also indexed', () => {
      const set = Int32Array.of(3, 4, 5);
      for (const method of JOIN_METHODS) {
        expect(joinAgainst([set], [set], t, { method })).toEqual([{ a: 0, b: 0, overlap: 3 }]);
      }
    });
  });
});

describe('jaccard', () => {
  it('divides the overlap by the union', () => {
    expect(jaccard(28, 31, 32)).toBe(0.8);
    expect(jaccard(1, 1, 3)).toBeCloseTo(1 / 3);
  });

  describe('edge cases', () => {
    it('gives 0 for two empty sets and 1 for equal ones', () => {
      expect(jaccard(0, 0, 0)).toBe(0);
      expect(jaccard(4, 4, 4)).toBe(1);
    });
  });
});

/** Thresholds used above must be exact fractions, never doubles. */
describe('threshold set-up', () => {
  it('parses the tested thresholds into lowest terms', () => {
    expect(THRESHOLDS).toEqual<Threshold[]>([
      { p: 1, q: 2 },
      { p: 4, q: 5 },
      { p: 19, q: 20 },
      { p: 1, q: 1 },
    ]);
  });
});

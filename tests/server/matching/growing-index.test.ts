import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bruteSelfJoin } from '../../../server/matching/brute';
import { GrowingIndex, type GrowingIndexMatch } from '../../../server/matching/growing-index';
import { rankIntegerSets } from '../../../server/matching/order';
import { parseThreshold, type Threshold } from '../../../server/matching/threshold';
import type { SimilarPair } from '../../../server/matching/types';

/**
 * The growing index against the brute-force oracle: appended in random batches (so segments are
 * built and merged at random points), with ranks spread out or shifted below zero (so both list
 * layouts and negative ranks occur), every set probed against the sets before it gives exactly
 * the brute-force pairs.
 */

const token = fc.oneof(fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 60 }));
const rawSet = fc.oneof(
  { weight: 1, arbitrary: fc.constant<number[]>([]) },
  { weight: 6, arbitrary: fc.array(token, { maxLength: 40 }) },
);
const copy = fc.record({ from: fc.nat(), drop: fc.nat(), add: fc.option(token, { nil: undefined }) });
const collection = fc.tuple(fc.array(rawSet, { maxLength: 30 }), fc.array(copy, { maxLength: 15 })).map(([sets, copies]) => {
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
/** A prefix threshold and a probe threshold at or above it. */
const thresholds = fc
  .integer({ min: 1, max: 10 })
  .chain((q) => fc.integer({ min: 1, max: q }).chain((p) => fc.integer({ min: p, max: q }).map((p2) => [parseThreshold(`${p}/${q}`), parseThreshold(`${p2}/${q}`)] as const)));
/** How ranks are laid out: as they come, spread far apart (sparse lists), or shifted below zero. */
const layout = fc.constantFrom((r: number) => r, (r: number) => r * 100_003, (r: number) => r - 1_000_000);

function batches(count: number, cuts: number[]): [number, number][] {
  const points = [...new Set(cuts.map((c) => c % (count + 1)))].sort((a, b) => a - b);
  const out: [number, number][] = [];
  let from = 0;
  for (const p of [...points, count]) {
    if (p > from) out.push([from, p]);
    from = Math.max(from, p);
  }
  return out;
}

/** Appends the sets in the given batches and probes each set of a batch against everything before it. */
function growingPairs(sets: Int32Array[], T: Threshold, t: Threshold, cuts: number[]): SimilarPair[] {
  const index = new GrowingIndex(T);
  const pairs: SimilarPair[] = [];
  for (const [from, to] of batches(sets.length, cuts)) {
    // as the mirror does with a load's sets: appended apart, merged once the batch is done
    const apart = cuts.length % 2 === 1;
    const first = index.append(sets.slice(from, to), !apart);
    expect(first).toBe(from);
    for (let n = from; n < to; n++) {
      const matches: GrowingIndexMatch[] = [];
      index.probe(sets[n], t, n, matches);
      for (const m of matches) pairs.push({ a: m.set, b: n, overlap: m.overlap });
    }
    if (apart) index.compact();
  }
  return pairs.sort((x, y) => x.a - y.a || x.b - y.b);
}

describe('GrowingIndex', () => {
  it('finds exactly the brute-force pairs, however the sets are batched and ranked', () => {
    fc.assert(
      fc.property(collection, thresholds, layout, fc.array(fc.nat(), { maxLength: 8 }), (raw, [T, t], spread, cuts) => {
        const sets = rankIntegerSets(raw).ranked.map((s) => Int32Array.from(s, spread));
        expect(growingPairs(sets, T, t, cuts)).toEqual(bruteSelfJoin(sets, t));
      }),
      { numRuns: 300 },
    );
  });

  it('forgets truncated sets: probes afterwards see only what was kept and appended since', () => {
    fc.assert(
      fc.property(collection, collection, fc.nat(), thresholds, (kept, dropped, at, [T, t]) => {
        const sets = rankIntegerSets([...kept, ...dropped]).ranked;
        const head = sets.slice(0, kept.length);
        const index = new GrowingIndex(T);
        index.append(head.slice(0, at % (head.length + 1)));
        index.append(head.slice(at % (head.length + 1)));
        index.append(sets.slice(kept.length), at % 2 === 0);
        index.truncate(kept.length);
        expect(index.size).toBe(kept.length);
        // probe the dropped sets as if new: only kept sets may answer
        const pairs: SimilarPair[] = [];
        sets.slice(kept.length).forEach((x, k) => {
          const matches: GrowingIndexMatch[] = [];
          index.probe(x, t, index.size, matches);
          for (const m of matches) pairs.push({ a: m.set, b: kept.length + k, overlap: m.overlap });
        });
        const oracle = bruteSelfJoin(sets, t).filter((p) => p.a < kept.length && p.b >= kept.length);
        expect(pairs.sort((x, y) => x.a - y.a || x.b - y.b)).toEqual(oracle);
      }),
      { numRuns: 200 },
    );
  });

  it('keeps a handful of segments as it grows', () => {
    const index = new GrowingIndex(parseThreshold('0.6'));
    for (let batch = 0; batch < 64; batch++) {
      index.append(Array.from({ length: 10 }, (_, i) => Int32Array.of(batch * 100 + i, batch * 100 + i + 1, 1_000_000)));
    }
    expect(index.size).toBe(640);
    expect(index.segmentCount).toBeLessThanOrEqual(8);
  });
});

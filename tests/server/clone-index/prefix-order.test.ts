import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rankOrder } from '../../../server/clone-index/sets';
import { parseThreshold, prefixLength } from '../../../server/matching/threshold';

const t = parseThreshold('0.7');

/** Each entry's rank in set order (what writePrefixEntries numbers), placed where rankOrder sends it. */
function placed(sets: { ranks: Int32Array }[], groupSize?: number) {
  const inSetOrder = sets.flatMap((s) => [...s.ranks.subarray(0, prefixLength(t, s.ranks.length))]);
  const order = rankOrder(sets, t, inSetOrder.length, groupSize);
  const out = new Array<number>(inSetOrder.length);
  inSetOrder.forEach((rank, k) => (out[order[k]] = rank));
  return { inSetOrder, order, out };
}

const rankSets = fc.array(
  fc.uniqueArray(fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }), { minLength: 1, maxLength: 30 }).map((r) => ({ ranks: Int32Array.from(r).sort() })),
  { maxLength: 40 },
);

describe('rankOrder (the order prefix entries are written in)', () => {
  it('sends every entry to its own row, the rows ascending by rank, over the whole int32 range', () => {
    fc.assert(
      fc.property(rankSets, (sets) => {
        const { inSetOrder, order, out } = placed(sets);
        expect(new Set(order).size).toBe(inSetOrder.length);
        expect(out).toEqual([...inSetOrder].sort((a, b) => a - b));
      }),
    );
  });

  it('sorts each group on its own when the entries outnumber a group', () => {
    fc.assert(
      fc.property(rankSets, fc.integer({ min: 1, max: 17 }), (sets, groupSize) => {
        const { inSetOrder, order, out } = placed(sets, groupSize);
        expect(new Set(order).size).toBe(inSetOrder.length);
        for (let start = 0; start < inSetOrder.length; start += groupSize) {
          const group = inSetOrder.slice(start, start + groupSize).sort((a, b) => a - b);
          expect(out.slice(start, start + groupSize)).toEqual(group);
        }
      }),
    );
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { intersectionSize } from '../../../server/matching/brute';
import { overlapFrom, packBySize } from '../../../server/matching/packed';

/** Ascending, duplicate-free sets over a small alphabet, so that overlaps are common. */
const set = fc.uniqueArray(fc.integer({ min: 0, max: 40 }), { maxLength: 30 }).map((ids) => Int32Array.from(ids).sort());

describe('packBySize', () => {
  it('keeps every non-empty set once, by size, equal sizes by first id, then input index', () => {
    fc.assert(
      fc.property(fc.array(set, { maxLength: 25 }), (sets) => {
        const { data, start, order } = packBySize(sets);
        expect([...order].sort((a, b) => a - b)).toEqual([...sets.keys()].filter((i) => sets[i].length > 0));
        expect(start.length).toBe(order.length + 1);
        expect(start[order.length]).toBe(data.length);
        for (let m = 0; m < order.length; m++) {
          expect([...data.subarray(start[m], start[m + 1])]).toEqual([...sets[order[m]]]);
          if (m > 0) {
            const [u, v] = [sets[order[m - 1]], sets[order[m]]];
            const key = (s: Int32Array, i: number) => [s.length, s[0], i];
            const [a, b] = [key(u, order[m - 1]), key(v, order[m])];
            const before = a[0] - b[0] || a[1] - b[1] || a[2] - b[2];
            expect(before).toBeLessThan(0);
          }
        }
      }),
      { numRuns: 300 },
    );
  });

  describe('edge cases', () => {
    it('packs nothing for no sets or only empty sets', () => {
      for (const sets of [[], [new Int32Array(0), new Int32Array(0)]]) {
        const { data, start, order } = packBySize(sets);
        expect([data.length, [...start], order.length]).toEqual([0, [0], 0]);
      }
    });
  });
});

/**
 * A valid resume point for x and y: merge from the start and stop after `steps` steps, at a
 * shared id or at the very start, as the probe would leave it.
 */
function resumePoint(x: Int32Array, y: Int32Array, steps: number): { i: number; j: number; found: number } {
  let i = 0;
  let j = 0;
  let found = 0;
  let last = { i: 0, j: 0, found: 0 };
  for (let s = 0; s < steps && i < x.length && j < y.length; s++) {
    if (x[i] === y[j]) {
      found++;
      i++;
      j++;
      last = { i, j, found };
    } else if (x[i] < y[j]) i++;
    else j++;
  }
  return last;
}

describe('overlapFrom', () => {
  it('gives the exact overlap when it reaches the required one, −1 otherwise, from any valid resume point', () => {
    fc.assert(
      fc.property(set, set, fc.nat({ max: 70 }), fc.nat({ max: 35 }), fc.nat({ max: 5 }), (x, y, steps, required, gap) => {
        // x and y sit in one array, with a gap of foreign ids around them
        const data = Int32Array.from([...Array(gap).fill(-7), ...x, ...Array(gap).fill(-7), ...y, -7]);
        const x0 = gap;
        const y0 = 2 * gap + x.length;
        const { i, j, found } = resumePoint(x, y, steps);
        const overlap = intersectionSize(x, y);
        const expected = overlap >= required ? overlap : -1;
        expect(overlapFrom(data, x0, x0 + x.length, y0, y0 + y.length, x0 + i, y0 + j, found, required)).toBe(expected);
      }),
      { numRuns: 2000 },
    );
  });

  describe('edge cases', () => {
    it('handles empty runs, a zero requirement and a requirement above both sizes', () => {
      const data = Int32Array.of(1, 2, 3, 2, 3);
      expect(overlapFrom(data, 0, 0, 0, 0, 0, 0, 0, 0)).toBe(0);
      expect(overlapFrom(data, 0, 3, 3, 5, 0, 3, 0, 0)).toBe(2);
      expect(overlapFrom(data, 0, 3, 3, 5, 0, 3, 0, 3)).toBe(-1);
      expect(overlapFrom(data, 0, 3, 3, 5, 0, 3, 0, 2)).toBe(2);
    });

    it('stops at once when the misses before the resume point already exceed a budget', () => {
      // x = [1, 2, 3, 4] and y = [4]: resumed after 4 with three misses in x, 1 required of 4 ids is fine, 2 is not
      const data = Int32Array.of(1, 2, 3, 4, 4);
      expect(overlapFrom(data, 0, 4, 4, 5, 4, 5, 1, 1)).toBe(1);
      expect(overlapFrom(data, 0, 4, 4, 5, 4, 5, 1, 2)).toBe(-1);
    });
  });
});

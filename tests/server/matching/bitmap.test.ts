import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { overlapBound, popcount, SIGNATURE_WORDS, writeSignature } from '../../../server/matching/bitmap';
import { intersectionSize } from '../../../server/matching/brute';

/** Sets over alphabets from tiny (many shared ids) to wide (collisions in 128 bits matter). */
const set = fc
  .integer({ min: 1, max: 5000 })
  .chain((alphabet) => fc.uniqueArray(fc.integer({ min: 0, max: alphabet }), { maxLength: 400 }))
  .map((ids) => Int32Array.from(ids).sort());

function signature(x: Int32Array): Int32Array {
  const out = new Int32Array(SIGNATURE_WORDS);
  writeSignature(x, 0, x.length, out, 0);
  return out;
}

describe('overlapBound', () => {
  it('never falls below the true overlap', () => {
    fc.assert(
      fc.property(set, set, (x, y) => {
        expect(overlapBound(signature(x), 0, x.length, signature(y), 0, y.length)).toBeGreaterThanOrEqual(intersectionSize(x, y));
      }),
      { numRuns: 1000 },
    );
  });

  it('is the true overlap for equal sets, and prunes disjoint sets whose ids hash apart', () => {
    const x = Int32Array.from({ length: 40 }, (_, i) => 3 * i);
    expect(overlapBound(signature(x), 0, 40, signature(x), 0, 40)).toBe(40);
    // two ids on different bits: the bound says they cannot share anything
    const a = Int32Array.of(1);
    const b = Int32Array.of(2);
    expect(overlapBound(signature(a), 0, 1, signature(b), 0, 1)).toBe(0);
  });

  describe('edge cases', () => {
    it('gives 0 for empty sets and reads signatures at an offset', () => {
      const empty = new Int32Array(0);
      expect(overlapBound(signature(empty), 0, 0, signature(empty), 0, 0)).toBe(0);
      const x = Int32Array.of(5, 9, 11);
      const packed = new Int32Array(3 + SIGNATURE_WORDS);
      writeSignature(x, 0, 3, packed, 3);
      expect(overlapBound(packed, 3, 3, signature(x), 0, 3)).toBe(3);
    });
  });
});

describe('popcount', () => {
  it('counts the set bits of any 32-bit value', () => {
    fc.assert(
      fc.property(fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }), (v) => {
        expect(popcount(v)).toBe((v >>> 0).toString(2).split('').filter((bit) => bit === '1').length);
      }),
    );
  });

  describe('edge cases', () => {
    it('counts 0 and all ones', () => {
      expect(popcount(0)).toBe(0);
      expect(popcount(-1)).toBe(32);
    });
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { WindowTable } from '../../analyzers/shingle-windows';
import { shingleSet } from '../../analyzers/shingles';

/** Every sub-range [from, to) of [lo, hi) asked of one table must equal shingleSet of those tokens. */
function checkAllRanges(forms: string[], k: number, lo: number, hi: number): void {
  const table = new WindowTable(forms, k, lo, hi);
  for (let from = lo; from <= hi; from++) {
    for (let to = from; to <= hi; to++) {
      expect(table.shingles(from, to), `[${from}, ${to})`).toEqual(shingleSet(forms.slice(from, to), k));
    }
  }
}

describe('WindowTable', () => {
  it('gives exactly shingleSet for every token range of random streams (small vocabularies, many repeats)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.constantFrom('a', 'b', '=', '==', '===', '$id', '('), { minLength: 0, maxLength: 24 }),
        fc.integer({ min: 1, max: 4 }),
        fc.nat(),
        fc.nat(),
        (forms, k, x, y) => {
          const lo = forms.length === 0 ? 0 : x % (forms.length + 1);
          const hi = lo + (forms.length - lo === 0 ? 0 : y % (forms.length - lo + 1));
          checkAllRanges(forms, k, lo, hi);
        },
      ),
      { numRuns: 150 },
    );
  });

  describe('edge cases', () => {
    it('orders a window repeated more than nine times as strings do ("#10" before "#2")', () => {
      const forms = Array.from({ length: 40 }, (_, i) => (i % 2 === 0 ? 'x' : 'y'));
      checkAllRanges(forms, 2, 0, forms.length);
    });

    it('falls back to shingleSet when the vocabulary is too large for exact numeric keys', () => {
      // 400 distinct forms with k = 7: 401^7 is above 2^53, so the table cannot key windows.
      const forms = Array.from({ length: 400 }, (_, i) => `t${i % 397}`);
      const table = new WindowTable(forms, 7, 0, forms.length);
      expect(table.shingles(0, forms.length)).toEqual(shingleSet(forms, 7));
      expect(table.shingles(10, 60)).toEqual(shingleSet(forms.slice(10, 60), 7));
    });

    it('gives the one-shingle set of a range shorter than k, and nothing for an empty range', () => {
      const forms = ['a', 'b', 'c', 'd'];
      const table = new WindowTable(forms, 3, 0, 4);
      expect(table.shingles(1, 3)).toEqual(shingleSet(['b', 'c'], 3));
      expect(table.shingles(2, 2)).toEqual([]);
    });
  });
});

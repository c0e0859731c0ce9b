import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { prefixLengthSql, probeHitFilter, probeKeys, probeSizeBounds } from '../../../server/clone-index/candidates';
import { select } from '../../../server/clone-index/sql';
import { minOverlap, parseThreshold, prefixLength, reaches, type Threshold } from '../../../server/matching/threshold';
import { useDatabase } from '../../support';

useDatabase();

/** One hit: the probe's rank at `pos` of a set of `sz`, the entry's at `position` of a set of `size`. */
interface Hit {
  pos: number;
  sz: number;
  position: number;
  size: number;
}

/** Evaluates probeHitFilter in PostgreSQL for many hits in one query, in input order. */
async function filterInDatabase(t: Threshold, hits: Hit[]): Promise<boolean[]> {
  const rows = await select<{ ok: boolean }>(
    undefined,
    `select (${probeHitFilter(t)}) as ok
       from unnest($1::int[], $2::int[], $3::int[], $4::int[]) with ordinality as h(pos, sz, position, size, n),
            lateral (select h.pos, h.sz) as p, lateral (select h.position, h.size) as e
      order by h.n`,
    [hits.map((h) => h.pos), hits.map((h) => h.sz), hits.map((h) => h.position), hits.map((h) => h.size)],
  );
  return rows.map((r) => r.ok);
}

/** Positions of the first rank two ascending arrays share, or undefined. */
function firstShared(x: number[], y: number[]): [number, number] | undefined {
  for (let i = 0, j = 0; i < x.length && j < y.length; ) {
    if (x[i] === y[j]) return [i, j];
    if (x[i] < y[j]) i++;
    else j++;
  }
  return undefined;
}

const ascending = fc.uniqueArray(fc.integer({ min: 0, max: 24 }), { minLength: 1, maxLength: 16 }).map((a) => a.sort((u, v) => u - v));
const thresholds = fc.constantFrom('0.6', '0.75', '0.8', '0.9', '1', '2/3');

describe('probeHitFilter', () => {
  it('keeps the first shared rank of every pair that reaches the threshold', async () => {
    await fc.assert(
      fc.asyncProperty(thresholds, fc.array(fc.tuple(ascending, ascending), { minLength: 1, maxLength: 40 }), async (value, pairs) => {
        const t = parseThreshold(value);
        const hits: Hit[] = [];
        for (const [x, y] of pairs) {
          const overlap = x.filter((r) => y.includes(r)).length;
          const first = firstShared(x, y);
          if (!first || !reaches(t, x.length, y.length, overlap)) continue;
          hits.push({ pos: first[0], sz: x.length, position: first[1], size: y.length });
        }
        if (hits.length === 0) return;
        expect(await filterInDatabase(t, hits)).toEqual(hits.map(() => true));
      }),
      { numRuns: 30 },
    );
  });

  it('is the bound |x| − i ≥ α and |y| − j ≥ α with α = minOverlap(t, |x|, |y|)', async () => {
    await fc.assert(
      fc.asyncProperty(
        thresholds,
        fc.array(fc.record({ sz: fc.integer({ min: 1, max: 300 }), size: fc.integer({ min: 1, max: 300 }), pos: fc.nat(299), position: fc.nat(299) }), { minLength: 1, maxLength: 50 }),
        async (value, raw) => {
          const t = parseThreshold(value);
          const hits = raw.map((h) => ({ ...h, pos: h.pos % h.sz, position: h.position % h.size }));
          const expected = hits.map((h) => {
            const alpha = minOverlap(t, h.sz, h.size);
            return h.sz - h.pos >= alpha && h.size - h.position >= alpha;
          });
          expect(await filterInDatabase(t, hits)).toEqual(expected);
        },
      ),
      { numRuns: 20 },
    );
  });

  it('probeSizeBounds reads exactly the sizes the length filter and the probe side of the position filter keep', async () => {
    await fc.assert(
      fc.asyncProperty(
        thresholds,
        fc.array(fc.record({ sz: fc.integer({ min: 1, max: 300 }), pos: fc.nat(299), size: fc.integer({ min: 1, max: 600 }) }), { minLength: 1, maxLength: 50 }),
        async (value, raw) => {
          const t = parseThreshold(value);
          const hits = raw.map((h) => ({ ...h, pos: h.pos % h.sz }));
          const [lo, hi] = probeSizeBounds(t);
          const rows = await select<{ ok: boolean }>(
            undefined,
            `select (e.size between ${lo} and ${hi}) as ok
               from unnest($1::int[], $2::int[], $3::int[]) with ordinality as h(pos, sz, size, n),
                    lateral (select h.pos, h.sz) as p, lateral (select h.size) as e
              order by h.n`,
            [hits.map((h) => h.pos), hits.map((h) => h.sz), hits.map((h) => h.size)],
          );
          // q·size ≥ p·sz is the length filter's lower end (size ≥ ⌈t·sz⌉), the rest the probe side
          const expected = hits.map((h) => t.q * h.size >= t.p * h.sz && h.sz - h.pos >= minOverlap(t, h.sz, h.size));
          expect(rows.map((r) => r.ok)).toEqual(expected);
        },
      ),
      { numRuns: 20 },
    );
  });

  describe('edge cases', () => {
    it('keeps a pair exactly at the threshold and drops the hit one place later (sizes 31 and 32 at 0.8: α = 28)', async () => {
      const t = parseThreshold('0.8');
      expect(minOverlap(t, 31, 32)).toBe(28);
      expect(
        await filterInDatabase(t, [
          { pos: 3, sz: 31, position: 4, size: 32 },
          { pos: 4, sz: 31, position: 4, size: 32 },
          { pos: 3, sz: 31, position: 5, size: 32 },
        ]),
      ).toEqual([true, false, false]);
    });

    it('does not overflow with six-decimal thresholds and large sets (p·(a+b) beyond 2^31)', async () => {
      const t = parseThreshold('0.999999');
      const sz = 3000;
      const alpha = minOverlap(t, sz, sz);
      expect(t.p * (sz + sz)).toBeGreaterThan(2 ** 31);
      expect(
        await filterInDatabase(t, [
          { pos: sz - alpha, sz, position: 0, size: sz },
          { pos: sz - alpha + 1, sz, position: 0, size: sz },
        ]),
      ).toEqual([true, false]);
    });

    it('agrees with probeKeys: its last key can pass, the position after it never does', async () => {
      for (const value of ['0.6', '0.8', '2/3']) {
        const t = parseThreshold(value);
        for (const size of [1, 2, 5, 10, 33, 100]) {
          const { ranks, lo, hi } = probeKeys(Int32Array.from({ length: size }, (_, i) => i), t);
          const last = ranks.length - 1;
          const hits: Hit[] = [{ pos: last, sz: size, position: 0, size: lo }];
          if (last + 1 < size) for (let partner = lo; partner <= hi; partner++) hits.push({ pos: last + 1, sz: size, position: 0, size: partner });
          const [kept, ...dropped] = await filterInDatabase(t, hits);
          expect({ value, size, kept, dropped }).toEqual({ value, size, kept: true, dropped: dropped.map(() => false) });
        }
      }
    });
  });
});

describe('prefixLengthSql', () => {
  it('equals prefixLength for every size up to 2000 at the index threshold and others', async () => {
    for (const text of ['0.6', '0.8', '0.95', '1', '0.612345']) {
      const t = parseThreshold(text);
      const rows = await select<{ length: string }>(
        undefined,
        `select (${prefixLengthSql(t, 's.size')})::text as length from generate_series(0, 2000) as s(size) order by s.size`,
      );
      expect(rows.map((r) => Number(r.length)), text).toEqual(Array.from({ length: 2001 }, (_, size) => prefixLength(t, size)));
    }
  });
});

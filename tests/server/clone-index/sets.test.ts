import crypto from 'node:crypto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findSimilarSets } from '../../../server/clone-index/find-copies';
import { dropMirror } from '../../../server/clone-index/mirror';
import { rebuildIndex } from '../../../server/clone-index/rebuild';
import { addSets, setHash } from '../../../server/clone-index/sets';
import { select } from '../../../server/clone-index/sql';
import { db } from '../../../server/db/connection';
import { bruteSelfJoin } from '../../../server/matching/brute';
import { rankShingles } from '../../../server/matching/order';
import { parseThreshold } from '../../../server/matching/threshold';
import { useDatabase } from '../../support';

useDatabase();

/** Logical sets over a small alphabet; shingles get a namespace so each scenario has its own sets. */
type Logical = number[][];

const logicalSets = fc.array(fc.uniqueArray(fc.integer({ min: 0, max: 14 }), { maxLength: 12 }), { minLength: 2, maxLength: 25 });

function materialise(sets: Logical, namespace: string) {
  return sets.map((s) => {
    const shingles = s.map((token) => `${namespace}:${token}`).sort();
    return { hash: setHash(shingles), shingles };
  });
}

/** The oracle: brute force over the logical sets, as "i j overlap" lines of input indexes. */
function brutePairs(sets: Logical, threshold: number): string[] {
  const { ranked } = rankShingles(sets.map((s) => s.map(String)));
  return bruteSelfJoin(ranked, parseThreshold(threshold))
    .filter((p) => p.overlap > 0)
    .map((p) => `${p.a} ${p.b} ${p.overlap}`)
    .sort();
}

/**
 * Pairs among the given inputs according to the stored index: identical sets share one id
 * (similarity 1), other pairs come from set_pairs filtered exactly at the threshold.
 */
async function indexedPairs(setIds: number[], sizes: number[], threshold: number): Promise<string[]> {
  const t = parseThreshold(threshold);
  const rows = await select<{ setA: number; setB: number; overlap: number }>(
    undefined,
    `select set_a as "setA", set_b as "setB", overlap from set_pairs where set_a = any($1::int[]) and set_b = any($1::int[])`,
    [setIds],
  );
  const overlap = new Map(rows.map((r) => [`${r.setA}:${r.setB}`, r.overlap]));
  const out: string[] = [];
  for (let i = 0; i < setIds.length; i++) {
    for (let j = i + 1; j < setIds.length; j++) {
      if (sizes[i] === 0 || sizes[j] === 0) continue;
      const [a, b] = setIds[i] < setIds[j] ? [setIds[i], setIds[j]] : [setIds[j], setIds[i]];
      const o = a === b ? sizes[i] : overlap.get(`${a}:${b}`);
      if (o !== undefined && t.q * o >= t.p * (sizes[i] + sizes[j] - o)) out.push(`${i} ${j} ${o}`);
    }
  }
  return out.sort();
}

type ProbePath = 'memory' | 'database';

async function load(sets: Logical, namespace: string, batchSize: number, chunksOf = sets.length, probe: ProbePath = 'memory') {
  const inputs = materialise(sets, namespace);
  const ids: number[] = [];
  for (let start = 0; start < inputs.length; start += chunksOf) {
    const result = await db().transaction((tx) => addSets(tx, inputs.slice(start, start + chunksOf), { batchSize, probe }));
    if (result.newSetCount > 0) expect(result.probedIn).toBe(probe);
    ids.push(...result.setIds);
  }
  return ids;
}

const ns = () => crypto.randomBytes(5).toString('hex');

describe('addSets', () => {
  // Both probe paths: in the process's mirror of the index, and through PostgreSQL's prefix table.
  for (const probe of ['memory', 'database'] as const) {
    it(`stores exactly the pairs brute force finds, at the index threshold and above (probed in ${probe})`, async () => {
      await fc.assert(
        fc.asyncProperty(logicalSets, fc.constantFrom(0.6, 0.8, 0.95, 1), async (sets, threshold) => {
          const ids = await load(sets, ns(), 1000, sets.length, probe);
          expect(await indexedPairs(ids, sets.map((s) => s.length), threshold)).toEqual(brutePairs(sets, threshold));
        }),
        { numRuns: 25 },
      );
    });

    it(`gives the same pairs for batch sizes 1, 7 and 1000 and for loads split in three (probed in ${probe})`, async () => {
      await fc.assert(
        fc.asyncProperty(logicalSets, async (sets) => {
          const expected = brutePairs(sets, 0.6);
          const sizes = sets.map((s) => s.length);
          for (const batch of [1, 7, 1000]) {
            expect(await indexedPairs(await load(sets, ns(), batch, sets.length, probe), sizes, 0.6)).toEqual(expected);
          }
          const third = Math.max(1, Math.ceil(sets.length / 3));
          expect(await indexedPairs(await load(sets, ns(), 7, third, probe), sizes, 0.6)).toEqual(expected);
        }),
        { numRuns: 10 },
      );
    });
  }

  it('mixes the two probe paths in one index and keeps every pair', async () => {
    await fc.assert(
      fc.asyncProperty(logicalSets, fc.array(fc.boolean(), { minLength: 3, maxLength: 3 }), async (sets, inMemory) => {
        const namespace = ns();
        const third = Math.max(1, Math.ceil(sets.length / 3));
        const ids: number[] = [];
        for (let part = 0; part < 3; part++) {
          const slice = sets.slice(part * third, (part + 1) * third);
          if (slice.length === 0) continue;
          const inputs = materialise(slice, namespace);
          const result = await db().transaction((tx) => addSets(tx, inputs, { probe: inMemory[part] ? 'memory' : 'database' }));
          ids.push(...result.setIds);
        }
        expect(await indexedPairs(ids, sets.map((s) => s.length), 0.6)).toEqual(brutePairs(sets, 0.6));
      }),
      { numRuns: 10 },
    );
  });

  it('looks up the shingles of a large load in bulk and ranks the known ones as stored', async () => {
    // over 2,000 distinct shingles a load: the dictionary lookup goes through a temporary table
    const next = (() => {
      let seed = 7;
      return () => (seed = (seed * 48271) % 2147483647) / 2147483647;
    })();
    const sets: Logical = Array.from({ length: 400 }, () => [...new Set(Array.from({ length: 20 }, () => Math.floor(next() * 5000)))]);
    for (let i = 0; i < 100; i++) sets.push([...sets[i].slice(1), 5000 + i]);
    const ids = await load(sets, ns(), 1000, 250);
    expect(await indexedPairs(ids, sets.map((s) => s.length), 0.6)).toEqual(brutePairs(sets, 0.6));
  });

  describe('the mirror of the index', () => {
    const near = (from: number): Logical => [
      Array.from({ length: 10 }, (_, i) => from + i),
      [...Array.from({ length: 9 }, (_, i) => from + i), from + 50],
    ];

    it('forgets the sets of a load that rolled back, and pairs later loads only with stored sets', async () => {
      const namespace = ns();
      const [a] = await load(near(0).slice(0, 1), namespace, 1000);
      // a load probed in the mirror, then rolled back: its set must not answer later probes
      const rolledBack = materialise([near(0)[1]], namespace);
      const tx = await db().transaction();
      const gone = await addSets(tx, rolledBack, { probe: 'memory' });
      expect(gone.newPairCount).toBe(1);
      await tx.rollback();
      const ids = await load([near(0)[1], [...near(0)[1], 77]], namespace, 1000);
      expect(ids[0]).not.toBe(gone.setIds[0]);
      expect(await indexedPairs([a, ...ids], [10, 10, 11], 0.6)).toEqual(brutePairs([near(0)[0], near(0)[1], [...near(0)[1], 77]], 0.6));
    });

    it('catches up with sets another process stored, and reads everything anew after a rebuild', async () => {
      const namespace = ns();
      const [a] = await load(near(100).slice(0, 1), namespace, 1000, 1, 'memory');
      // another process: writes through PostgreSQL alone, so this process's mirror falls behind
      const [b] = await load([near(100)[1]], namespace, 1000, 1, 'database');
      const [c] = await load([[...near(100)[1], 160]], namespace, 1000, 1, 'memory');
      const sets = [near(100)[0], near(100)[1], [...near(100)[1], 160]];
      expect(await indexedPairs([a, b, c], [10, 10, 11], 0.6)).toEqual(brutePairs(sets, 0.6));
      await rebuildIndex();
      const [d] = await load([[...near(100)[0], 161]], namespace, 1000, 1, 'memory');
      expect(await indexedPairs([a, b, c, d], [10, 10, 11, 11], 0.6)).toEqual(brutePairs([...sets, [...near(100)[0], 161]], 0.6));
    });

    it('fills a cold mirror from the database (a process that has just started)', async () => {
      const namespace = ns();
      const sets = [...near(200), ...near(300)];
      const first = await load(sets.slice(0, 2), namespace, 1000, 2, 'database');
      dropMirror();
      const rest = await load(sets.slice(2), namespace, 1000, 1, 'memory');
      const again = await load([[...near(200)[0], 260], [...near(300)[1], 360]], namespace, 1000, 2, 'memory');
      const all = [...sets, [...near(200)[0], 260], [...near(300)[1], 360]];
      expect(await indexedPairs([...first, ...rest, ...again], all.map((s) => s.length), 0.6)).toEqual(brutePairs(all, 0.6));
    });
  });

  it('stores a set seen before once, and adds nothing when it comes again', async () => {
    const inputs = materialise([[1, 2, 3, 4], [1, 2, 3, 4], [5, 6]], ns());
    const first = await db().transaction((tx) => addSets(tx, inputs));
    expect(first.setIds[0]).toBe(first.setIds[1]);
    expect(first.newSetCount).toBe(2);
    const again = await db().transaction((tx) => addSets(tx, inputs));
    expect(again.setIds).toEqual(first.setIds);
    expect(again.newSetCount).toBe(0);
    expect(again.newPairCount).toBe(0);
  });

  it('keeps the pairs and the probe results through a rebuild, and stays exact for sets added after it', async () => {
    const namespace = ns();
    const sets: Logical = [[1, 2, 3, 4, 5, 6, 7, 8, 9, 10], [1, 2, 3, 4, 5, 6, 7, 8, 9, 11], [1, 2, 3, 4, 5, 6, 7, 12, 13, 14], [20, 21]];
    const before = await load(sets.slice(0, 3), namespace, 7);
    const probe = materialise([[1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]], namespace)[0].shingles;
    const t = parseThreshold(0.8);
    const foundBefore = await findSimilarSets(undefined, probe, t);
    await rebuildIndex();
    expect(await findSimilarSets(undefined, probe, t)).toEqual(foundBefore);
    const after = await load(sets, namespace, 7);
    expect(after.slice(0, 3)).toEqual(before);
    expect(await indexedPairs(after, sets.map((s) => s.length), 0.6)).toEqual(brutePairs(sets, 0.6));
  });

  describe('edge cases', () => {
    it('rebuilds again after a load has added ranks below the rebuilt ones', async () => {
      // After a rebuild ranks are 0..n−1; a load then adds new shingles below 0, so the next
      // rebuild's 0..n'−1 reaches above the old maximum: its rank update must not collide.
      const namespace = ns();
      const batch = (from: number): Logical => Array.from({ length: 30 }, (_, i) => Array.from({ length: 12 }, (_, j) => from + i * 12 + j));
      await load(batch(0), namespace, 1000);
      await rebuildIndex();
      await load(batch(10_000), namespace, 1000);
      const result = await rebuildIndex();
      expect(result.prefixEntries).toBeGreaterThan(0);
    });

    it('stores an empty set without indexing it: it pairs with nothing', async () => {
      const ids = await load([[], [], [1]], ns(), 1000);
      expect(ids[0]).toBe(ids[1]);
      const rows = await select(undefined, 'select 1 from prefix_entries where set_id = $1', [ids[0]]);
      expect(rows).toHaveLength(0);
    });

    it('finds a pair exactly at the threshold (sizes 31 and 32 sharing 28 at 0.8)', async () => {
      const shared = Array.from({ length: 28 }, (_, i) => i);
      const a = [...shared, 100, 101, 102];
      const b = [...shared, 200, 201, 202, 203];
      const ids = await load([a, b], ns(), 1000);
      expect(await indexedPairs(ids, [31, 32], 0.8)).toEqual(['0 1 28']);
    });
  });
});

describe('findSimilarSets', () => {
  it('finds a stored set exactly at the threshold when the probe prefix is tight', async () => {
    // y ⊂ x with |y| = t·|x|: J = 8/10 = 0.8. The query's two extra shingles are unknown to the
    // dictionary, so they rank first and fill all but the last place of its 3-long prefix.
    const namespace = ns();
    const [id] = await load([[1, 2, 3, 4, 5, 6, 7, 8]], namespace, 1000);
    const probe = materialise([[1, 2, 3, 4, 5, 6, 7, 8, 90, 91]], namespace)[0].shingles;
    const found = await findSimilarSets(undefined, probe, parseThreshold(0.8));
    expect(found).toEqual([{ setId: id, size: 8, overlap: 8, similarity: 0.8 }]);
    expect(await findSimilarSets(undefined, probe, parseThreshold(0.81))).toEqual([]);
  });

  it('returns every stored set at or above the query threshold, and nothing below it', async () => {
    await fc.assert(
      fc.asyncProperty(logicalSets, fc.uniqueArray(fc.integer({ min: 0, max: 16 }), { minLength: 1, maxLength: 12 }), fc.constantFrom(0.6, 0.8, 0.95), async (sets, query, threshold) => {
        const namespace = ns();
        const ids = await load(sets, namespace, 1000);
        const probe = materialise([query], namespace)[0].shingles;
        const found = await findSimilarSets(undefined, probe, parseThreshold(threshold));
        const t = parseThreshold(threshold);
        const expected = new Set<number>();
        sets.forEach((s, i) => {
          const o = s.filter((x) => query.includes(x)).length;
          if (o > 0 && t.q * o >= t.p * (s.length + query.length - o)) expected.add(ids[i]);
        });
        expect(new Set(found.map((f) => f.setId))).toEqual(expected);
      }),
      { numRuns: 25 },
    );
  });
});

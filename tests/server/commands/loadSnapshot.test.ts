import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeFiles } from '../../../analyzers';
import { rebuildIndex } from '../../../server/clone-index/rebuild';
import { select } from '../../../server/clone-index/sql';
import { readFolder } from '../../../server/ingest/folder';
import { bruteSelfJoin } from '../../../server/matching/brute';
import { cloneType } from '../../../server/matching/classes';
import { rankShingles } from '../../../server/matching/order';
import { parseThreshold } from '../../../server/matching/threshold';
import { buildRepository, describedPairs, loadFolder, RELEASES, useDatabase } from '../../support';

useDatabase();

/**
 * The oracle: analyse the folder in memory and compare every pair of fragments by brute force,
 * described the same way as describedPairs.
 */
async function bruteForcePairs(folder: string, options: { threshold: number; shingleSize?: number; minTokens?: number }) {
  const { files } = await readFolder(folder);
  const analysed = await analyzeFiles(files, { shingleSize: options.shingleSize ?? 3, minTokens: options.minTokens ?? 50 });
  const fragments = analysed.files.flatMap((f) => f.fragments.map((fragment) => ({ path: f.path, fragment })));
  const { ranked } = rankShingles(fragments.map((f) => f.fragment.shingles));
  const name = (i: number) => `${fragments[i].path}:${fragments[i].fragment.name}:${fragments[i].fragment.startLine}`;
  return bruteSelfJoin(ranked, parseThreshold(options.threshold))
    .map((p) => {
      const similarity = p.overlap / (ranked[p.a].length + ranked[p.b].length - p.overlap);
      const type = cloneType(fragments[p.a].fragment, fragments[p.b].fragment);
      return [name(p.a), name(p.b)].sort().join(' ~ ') + ` ${similarity.toFixed(6)} ${type}`;
    })
    .sort();
}

const release = (v: string) => path.join(RELEASES, v);

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 120_000;

describe('loadSnapshot', () => {
  it('gives the pairs brute force finds on the invented release tree', async () => {
    const repository = await buildRepository();
    const loaded = await loadFolder(repository, release('v1'), 'v1');
    const pairs = await describedPairs(loaded.snapshotId, 0.8);
    expect(pairs).toEqual(await bruteForcePairs(release('v1'), { threshold: 0.8 }));
    expect(pairs.length).toBeGreaterThanOrEqual(2);
    expect(loaded.pairCount).toBe(pairs.length);
  }, SLOW);

  it('gives the pairs brute force finds on real code: sequelize 6.37.8 dialects from node_modules', async () => {
    // Real code from a published package: the SQL dialects of sequelize@6.37.8 repeat much of each other.
    const folder = path.resolve('node_modules/sequelize/lib/dialects');
    const repository = await buildRepository({ threshold: 0.7 });
    const loaded = await loadFolder(repository, folder, '6.37.8');
    const pairs = await describedPairs(loaded.snapshotId, 0.7);
    expect(pairs).toEqual(await bruteForcePairs(folder, { threshold: 0.7 }));
    expect(pairs.length).toBeGreaterThan(10);
  }, SLOW);

  it('ends with the same pairs whether three releases load one after another or the last alone', async () => {
    const stepwise = await buildRepository();
    for (const v of ['v1', 'v2']) await loadFolder(stepwise, release(v), v);
    const last = await loadFolder(stepwise, release('v3'), 'v3');
    const alone = await buildRepository();
    const only = await loadFolder(alone, release('v3'), 'v3');
    expect(await describedPairs(last.snapshotId, 0.8)).toEqual(await describedPairs(only.snapshotId, 0.8));
    expect(last.classCount).toBe(only.classCount);
    expect(last.cloneRatio).toBe(only.cloneRatio);
  }, SLOW);

  it('ends with the same pairs before and after an index rebuild', async () => {
    const repository = await buildRepository({ shingleSize: 4 });
    await loadFolder(repository, release('v1'), 'v1');
    await loadFolder(repository, release('v2'), 'v2');
    await rebuildIndex();
    const after = await loadFolder(repository, release('v3'), 'v3');
    expect(await describedPairs(after.snapshotId, 0.8)).toEqual(await bruteForcePairs(release('v3'), { threshold: 0.8, shingleSize: 4 }));
  }, SLOW);

  it('gives the same pairs with probe batches of 1, 7 and 1000 new sets', async () => {
    // Each batch size runs with its own shingle size, so its sets are new to the index and really probed.
    for (const [batchSize, shingleSize] of [[1, 5], [7, 6], [1000, 7]]) {
      const repository = await buildRepository({ shingleSize, threshold: 0.6 });
      const loaded = await loadFolder(repository, release('v3'), 'v3', batchSize);
      expect(loaded.newSetCount).toBeGreaterThan(0);
      expect(await describedPairs(loaded.snapshotId, 0.6)).toEqual(await bruteForcePairs(release('v3'), { threshold: 0.6, shingleSize }));
    }
  }, SLOW);

  it('analyses no file again and adds no set when an unchanged tree loads under a new label', async () => {
    const repository = await buildRepository({ shingleSize: 8 });
    const first = await loadFolder(repository, release('v1'), 'v1');
    expect(first.analyzedFileCount).toBeGreaterThan(0);
    expect(first.newSetCount).toBeGreaterThan(0);
    const again = await loadFolder(repository, release('v1'), 'v1-again');
    expect(again.analyzedFileCount).toBe(0);
    expect(again.newSetCount).toBe(0);
    expect(await describedPairs(again.snapshotId, 0.8)).toEqual(await describedPairs(first.snapshotId, 0.8));
  }, SLOW);

  it('compares each class with the previous snapshot: drifted, grown, unchanged and gone', async () => {
    const repository = await buildRepository();
    await loadFolder(repository, release('v1'), 'v1');
    const v2 = await loadFolder(repository, release('v2'), 'v2');
    const statuses = async (snapshotId: number) =>
      (await select<{ status: string; paths: string[] }>(
        undefined,
        `select c.status, array_agg(sf.path order by sf.path) as paths from clone_classes c
           join clone_class_members m on m.class_id = c.id join snapshot_files sf on sf.id = m.snapshot_file_id
          where c.snapshot_id = $1 group by c.id order by c.ordinal`,
        [snapshotId],
      )).map((c) => `${c.status} ${c.paths.join(',')}`);
    // v2 changed the pricing rule in billing/tariff.js only: its copy in the yard drifted apart
    expect(await statuses(v2.snapshotId)).toEqual(
      expect.arrayContaining(['drifted billing/tariff.js,yard/shunting.js', 'unchanged tools/depot_inspect.py,tools/inspect.py']),
    );
    const v3 = await loadFolder(repository, release('v3'), 'v3');
    // v3 added a third copy (quotes.js) and deleted the depot's copy of the inspection rule
    expect(await statuses(v3.snapshotId)).toEqual(['grown billing/quotes.js,billing/tariff.js,yard/shunting.js']);
    const [metrics] = await select<{ gone: number; new: number }>(
      undefined,
      'select gone_class_count as gone, new_class_count as new from snapshot_metrics where snapshot_id = $1',
      [v3.snapshotId],
    );
    expect(metrics).toEqual({ gone: 1, new: 0 });
  }, SLOW);

  describe('edge cases', () => {
    it('refuses a label the repository already has, and keeps what is stored', async () => {
      const repository = await buildRepository();
      const first = await loadFolder(repository, release('v1'), 'v1');
      await expect(loadFolder(repository, release('v2'), 'v1')).rejects.toThrow(/already exists/);
      expect(await describedPairs(first.snapshotId, 0.8)).toHaveLength(first.pairCount);
    });

    it('records skipped files with their reasons', async () => {
      const repository = await buildRepository({ ignore: ['tools/'] });
      const loaded = await loadFolder(repository, release('v1'), 'v1');
      const rows = await select<{ path: string; reason: string }>(
        undefined,
        'select path, skip_reason as reason from snapshot_files where snapshot_id = $1 and skip_reason is not null order by path',
        [loaded.snapshotId],
      );
      expect(rows.map((r) => r.path)).toEqual(['tools/']);
      expect(rows[0].reason).toMatch(/ignore/i);
    });
  });
});

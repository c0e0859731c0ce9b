import { db } from '../db/connection';
import { prefixLengthSql } from './candidates';
import { indexThreshold } from './options';
import { execute, lockIndex, select } from './sql';

/** What a rebuild did. */
export interface RebuildResult {
  shingles: number;
  sets: number;
  prefixEntries: number;
  millis: number;
}

/**
 * Re-ranks every shingle by its current document frequency (rarest first, ties in their present
 * order), rewrites every stored set in the new order and rewrites the prefix table. Set pairs do
 * not depend on the order and stay. All of it happens in one transaction under the index write lock: loads wait,
 * readers keep seeing the old order (MVCC) until the commit switches everything at once.
 */
export async function rebuildIndex(): Promise<RebuildResult> {
  const started = performance.now();
  return db().transaction(async (tx) => {
    await lockIndex(tx);
    await execute(
      tx,
      `create temp table rank_map on commit drop as
         select s.rank as old_rank, (row_number() over (order by coalesce(d.df, 0), s.rank) - 1)::int as new_rank
           from shingles s
           left join (select r, count(*) as df from shingle_sets, unnest(ranks) as r group by r) d on d.r = s.rank`,
    );
    await execute(tx, 'create index on rank_map (old_rank)');
    await execute(
      tx,
      `update shingle_sets ss
          set ranks = (select array_agg(m.new_rank order by m.new_rank) from unnest(ss.ranks) as r join rank_map m on m.old_rank = r)
        where ss.size > 0`,
    );
    // Two steps, each into a range disjoint from the values it replaces, so the unique rank
    // constraint never sees a transient duplicate: first above every old rank, then down to
    // 0..n−1, which must lie below the first step's range too (old ranks may be negative).
    const [{ offset }] = await select<{ offset: number }>(
      tx,
      'select greatest(coalesce(max(rank), 0) + 1, count(*))::int as offset from shingles',
    );
    await execute(tx, 'update shingles s set rank = m.new_rank + $1 from rank_map m where m.old_rank = s.rank', [offset]);
    await execute(tx, 'update shingles set rank = rank - $1', [offset]);
    // every process's mirror of the index holds the old ranks: a new epoch tells them to read anew
    await execute(tx, 'update clone_index_state set epoch = epoch + 1');
    await execute(tx, 'delete from prefix_entries');
    await execute(
      tx,
      `insert into prefix_entries (rank, set_id, position, size)
       select ss.ranks[i], ss.id, i - 1, ss.size
         from shingle_sets ss, generate_series(1, ${prefixLengthSql(indexThreshold, 'ss.size')}) as i
        where ss.size > 0`,
    );
    const [counts] = await select<{ shingles: number; sets: number; entries: number }>(
      tx,
      `select (select count(*) from shingles)::int as shingles, (select count(*) from shingle_sets)::int as sets,
              (select count(*) from prefix_entries)::int as entries`,
    );
    return { shingles: counts.shingles, sets: counts.sets, prefixEntries: counts.entries, millis: Math.round(performance.now() - started) };
  });
}

import { QueryTypes, type Sequelize } from 'sequelize';
import { rebuildCrossClasses } from '../commands/crossClasses';
import type { Migration } from '../db/migrate';

/**
 * Classes across repositories for data loaded before migration 0100: the pairs between the current
 * latest ready snapshots are computed as the later of each two loads would have stored them (its
 * fragments against the earlier one's, at the later snapshot's threshold, from stored set pairs),
 * and each organisation's classes across repositories are rebuilt. Pairs of two snapshots that
 * already have stored pairs are left alone, so running it again adds nothing.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await backfillCrossPairs(sequelize);
};

export const down: Migration['down'] = async () => {
  // nothing to undo: the rows it wrote go with migration 0100's tables
};

/** The backfill itself, for one organisation when named (tests), else every organisation. */
export async function backfillCrossPairs(sequelize: Sequelize, organisationId?: string): Promise<void> {
  const latest = await sequelize.query<{ organisationId: string; snapshotId: number }>(
    `select r.organisation_id as "organisationId", l.snapshot_id as "snapshotId"
       from latest_ready_snapshots l join repositories r on r.id = l.repository_id
      where $1::uuid is null or r.organisation_id = $1::uuid
      order by r.organisation_id, l.snapshot_id`,
    { bind: [organisationId ?? null], type: QueryTypes.SELECT },
  );
  const byOrganisation = new Map<string, number[]>();
  for (const row of latest) byOrganisation.set(row.organisationId, [...(byOrganisation.get(row.organisationId) ?? []), row.snapshotId]);
  for (const [organisation, snapshots] of byOrganisation) {
    await sequelize.transaction(async (transaction) => {
      for (let later = 1; later < snapshots.length; later++) {
        for (let earlier = 0; earlier < later; earlier++) {
          await sequelize.query(PAIRS_BETWEEN, { bind: [snapshots[later], snapshots[earlier]], transaction });
        }
      }
      await rebuildCrossClasses(transaction, organisation);
    });
  }
}

/**
 * The pairs between snapshot $1's fragments and snapshot $2's, as clonePairsAcross finds them: the
 * same non-empty set (similarity 1), or a stored set pair whose overlap reaches $1's threshold
 * (o ≥ t·(a + b − o), in exact numeric arithmetic); none when the two already have stored pairs.
 */
const PAIRS_BETWEEN = `
  insert into cross_pairs (snapshot_id, snapshot_file_id, fragment_id, other_snapshot_id, other_snapshot_file_id, other_fragment_id, similarity, clone_type)
  with threshold as (select (settings->>'threshold')::numeric as t from snapshots where id = $1),
  mine as (
    select sf.id as file_id, f.id as fragment_id, f.set_id, ss.size, f.raw_hash, f.normalized_hash
      from snapshot_files sf join fragments f on f.analysis_id = sf.analysis_id join shingle_sets ss on ss.id = f.set_id
     where sf.snapshot_id = $1 and ss.size > 0),
  theirs as (
    select sf.id as file_id, f.id as fragment_id, f.set_id, ss.size, f.raw_hash, f.normalized_hash
      from snapshot_files sf join fragments f on f.analysis_id = sf.analysis_id join shingle_sets ss on ss.id = f.set_id
     where sf.snapshot_id = $2 and ss.size > 0),
  matched as (
    select m.*, t.file_id as other_file_id, t.fragment_id as other_fragment_id, t.raw_hash as other_raw, t.normalized_hash as other_normalized,
           1::float8 as similarity
      from mine m join theirs t on t.set_id = m.set_id
    union all
    select m.*, t.file_id, t.fragment_id, t.raw_hash, t.normalized_hash, p.overlap::float8 / (m.size + t.size - p.overlap)
      from set_pairs p join mine m on m.set_id = p.set_a join theirs t on t.set_id = p.set_b
     where p.overlap::numeric >= (select t from threshold) * (m.size + t.size - p.overlap)
    union all
    select m.*, t.file_id, t.fragment_id, t.raw_hash, t.normalized_hash, p.overlap::float8 / (m.size + t.size - p.overlap)
      from set_pairs p join mine m on m.set_id = p.set_b join theirs t on t.set_id = p.set_a
     where p.overlap::numeric >= (select t from threshold) * (m.size + t.size - p.overlap))
  select $1, file_id, fragment_id, $2, other_file_id, other_fragment_id, similarity,
         case when raw_hash = other_raw then 1 when normalized_hash = other_normalized then 2 else 3 end
    from matched
   where not exists (select 1 from cross_pairs x where x.snapshot_id = $1 and x.other_snapshot_id = $2)`;

/** Writes a snapshot's clone classes and their members (see README.md). */
import type { Transaction } from 'sequelize';
import type { ClassStatus } from '../../shared/api/snapshots';
import { execute, select } from '../clone-index/sql';

/** One class as it is stored: its figures, its status against the previous snapshot, its members. */
export interface ClassToStore {
  size: number;
  tokens: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
  status: ClassStatus;
  /** the previous snapshot's class it continues, or null */
  previousClassId: number | null;
  /** the lineage it continues, or null to start a new lineage with this snapshot */
  lineageId: number | null;
  members: { snapshotFileId: number; fragmentId: number; codeChanged: boolean }[];
}

/**
 * Stores a snapshot's classes in order (ordinal 0, 1, …) and their members, after starting a lineage
 * for each class that continues none (new lineage ids ascend with the ordinal): three statements in all.
 */
export async function storeClasses(tx: Transaction, snapshotId: number, classes: ClassToStore[]): Promise<void> {
  if (classes.length === 0) return;
  const lineageIds = await startLineages(tx, snapshotId, classes);
  const ids = await select<{ id: number; ordinal: number }>(
    tx,
    `insert into clone_classes (snapshot_id, ordinal, size, tokens, min_similarity, max_similarity, clone_type, language, status, previous_class_id, lineage_id)
     select $1, * from unnest($2::int[], $3::int[], $4::int[], $5::float8[], $6::float8[], $7::int[], $8::text[], $9::text[], $10::int[], $11::int[])
     returning id, ordinal`,
    [
      snapshotId,
      classes.map((_, i) => i),
      classes.map((c) => c.size),
      classes.map((c) => c.tokens),
      classes.map((c) => c.minSimilarity),
      classes.map((c) => c.maxSimilarity),
      classes.map((c) => c.cloneType),
      classes.map((c) => c.language),
      classes.map((c) => c.status),
      classes.map((c) => c.previousClassId),
      lineageIds,
    ],
  );
  const idOf = new Map(ids.map((r) => [r.ordinal, r.id]));
  const members = classes.flatMap((c, ordinal) => c.members.map((m) => ({ classId: idOf.get(ordinal)!, ...m })));
  await execute(
    tx,
    `insert into clone_class_members (class_id, snapshot_file_id, fragment_id, code_changed)
     select * from unnest($1::int[], $2::int[], $3::int[], $4::bool[])`,
    [members.map((m) => m.classId), members.map((m) => m.snapshotFileId), members.map((m) => m.fragmentId), members.map((m) => m.codeChanged)],
  );
}

/** Each class's lineage id: its own, or one started in this snapshot for a class that continues none. */
async function startLineages(tx: Transaction, snapshotId: number, classes: ClassToStore[]): Promise<number[]> {
  const fresh = classes.filter((c) => c.lineageId === null).length;
  if (fresh === 0) return classes.map((c) => c.lineageId!);
  const made = await select<{ id: number }>(
    tx,
    `insert into class_lineages (repository_id, first_snapshot_id)
     select s.repository_id, s.id from snapshots s cross join generate_series(1, $2) where s.id = $1
     returning id`,
    [snapshotId, fresh],
  );
  const ids = made.map((m) => m.id).sort((a, b) => a - b);
  let next = 0;
  return classes.map((c) => c.lineageId ?? ids[next++]);
}

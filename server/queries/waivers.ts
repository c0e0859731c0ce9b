/** Reads and writes of waivers: a lead's acceptance of one class lineage, and how it ended (see README.md). */
import type { Transaction } from 'sequelize';
import { execute, select } from '../clone-index/sql';

/** An active waiver as class views show it. */
export interface WaiverRow {
  id: number;
  lineageId: number;
  reason: string;
  untilLabel: string | null;
  createdByName: string | null;
  createdAt: Date;
}

/** The last ended waiver of a lineage, with the snapshot it ended in (null when it was lifted). */
export interface EndedWaiverRow {
  lineageId: number;
  reason: string;
  endedSnapshotId: number | null;
  snapshotLabel: string | null;
}

/** Starts a waiver of a lineage; undefined when the lineage already has an active one. */
export async function insertWaiver(
  lineageId: number,
  input: { reason: string; untilLabel: string | null; createdBy: string },
): Promise<WaiverRow | undefined> {
  const [row] = await select<{ id: number }>(
    undefined,
    `insert into waivers (lineage_id, reason, until_label, created_by) values ($1, $2, $3, $4)
     on conflict (lineage_id) where ended_at is null do nothing returning id`,
    [lineageId, input.reason, input.untilLabel, input.createdBy],
  );
  if (!row) return undefined;
  return (await activeWaivers([lineageId])).get(lineageId);
}

/** Lifts a lineage's active waiver; whether there was one. */
export async function liftWaiver(lineageId: number): Promise<boolean> {
  const rows = await select<{ id: number }>(
    undefined,
    `update waivers set ended_at = now(), ended_reason = 'lifted' where lineage_id = $1 and ended_at is null returning id`,
    [lineageId],
  );
  return rows.length > 0;
}

/** The active waiver of each of these lineages that has one, by lineage id. */
export async function activeWaivers(lineageIds: number[], tx?: Transaction): Promise<Map<number, WaiverRow>> {
  if (lineageIds.length === 0) return new Map();
  const rows = await select<WaiverRow>(
    tx,
    `select w.id, w.lineage_id as "lineageId", w.reason, w.until_label as "untilLabel", u.name as "createdByName", w.created_at as "createdAt"
       from waivers w left join users u on u.id = w.created_by
      where w.lineage_id = any($1::int[]) and w.ended_at is null`,
    [lineageIds],
  );
  return new Map(rows.map((r) => [r.lineageId, r]));
}

/** The waivers of these lineages that ended by themselves in this snapshot, by lineage id. */
export async function waiversEndedIn(snapshotId: number, lineageIds: number[]): Promise<Map<number, EndedWaiverRow>> {
  if (lineageIds.length === 0) return new Map();
  const rows = await select<EndedWaiverRow>(
    undefined,
    `select distinct on (w.lineage_id) w.lineage_id as "lineageId", w.ended_reason as reason, w.ended_snapshot_id as "endedSnapshotId",
            s.label as "snapshotLabel"
       from waivers w join snapshots s on s.id = w.ended_snapshot_id
      where w.lineage_id = any($1::int[]) and w.ended_snapshot_id = $2
      order by w.lineage_id, w.ended_at desc, w.id desc`,
    [lineageIds, snapshotId],
  );
  return new Map(rows.map((r) => [r.lineageId, r]));
}

/** Ends waivers by themselves in a load: each lineage's active waiver, with why, naming the snapshot. */
export async function endWaivers(tx: Transaction, snapshotId: number, ended: { lineageId: number; reason: string }[]): Promise<void> {
  if (ended.length === 0) return;
  await execute(
    tx,
    `update waivers w set ended_at = now(), ended_reason = u.reason, ended_snapshot_id = $1
       from unnest($2::int[], $3::text[]) as u(lineage, reason)
      where w.lineage_id = u.lineage and w.ended_at is null`,
    [snapshotId, ended.map((e) => e.lineageId), ended.map((e) => e.reason)],
  );
}

/**
 * The token spans of the members of a snapshot's classes whose lineage has no active waiver: every
 * class member is in a clone pair, so their union is the snapshot's unwaived cloned tokens.
 */
export function unwaivedMemberSpans(tx: Transaction | undefined, snapshotId: number): Promise<{ file: number; tokenStart: number; tokenEnd: number }[]> {
  return select(
    tx,
    `select m.snapshot_file_id as file, f.token_start as "tokenStart", f.token_end as "tokenEnd"
       from clone_classes c join clone_class_members m on m.class_id = c.id join fragments f on f.id = m.fragment_id
      where c.snapshot_id = $1 and not exists (select 1 from waivers w where w.lineage_id = c.lineage_id and w.ended_at is null)`,
    [snapshotId],
  );
}

/** Stores a snapshot's unwaived cloned tokens after a waiver started or was lifted. */
export function updateUnwaivedTokens(tx: Transaction | undefined, snapshotId: number, tokens: number): Promise<void> {
  return execute(tx, 'update snapshot_metrics set unwaived_cloned_tokens = $2 where snapshot_id = $1', [snapshotId, tokens]);
}

/** The active waivers of a repository's lineages that run "until release …", with that label. */
export function activeWaiversUntilRelease(tx: Transaction | undefined, repositoryId: number): Promise<{ lineageId: number; untilLabel: string }[]> {
  return select(
    tx,
    `select w.lineage_id as "lineageId", w.until_label as "untilLabel"
       from waivers w join class_lineages l on l.id = w.lineage_id
      where l.repository_id = $1 and w.ended_at is null and w.until_label is not null`,
    [repositoryId],
  );
}

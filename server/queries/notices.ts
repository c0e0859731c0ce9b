/** Reads and writes of notice preferences: which notice mails each user receives (see README.md). */
import type { Transaction } from 'sequelize';
import type { NoticeKind } from '../../shared/api/notices';
import { execute, select } from '../clone-index/sql';

/** A user a notice may go to. */
export interface NoticeRecipientRow {
  id: string;
  organisationId: string;
  email: string;
  name: string;
  role: string;
}

/**
 * Of these users, the active ones who have not turned this kind of notice off (no row means on),
 * in the order of `userIds`, each once.
 */
export async function noticeRecipients(kind: NoticeKind, userIds: string[], tx?: Transaction): Promise<NoticeRecipientRow[]> {
  const unique = [...new Set(userIds)];
  if (unique.length === 0) return [];
  const rows = await select<NoticeRecipientRow>(
    tx,
    `select u.id, u.organisation_id as "organisationId", u.email, u.name, u.role
       from users u
       left join notice_preferences p on p.user_id = u.id and p.kind = $2
      where u.id = any($1::uuid[]) and u.deactivated_at is null and coalesce(p.enabled, true)`,
    [unique, kind],
  );
  const byId = new Map(rows.map((r) => [r.id, r]));
  return unique.flatMap((id) => byId.get(id) ?? []);
}

/** The kinds a user has set explicitly, with their setting (kinds not listed are on). */
export async function noticeSettings(userId: string, tx?: Transaction): Promise<Map<string, boolean>> {
  const rows = await select<{ kind: string; enabled: boolean }>(tx, 'select kind, enabled from notice_preferences where user_id = $1', [userId]);
  return new Map(rows.map((r) => [r.kind, r.enabled]));
}

/** Stores a user's setting of each of these kinds (others are left as they are). */
export async function saveNoticeSettings(userId: string, settings: Partial<Record<NoticeKind, boolean>>, tx?: Transaction): Promise<void> {
  const entries = Object.entries(settings).filter((e): e is [NoticeKind, boolean] => typeof e[1] === 'boolean');
  if (entries.length === 0) return;
  await execute(
    tx,
    `insert into notice_preferences (user_id, kind, enabled)
     select $1, k, e from unnest($2::text[], $3::boolean[]) as t(k, e)
     on conflict (user_id, kind) do update set enabled = excluded.enabled, updated_at = now()`,
    [userId, entries.map((e) => e[0]), entries.map((e) => e[1])],
  );
}

/** What the notices after a load say about its snapshot (token counts are exact integers). */
export interface LoadNoticeFacts {
  snapshotId: number;
  label: string;
  repositoryId: number;
  repositoryName: string;
  organisationId: string;
  /** The repository's clone budget as stored ("0.050000"), or null when it has none. */
  cloneBudget: string | null;
  fragmentTokens: number;
  clonedTokens: number;
  unwaivedClonedTokens: number;
  classCount: number;
  newClassCount: number;
  driftedClassCount: number;
}

/** The facts of a ready snapshot, or undefined when it is not ready (or gone). */
export async function loadNoticeFacts(tx: Transaction | undefined, snapshotId: number): Promise<LoadNoticeFacts | undefined> {
  const [row] = await select<LoadNoticeFacts>(
    tx,
    `select s.id as "snapshotId", s.label, r.id as "repositoryId", r.name as "repositoryName", r.organisation_id as "organisationId",
            r.clone_budget::text as "cloneBudget", m.fragment_tokens::float8 as "fragmentTokens", m.cloned_tokens::float8 as "clonedTokens",
            m.unwaived_cloned_tokens::float8 as "unwaivedClonedTokens", m.class_count as "classCount",
            m.new_class_count as "newClassCount", m.drifted_class_count as "driftedClassCount"
       from snapshots s join repositories r on r.id = s.repository_id join snapshot_metrics m on m.snapshot_id = s.id
      where s.id = $1 and s.status = 'ready'`,
    [snapshotId],
  );
  return row;
}

/** A drifted class as a notice names it: figures and ids only, never code. */
export interface DriftedClassRow {
  id: number;
  lineageId: number | null;
  size: number;
  tokens: number;
  language: string;
}

/** A snapshot's drifted classes, largest first, at most `limit`. */
export function driftedClasses(tx: Transaction | undefined, snapshotId: number, limit: number): Promise<DriftedClassRow[]> {
  return select<DriftedClassRow>(
    tx,
    `select id, lineage_id as "lineageId", size, tokens, language from clone_classes
      where snapshot_id = $1 and status = 'drifted' order by tokens desc, id limit $2`,
    [snapshotId, limit],
  );
}

/** The active users of an organisation whose role is one of these, by name. */
export async function activeUserIdsWithRole(tx: Transaction | undefined, organisationId: string, roles: string[]): Promise<string[]> {
  const rows = await select<{ id: string }>(
    tx,
    `select id from users where organisation_id = $1 and role = any($2::text[]) and deactivated_at is null order by name, email`,
    [organisationId, roles],
  );
  return rows.map((r) => r.id);
}

/**
 * Claims the notices of a snapshot's load: true the first time (the caller queues them in this
 * transaction), false when they were queued already.
 */
export async function claimLoadNotices(tx: Transaction, snapshotId: number): Promise<boolean> {
  const rows = await select<{ snapshotId: number }>(
    tx,
    `insert into load_notices (snapshot_id) values ($1) on conflict do nothing returning snapshot_id as "snapshotId"`,
    [snapshotId],
  );
  return rows.length > 0;
}

/**
 * The assignees of open refactor tasks (open, in progress, in review) on these class lineages,
 * with the lineages each one has open tasks on.
 */
export async function openTaskAssigneesOfLineages(tx: Transaction | undefined, lineageIds: number[]): Promise<Map<string, Set<number>>> {
  if (lineageIds.length === 0) return new Map();
  const rows = await select<{ assigneeId: string; lineageId: number }>(
    tx,
    `select t.assignee_id as "assigneeId", t.lineage_id as "lineageId" from tasks t
      where t.lineage_id = any($1::int[]) and t.assignee_id is not null and t.status in ('open', 'in_progress', 'in_review')`,
    [lineageIds],
  );
  const byAssignee = new Map<string, Set<number>>();
  for (const row of rows) byAssignee.set(row.assigneeId, (byAssignee.get(row.assigneeId) ?? new Set()).add(row.lineageId));
  return byAssignee;
}

/** Reads and writes of refactor tasks, their history (task_events) and comments (see README.md "Refactor tasks"). */
import type { Transaction } from 'sequelize';
import type { TaskCommentDTO, TaskDTO, TaskEventDTO, TaskEventKind, TaskListQuery, TaskSort, TaskStatus } from '../../shared/api/tasks';
import { execute, select } from '../clone-index/sql';

/** A task row as the API shows it, with the organisation it belongs to (for the record rules). */
export type TaskRow = TaskDTO & { organisationId: string; assigneeId: string | null };

/** Today as the due dates count it: the day in UTC. */
const TODAY = `(now() at time zone 'utc')::date`;
const ACTIVE = `t.status in ('open', 'in_progress', 'in_review')`;

/** The lineage's latest class: in the newest snapshot (by load order) that has one. */
const LATEST_CLASS = `lateral (select c.id, c.snapshot_id, s.label from clone_classes c join snapshots s on s.id = c.snapshot_id
                               where c.lineage_id = t.lineage_id order by c.snapshot_id desc limit 1) lc on true`;

const TASK_COLUMNS = `t.id, t.title, t.description, t.status, t.wont_do_reason as "wontDoReason", to_char(t.due_on, 'YYYY-MM-DD') as "dueOn",
  (${ACTIVE} and t.due_on < ${TODAY}) as overdue, t.repository_id as "repositoryId", r.name as "repositoryName",
  t.lineage_id as "lineageId", lc.id as "cloneClassId", lc.snapshot_id as "snapshotId", lc.label as "snapshotLabel",
  case when a.id is null then null else json_build_object('id', a.id, 'name', a.name) end as assignee,
  case when cb.id is null then null else json_build_object('id', cb.id, 'name', cb.name) end as "createdBy",
  case when cs.id is null then null else json_build_object('id', cs.id, 'label', cs.label) end as "closedBySnapshot",
  (select count(*)::int from task_comments tc where tc.task_id = t.id) as "commentCount",
  t.created_at as "createdAt", t.updated_at as "updatedAt", t.organisation_id as "organisationId", t.assignee_id as "assigneeId"`;

const TASK_FROM = `tasks t join repositories r on r.id = t.repository_id
  left join users a on a.id = t.assignee_id left join users cb on cb.id = t.created_by
  left join snapshots cs on cs.id = t.closed_by_snapshot_id
  left join ${LATEST_CLASS}`;

/** The sort expression of each sort key; ties fall back to the newest task. */
const SORTS: Record<TaskSort, { sql: string; order: 'asc' | 'desc' }> = {
  due: { sql: 't.due_on', order: 'asc' },
  updated: { sql: 't.updated_at', order: 'desc' },
  created: { sql: 't.created_at', order: 'desc' },
  status: { sql: `array_position(array['open', 'in_progress', 'in_review', 'done', 'wont_do'], t.status)`, order: 'asc' },
  title: { sql: 'lower(t.title)', order: 'asc' },
};

/** One task of the organisation, or undefined. */
export async function findTask(organisationId: string, id: number, tx?: Transaction): Promise<TaskRow | undefined> {
  const [row] = await select<TaskRow>(tx, `select ${TASK_COLUMNS} from ${TASK_FROM} where t.id = $1 and t.organisation_id = $2`, [id, organisationId]);
  return row;
}

/**
 * One page of the organisation's tasks, filtered and sorted in SQL. `me` is the reader's id, for
 * `assignee=me`. Due dates sort with the undated last in either order.
 */
export async function listTasks(organisationId: string, me: string, query: TaskListQuery): Promise<{ rows: TaskRow[]; total: number }> {
  const where = ['t.organisation_id = $1'];
  const bind: unknown[] = [organisationId];
  const add = (sql: string, value: unknown) => {
    bind.push(value);
    where.push(sql.replaceAll('?', `$${bind.length}`));
  };
  if (query.assignee !== undefined) add('t.assignee_id = ?', query.assignee === 'me' ? me : query.assignee);
  if (query.status === 'active') where.push(ACTIVE);
  else if (query.status === 'closed') where.push(`not ${ACTIVE}`);
  else if (query.status !== undefined) add('t.status = ?', query.status);
  if (query.repositoryId !== undefined) add('t.repository_id = ?', query.repositoryId);
  if (query.lineageId !== undefined) add('t.lineage_id = ?', query.lineageId);
  if (query.overdue === '1') where.push(`${ACTIVE} and t.due_on < ${TODAY}`);
  const filter = where.join(' and ');
  const [{ total }] = await select<{ total: number }>(undefined, `select count(*)::int as total from tasks t where ${filter}`, bind);
  const sort = SORTS[query.sort];
  const order = (query.order ?? sort.order) === 'asc' ? 'asc' : 'desc';
  const rows = await select<TaskRow>(
    undefined,
    `select ${TASK_COLUMNS} from ${TASK_FROM} where ${filter}
      order by ${sort.sql} ${order} nulls last, t.id desc
      limit ${query.pageSize} offset ${(query.page - 1) * query.pageSize}`,
    bind,
  );
  return { rows, total };
}

/** Most history entries and comments a task's page lists (the newest; a task rarely has more). */
export const TASK_THREAD_LIMIT = 500;

/** A task's history, oldest first (the newest TASK_THREAD_LIMIT). */
export async function taskEvents(taskId: number): Promise<TaskEventDTO[]> {
  const rows = await select<TaskEventDTO>(
    undefined,
    `select * from (
       select e.id, e.kind, e.automatic, case when u.id is null then null else json_build_object('id', u.id, 'name', u.name) end as actor,
              e.from_value as "from", e.to_value as "to", e.note, e.created_at as "createdAt"
         from task_events e left join users u on u.id = e.actor_id
        where e.task_id = $1 order by e.id desc limit ${TASK_THREAD_LIMIT}) x
     order by id`,
    [taskId],
  );
  return rows;
}

/** A task's comments, oldest first (the newest TASK_THREAD_LIMIT). */
export async function taskComments(taskId: number): Promise<TaskCommentDTO[]> {
  return select<TaskCommentDTO>(
    undefined,
    `select * from (
       select c.id, case when u.id is null then null else json_build_object('id', u.id, 'name', u.name) end as author,
              c.body, c.created_at as "createdAt"
         from task_comments c left join users u on u.id = c.author_id
        where c.task_id = $1 order by c.id desc limit ${TASK_THREAD_LIMIT}) x
     order by id`,
    [taskId],
  );
}

/** What a new task holds. */
export interface NewTask {
  organisationId: string;
  repositoryId: number;
  lineageId: number;
  title: string;
  description: string;
  assigneeId: string;
  createdBy: string;
  dueOn: string | null;
}

/**
 * Inserts a task unless its lineage already has an active one; the new id, or undefined. The
 * check and the insert are one statement, under a lock on the lineage row, so two leads cannot
 * both open a task on one lineage.
 */
export async function insertTask(tx: Transaction, task: NewTask): Promise<number | undefined> {
  await execute(tx, 'select id from class_lineages where id = $1 for no key update', [task.lineageId]);
  const [row] = await select<{ id: number }>(
    tx,
    `insert into tasks (organisation_id, repository_id, lineage_id, title, description, assignee_id, created_by, due_on)
     select $1, $2, $3, $4, $5, $6, $7, $8::date
      where not exists (select 1 from tasks t where t.lineage_id = $3 and ${ACTIVE})
     returning id`,
    [task.organisationId, task.repositoryId, task.lineageId, task.title, task.description, task.assigneeId, task.createdBy, task.dueOn],
  );
  return row?.id;
}

/** The active task of a lineage, if any (the newest). */
export async function activeTaskOfLineage(tx: Transaction | undefined, lineageId: number): Promise<{ id: number } | undefined> {
  const [row] = await select<{ id: number }>(tx, `select t.id from tasks t where t.lineage_id = $1 and ${ACTIVE} order by t.id desc limit 1`, [lineageId]);
  return row;
}

/** Locks a task's row until the transaction ends, so two changes at once apply one after the other. */
export function lockTask(tx: Transaction, id: number): Promise<void> {
  return execute(tx, 'select id from tasks where id = $1 for update', [id]);
}

/** The columns a person may change, as stored. */
export interface TaskChanges {
  title?: string;
  description?: string;
  assigneeId?: string;
  dueOn?: string | null;
  status?: TaskStatus;
  wontDoReason?: string | null;
}

const CHANGE_COLUMNS: Record<keyof TaskChanges, string> = {
  title: 'title',
  description: 'description',
  assigneeId: 'assignee_id',
  dueOn: 'due_on',
  status: 'status',
  wontDoReason: 'wont_do_reason',
};

/**
 * Writes a person's changes to a task. A status change by a person ends an automatic close
 * (closed_by_snapshot_id), so a later load no longer reopens it.
 */
export async function updateTask(tx: Transaction, id: number, changes: TaskChanges): Promise<void> {
  const sets: string[] = ['updated_at = now()'];
  const bind: unknown[] = [id];
  for (const [key, value] of Object.entries(changes) as [keyof TaskChanges, unknown][]) {
    if (value === undefined) continue;
    bind.push(value);
    sets.push(`${CHANGE_COLUMNS[key]} = $${bind.length}${key === 'dueOn' ? '::date' : ''}`);
  }
  if (changes.status !== undefined) sets.push('closed_by_snapshot_id = null', 'closed_member_keys = null');
  await execute(tx, `update tasks set ${sets.join(', ')} where id = $1`, bind);
}

/** One history entry to write. */
export interface NewTaskEvent {
  taskId: number;
  /** null: Doublet's own change */
  actorId: string | null;
  kind: TaskEventKind;
  from?: string | null;
  to?: string | null;
  note?: string | null;
  snapshotId?: number | null;
}

/** Writes history entries (one statement for the batch). */
export async function insertTaskEvents(tx: Transaction, events: NewTaskEvent[]): Promise<void> {
  if (events.length === 0) return;
  await execute(
    tx,
    `insert into task_events (task_id, actor_id, automatic, kind, from_value, to_value, note, snapshot_id)
     select u.task, u.actor, u.actor is null, u.kind, u.from_value, u.to_value, u.note, u.snapshot
       from unnest($1::int[], $2::uuid[], $3::text[], $4::text[], $5::text[], $6::text[], $7::int[])
         as u(task, actor, kind, from_value, to_value, note, snapshot)`,
    [
      events.map((e) => e.taskId),
      events.map((e) => e.actorId),
      events.map((e) => e.kind),
      events.map((e) => e.from ?? null),
      events.map((e) => e.to ?? null),
      events.map((e) => e.note ?? null),
      events.map((e) => e.snapshotId ?? null),
    ],
  );
}

/** Most comments one task takes. */
export const TASK_COMMENT_LIMIT = 1000;

/** Adds a comment unless the task already has TASK_COMMENT_LIMIT; the new comment, or undefined. */
export async function insertTaskComment(taskId: number, authorId: string, body: string): Promise<TaskCommentDTO | undefined> {
  const [row] = await select<{ id: number }>(
    undefined,
    `insert into task_comments (task_id, author_id, body)
     select $1, $2, $3 where (select count(*) from task_comments where task_id = $1) < ${TASK_COMMENT_LIMIT}
     returning id`,
    [taskId, authorId, body],
  );
  if (!row) return undefined;
  await execute(undefined, 'update tasks set updated_at = now() where id = $1', [taskId]);
  const [comment] = await select<TaskCommentDTO>(
    undefined,
    `select c.id, case when u.id is null then null else json_build_object('id', u.id, 'name', u.name) end as author, c.body, c.created_at as "createdAt"
       from task_comments c left join users u on u.id = c.author_id where c.id = $1`,
    [row.id],
  );
  return comment;
}

/** An active member of the organisation who may be assigned work (engineer, lead or admin), or undefined. */
export async function findAssignableMember(organisationId: string, userId: string, tx?: Transaction): Promise<{ id: string; name: string; email: string } | undefined> {
  const [row] = await select<{ id: string; name: string; email: string }>(
    tx,
    `select id, name, email from users where id = $1 and organisation_id = $2 and deactivated_at is null and role in ('admin', 'lead', 'engineer')`,
    [userId, organisationId],
  );
  return row;
}

/** The organisation's active members, by name. */
export function listActiveMembers(organisationId: string): Promise<{ id: string; name: string; role: string }[]> {
  return select(undefined, `select id, name, role from users where organisation_id = $1 and deactivated_at is null order by lower(name), id`, [organisationId]);
}

/** Whether the lineage has a class in the repository's latest ready snapshot (its copies are still there). */
export async function lineageInLatestSnapshot(lineageId: number, repositoryId: number): Promise<{ present: boolean; label: string | null }> {
  const [row] = await select<{ present: boolean; label: string | null }>(
    undefined,
    `select exists (select 1 from clone_classes c where c.snapshot_id = s.id and c.lineage_id = $1) as present, s.label
       from snapshots s where s.repository_id = $2 and s.status = 'ready' order by s.id desc limit 1`,
    [lineageId, repositoryId],
  );
  return row ?? { present: false, label: null };
}

/** A task the automatic check changed, with whom to tell. */
export interface SettledTaskRow {
  id: number;
  title: string;
  organisationId: string;
  assigneeId: string | null;
  lineageId: number;
  from: TaskStatus;
}

/**
 * Marks done every active task of the repository whose lineage has no class in this snapshot,
 * recording the snapshot that closed it; the tasks, with the status each had.
 */
export function closeTasksOfGoneLineages(tx: Transaction, snapshotId: number, repositoryId: number): Promise<SettledTaskRow[]> {
  return select<SettledTaskRow>(
    tx,
    `with gone as (
       select t.id, t.status from tasks t
        where t.repository_id = $2 and ${ACTIVE}
          and not exists (select 1 from clone_classes c where c.snapshot_id = $1 and c.lineage_id = t.lineage_id)
        for update)
     update tasks t set status = 'done', closed_by_snapshot_id = $1, updated_at = now() from gone where t.id = gone.id
     returning t.id, t.title, t.organisation_id as "organisationId", t.assignee_id as "assigneeId", t.lineage_id as "lineageId", gone.status as "from"`,
    [snapshotId, repositoryId],
  );
}

/** The repository's tasks a load closed by itself and no person has touched since (candidates to reopen), with the members their lineage last had. */
export function autoClosedTasks(tx: Transaction, repositoryId: number, snapshotId: number): Promise<(SettledTaskRow & { keys: string[] })[]> {
  return select(
    tx,
    `select t.id, t.title, t.organisation_id as "organisationId", t.assignee_id as "assigneeId", t.status as "from", t.lineage_id as "lineageId",
            coalesce(t.closed_member_keys, '{}') as keys
       from tasks t
      where t.repository_id = $1 and t.status = 'done' and t.closed_by_snapshot_id is not null and t.closed_by_snapshot_id <> $2
      order by t.id for update`,
    [repositoryId, snapshotId],
  );
}

/**
 * The member keys (path, name, occurrence of the name in the file, as a JSON array: what
 * server/clone-index/compare.ts matches members by) of a snapshot's classes: every class, or only
 * those of the given lineages. With each class: its id, lineage and ordinal.
 */
export function classMemberKeys(
  tx: Transaction,
  snapshotId: number,
  lineageIds?: number[],
): Promise<{ classId: number; lineageId: number; ordinal: number; keys: string[] }[]> {
  return select(
    tx,
    `with numbered as (
       select sf.id as snapshot_file_id, f.id as fragment_id,
              json_build_array(sf.path, f.name, row_number() over (partition by sf.path, f.name order by f.ordinal) - 1)::text as key
         from snapshot_files sf join fragments f on f.analysis_id = sf.analysis_id
        where sf.snapshot_id = $1)
     select c.id as "classId", c.lineage_id as "lineageId", c.ordinal, array_agg(n.key) as keys
       from clone_classes c
       join clone_class_members m on m.class_id = c.id
       join numbered n on n.snapshot_file_id = m.snapshot_file_id and n.fragment_id = m.fragment_id
      where c.snapshot_id = $1 and ($2::int[] is null or c.lineage_id = any($2::int[]))
      group by c.id
      order by c.ordinal`,
    [snapshotId, lineageIds ?? null],
  );
}

/** The newest snapshot before this one in which each lineage has a class, by lineage id. */
export async function lastSnapshotsOfLineages(tx: Transaction, lineageIds: number[], beforeSnapshotId: number): Promise<Map<number, number>> {
  const rows = await select<{ lineageId: number; snapshotId: number }>(
    tx,
    `select distinct on (c.lineage_id) c.lineage_id as "lineageId", c.snapshot_id as "snapshotId"
       from clone_classes c where c.lineage_id = any($1::int[]) and c.snapshot_id < $2 order by c.lineage_id, c.snapshot_id desc`,
    [lineageIds, beforeSnapshotId],
  );
  return new Map(rows.map((r) => [r.lineageId, r.snapshotId]));
}

/** The lineages of the repository that have a task still to be worked on. */
export async function lineagesWithActiveTasks(tx: Transaction, repositoryId: number): Promise<Set<number>> {
  const rows = await select<{ lineageId: number }>(tx, `select distinct t.lineage_id as "lineageId" from tasks t where t.repository_id = $1 and ${ACTIVE}`, [repositoryId]);
  return new Set(rows.map((r) => r.lineageId));
}

/** Remembers the members a closed task's lineage last had. */
export function storeClosedMemberKeys(tx: Transaction, id: number, keys: string[]): Promise<void> {
  return execute(tx, 'update tasks set closed_member_keys = $2 where id = $1', [id, keys]);
}

/** Reopens a task a load had closed, on the lineage its copies came back in. */
export function reopenTask(tx: Transaction, id: number, lineageId: number): Promise<void> {
  return execute(tx, `update tasks set status = 'open', closed_by_snapshot_id = null, closed_member_keys = null, lineage_id = $2, updated_at = now() where id = $1`, [id, lineageId]);
}

/** A repository's name (for the notices of a load). */
export async function repositoryName(tx: Transaction, repositoryId: number): Promise<string> {
  const [row] = await select<{ name: string }>(tx, 'select name from repositories where id = $1', [repositoryId]);
  return row?.name ?? `#${repositoryId}`;
}

/** A snapshot's label. */
export async function snapshotLabel(tx: Transaction, snapshotId: number): Promise<string> {
  const [row] = await select<{ label: string }>(tx, 'select label from snapshots where id = $1', [snapshotId]);
  return row?.label ?? `#${snapshotId}`;
}

/**
 * The classes of the latest ready snapshot of each repository of the organisation, by repository
 * name then class order, with their first member's name (what the demo seeds tasks on).
 */
export function latestClassesOfOrganisation(organisationId: string, limit: number): Promise<{ id: number; size: number; memberName: string }[]> {
  return select(
    undefined,
    `with latest as (
       select distinct on (s.repository_id) s.id, r.name as repository_name
         from snapshots s join repositories r on r.id = s.repository_id
        where r.organisation_id = $1 and s.status = 'ready' order by s.repository_id, s.id desc)
     select c.id, c.size,
            (select f.name from clone_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id join fragments f on f.id = m.fragment_id
              where m.class_id = c.id order by sf.path, f.start_line limit 1) as "memberName"
       from latest l join clone_classes c on c.snapshot_id = l.id
      order by l.repository_name, c.ordinal
      limit $2`,
    [organisationId, limit],
  );
}

/**
 * Classes of each repository's ready snapshot before its latest whose lineage the latest snapshot
 * no longer has (copies merged or removed), by repository name then class order, with their first
 * member's name and the latest snapshot (what the demo's automatically done task is seeded on).
 */
export function goneClassesOfOrganisation(
  organisationId: string,
  limit: number,
): Promise<{ id: number; size: number; memberName: string; repositoryId: number; latestSnapshotId: number }[]> {
  return select(
    undefined,
    `with ranked as (
       select s.id, s.repository_id, r.name as repository_name, row_number() over (partition by s.repository_id order by s.id desc) as n
         from snapshots s join repositories r on r.id = s.repository_id
        where r.organisation_id = $1 and s.status = 'ready'),
     pairs as (select p.id as previous_id, l.id as latest_id, l.repository_id, l.repository_name
                 from ranked l join ranked p on p.repository_id = l.repository_id and l.n = 1 and p.n = 2)
     select c.id, c.size, x.repository_id as "repositoryId", x.latest_id as "latestSnapshotId",
            (select f.name from clone_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id join fragments f on f.id = m.fragment_id
              where m.class_id = c.id order by sf.path, f.start_line limit 1) as "memberName"
       from pairs x join clone_classes c on c.snapshot_id = x.previous_id
      where not exists (select 1 from clone_classes n where n.snapshot_id = x.latest_id and n.lineage_id = c.lineage_id)
      order by x.repository_name, c.ordinal
      limit $2`,
    [organisationId, limit],
  );
}

import type { Transaction } from 'sequelize';
import { TASK_STATUS_LABELS } from '../../shared/task-statuses';
import { sendNotice } from '../mail/notices';
import { taskAutoChangedNotice, taskUrl } from '../mail/task-notices';
import {
  autoClosedTasks,
  classMemberKeys,
  closeTasksOfGoneLineages,
  insertTaskEvents,
  lastSnapshotsOfLineages,
  lineagesWithActiveTasks,
  reopenTask,
  repositoryName,
  snapshotLabel,
  storeClosedMemberKeys,
  type SettledTaskRow,
} from '../queries/tasks';

/** What the automatic check did in one load. */
export interface TaskSettlement {
  done: number[];
  reopened: number[];
}

/**
 * The automatic check of refactor tasks, run by a load in its transaction right after the new
 * snapshot's classes and lineages are stored (see README.md "Refactor tasks"):
 *
 * - every active task (open, in progress, in review) of the repository whose lineage has no class
 *   in the new snapshot (its copies were merged or removed) is marked done, by Doublet, with a note
 *   naming the snapshot; the members the lineage last had are kept on the task;
 * - every task a load closed that way, untouched by a person since, reopens (status open) when the
 *   new snapshot has its lineage again, or a class holding one of those members (matched by path,
 *   name and occurrence, as lineages match them); the task then follows that class's lineage (the
 *   one sharing most members, ties to the class listed first), unless that lineage already has a
 *   task to work on (a lineage keeps at most one; the older task then stays done).
 *
 * Each change is a history entry and a notice to the assignee. Cheap when nothing applies: one
 * update and one read, plus the new snapshot's member keys only when some task waits to reopen.
 */
export async function settleTasks(tx: Transaction, snapshotId: number, repositoryId: number): Promise<TaskSettlement> {
  const candidates = await autoClosedTasks(tx, repositoryId, snapshotId);
  const closed = await closeTasksOfGoneLineages(tx, snapshotId, repositoryId);
  if (candidates.length === 0 && closed.length === 0) return { done: [], reopened: [] };
  const label = await snapshotLabel(tx, snapshotId);
  if (closed.length > 0) {
    await rememberMembers(tx, snapshotId, closed);
    await insertTaskEvents(
      tx,
      closed.map((task) => ({
        taskId: task.id,
        actorId: null,
        kind: 'status' as const,
        from: TASK_STATUS_LABELS[task.from],
        to: TASK_STATUS_LABELS.done,
        note: `Snapshot ${label} no longer has this class's copies (merged or removed).`,
        snapshotId,
      })),
    );
  }

  const reopened: SettledTaskRow[] = [];
  if (candidates.length > 0) {
    const current = await classMemberKeys(tx, snapshotId);
    const byLineage = new Map(current.map((c) => [c.lineageId, c]));
    // a lineage keeps at most one task to work on: one that already has it (or got it just now) takes no other
    const taken = await lineagesWithActiveTasks(tx, repositoryId);
    for (const task of candidates) {
      const target = byLineage.get(task.lineageId) ?? classSharingMost(current, new Set(task.keys));
      if (!target || taken.has(target.lineageId)) continue;
      taken.add(target.lineageId);
      await reopenTask(tx, task.id, target.lineageId);
      reopened.push(task);
    }
    await insertTaskEvents(
      tx,
      reopened.map((task) => ({
        taskId: task.id,
        actorId: null,
        kind: 'status' as const,
        from: TASK_STATUS_LABELS.done,
        to: TASK_STATUS_LABELS.open,
        note: `Snapshot ${label} has this class's copies again.`,
        snapshotId,
      })),
    );
  }
  await notify(tx, repositoryId, label, closed, reopened);
  return { done: closed.map((t) => t.id), reopened: reopened.map((t) => t.id) };
}

/** The class holding most of these member keys (ties: the first listed), or undefined when none holds one. */
function classSharingMost<C extends { keys: string[] }>(classes: C[], keys: Set<string>): C | undefined {
  let best: C | undefined;
  let bestCount = 0;
  for (const c of classes) {
    const count = c.keys.filter((k) => keys.has(k)).length;
    if (count > bestCount) [best, bestCount] = [c, count];
  }
  return best;
}

/** Keeps on each closed task the members its lineage last had (in the snapshot before this one that has it). */
async function rememberMembers(tx: Transaction, snapshotId: number, closed: SettledTaskRow[]): Promise<void> {
  const lastSnapshot = await lastSnapshotsOfLineages(tx, [...new Set(closed.map((t) => t.lineageId))], snapshotId);
  const keysOf = new Map<number, string[]>();
  for (const snapshot of new Set(lastSnapshot.values())) {
    const lineages = [...lastSnapshot].filter(([, s]) => s === snapshot).map(([l]) => l);
    for (const c of await classMemberKeys(tx, snapshot, lineages)) keysOf.set(c.lineageId, c.keys);
  }
  for (const task of closed) await storeClosedMemberKeys(tx, task.id, keysOf.get(task.lineageId) ?? []);
}

/** Tells each assignee, in the load's transaction (the mail goes only if the load commits). */
async function notify(tx: Transaction, repositoryId: number, label: string, done: SettledTaskRow[], reopened: SettledTaskRow[]): Promise<void> {
  const name = await repositoryName(tx, repositoryId);
  const changes = [...done.map((task) => ({ task, change: 'done' as const })), ...reopened.map((task) => ({ task, change: 'reopened' as const }))];
  for (const { task, change } of changes) {
    if (!task.assigneeId) continue;
    const facts = { title: task.title, repositoryName: name, taskUrl: taskUrl(task.id), change, snapshotLabel: label };
    await sendNotice({ kind: 'taskAutoChanged', recipientIds: [task.assigneeId], compose: (user) => taskAutoChangedNotice(user, facts) }, tx);
  }
}

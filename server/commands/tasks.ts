import type { Transaction } from 'sequelize';
import { isLeadMove, mayMoveTask, TASK_STATUS_LABELS, type CreateTaskInput, type TaskCommentDTO, type UpdateTaskInput } from '../../shared/api/tasks';
import { db } from '../db/connection';
import { AuthorizationError, ConflictError, ValidationError } from '../errors';
import { sendNotice } from '../mail/notices';
import { taskAssignedNotice, taskUrl } from '../mail/task-notices';
import type { User } from '../models/User';
import { allows } from '../policies';
import type { ClassDetailRow } from '../queries/classes';
import {
  findAssignableMember,
  findTask,
  insertTask,
  insertTaskComment,
  insertTaskEvents,
  lineageInLatestSnapshot,
  lockTask,
  TASK_COMMENT_LIMIT,
  updateTask,
  type NewTaskEvent,
  type TaskChanges,
  type TaskRow,
} from '../queries/tasks';

const NOT_ASSIGNABLE = 'The assignee must be an active engineer, lead or admin of your organisation.';

/**
 * Creates a refactor task on a clone class's lineage, assigned to an active engineer (or above) of
 * the organisation, and mails the assignee. A lineage has at most one active task, and its copies
 * must still be in the repository's latest snapshot (`allowGoneCopies` lifts that for the demo seed,
 * which shows a task the automatic check closed).
 *
 * @throws ValidationError (assigneeId) for someone who cannot be assigned
 * @throws ConflictError when the lineage already has an active task or its copies are gone
 */
export async function createTask(actor: User, cloneClass: ClassDetailRow, input: CreateTaskInput, options: { allowGoneCopies?: boolean } = {}): Promise<number> {
  const latest = await lineageInLatestSnapshot(cloneClass.lineageId, cloneClass.repositoryId);
  if (!latest.present && !options.allowGoneCopies) {
    throw new ConflictError(
      latest.label
        ? `The copies of this class are gone from the latest snapshot (${latest.label}): there is nothing left to refactor.`
        : 'This repository has no ready snapshot.',
      'cloneClassId',
    );
  }
  return db().transaction(async (tx) => {
    const assignee = await findAssignableMember(actor.organisationId, input.assigneeId, tx);
    if (!assignee) throw new ValidationError(`assigneeId: ${NOT_ASSIGNABLE}`, 'assigneeId');
    const id = await insertTask(tx, {
      organisationId: actor.organisationId,
      repositoryId: cloneClass.repositoryId,
      lineageId: cloneClass.lineageId,
      title: input.title,
      description: input.description ?? '',
      assigneeId: assignee.id,
      createdBy: actor.id,
      dueOn: input.dueOn ?? null,
    });
    if (id === undefined) throw new ConflictError('This clone class already has an open task.', 'cloneClassId');
    await insertTaskEvents(tx, [{ taskId: id, actorId: actor.id, kind: 'created', to: TASK_STATUS_LABELS.open, note: `assigned to ${assignee.name}` }]);
    await mailAssignee(tx, actor, id);
    return id;
  });
}

/**
 * Applies a PATCH: a lead's edits (title, description, assignee, due date) and a status change by
 * the lead or the assignee engineer, each kept as a history entry (who, when, from, to). Status
 * moves follow TASK_TRANSITIONS; closing as won't do (with a reason) and reopening from it are a
 * lead's. A reassignment mails the new assignee.
 *
 * @throws AuthorizationError (403) when the actor may not make one of the changes
 * @throws ConflictError (409, field status) for a move the workflow does not allow
 */
export async function changeTask(actor: User, task: TaskRow, input: UpdateTaskInput): Promise<void> {
  const edits = input.title !== undefined || input.description !== undefined || input.assigneeId !== undefined || input.dueOn !== undefined;
  if (edits && !allows(actor, 'tasks.assign', task)) throw new AuthorizationError('Only a lead edits, reassigns or dates a task.');
  if (input.status !== undefined && input.status !== task.status) {
    if (!allows(actor, 'tasks.work', task)) throw new AuthorizationError('Only a lead or the assignee changes the status of this task.');
    if (isLeadMove(task.status, input.status) && !allows(actor, 'tasks.assign', task)) {
      throw new AuthorizationError(input.status === 'wont_do' ? "Only a lead closes a task as won't do." : "Only a lead reopens a task closed as won't do.");
    }
    if (!mayMoveTask(task.status, input.status)) {
      throw new ConflictError(`A task that is ${TASK_STATUS_LABELS[task.status].toLowerCase()} cannot move to ${TASK_STATUS_LABELS[input.status].toLowerCase()}.`, 'status');
    }
  }
  await db().transaction(async (tx) => {
    // re-read under a lock, so two changes at once each see the other's result
    await lockTask(tx, task.id);
    const current = (await findTask(actor.organisationId, task.id, tx))!;
    const changes: TaskChanges = {};
    const events: NewTaskEvent[] = [];
    const event = (kind: NewTaskEvent['kind'], from: string | null, to: string | null, note?: string) =>
      events.push({ taskId: task.id, actorId: actor.id, kind, from, to, note: note ?? null });
    if (input.title !== undefined && input.title !== current.title) {
      changes.title = input.title;
      event('title', current.title, input.title);
    }
    if (input.description !== undefined && input.description !== current.description) {
      changes.description = input.description;
      event('description', null, null);
    }
    let reassignedTo: string | undefined;
    if (input.assigneeId !== undefined && input.assigneeId !== current.assigneeId) {
      const assignee = await findAssignableMember(actor.organisationId, input.assigneeId, tx);
      if (!assignee) throw new ValidationError(`assigneeId: ${NOT_ASSIGNABLE}`, 'assigneeId');
      changes.assigneeId = assignee.id;
      reassignedTo = assignee.id;
      event('assignee', current.assignee?.name ?? null, assignee.name);
    }
    if (input.dueOn !== undefined && input.dueOn !== current.dueOn) {
      changes.dueOn = input.dueOn;
      event('due', current.dueOn, input.dueOn);
    }
    if (input.status !== undefined && input.status !== current.status) {
      if (!mayMoveTask(current.status, input.status)) {
        throw new ConflictError(`A task that is ${TASK_STATUS_LABELS[current.status].toLowerCase()} cannot move to ${TASK_STATUS_LABELS[input.status].toLowerCase()}.`, 'status');
      }
      changes.status = input.status;
      changes.wontDoReason = input.status === 'wont_do' ? input.reason! : null;
      event('status', TASK_STATUS_LABELS[current.status], TASK_STATUS_LABELS[input.status], input.status === 'wont_do' ? input.reason : undefined);
    }
    if (events.length === 0) return;
    await updateTask(tx, task.id, changes);
    await insertTaskEvents(tx, events);
    if (reassignedTo) await mailAssignee(tx, actor, task.id);
  });
}

/** Queues "task assigned to you" to the task's assignee (unless they assigned themselves), in the transaction that assigned it. */
async function mailAssignee(tx: Transaction, actor: User, taskId: number): Promise<void> {
  const task = (await findTask(actor.organisationId, taskId, tx))!;
  if (!task.assigneeId || task.assigneeId === actor.id) return;
  await sendNotice(
    {
      kind: 'taskAssigned',
      recipientIds: [task.assigneeId],
      compose: (user) =>
        taskAssignedNotice(user, { title: task.title, repositoryName: task.repositoryName, taskUrl: taskUrl(task.id), assignedByName: actor.name, dueOn: task.dueOn }),
    },
    tx,
  );
}

/**
 * Adds a comment to a task (engineers and up, any task of the organisation).
 *
 * @throws ConflictError when the task already has TASK_COMMENT_LIMIT comments
 */
export async function commentOnTask(actor: User, task: TaskRow, body: string): Promise<TaskCommentDTO> {
  const comment = await insertTaskComment(task.id, actor.id, body);
  if (!comment) throw new ConflictError(`A task takes at most ${TASK_COMMENT_LIMIT} comments.`, 'body');
  return comment;
}

import { appUrl } from '../config';
import type { NoticeContent, NoticeRecipient } from './notices';
import { escapeHtml } from './html';

/**
 * The mails of the two task notices, from plain facts, for refactor tasks to pass to sendNotice's
 * compose. Titles are what a lead typed (shown as text, escaped in HTML); never put code in them.
 */

/** A task's page under PUBLIC_URL, for the notice mails. */
export function taskUrl(taskId: number): string {
  return appUrl(`/tasks/${taskId}`);
}

/** What a task notice says about its task. */
export interface TaskNoticeFacts {
  title: string;
  repositoryName: string;
  /** The task page, under PUBLIC_URL. */
  taskUrl: string;
}

/**
 * "Task assigned to you".
 *
 * @example
 * sendNotice({ kind: 'taskAssigned', recipientIds: [assigneeId], compose: (user) => taskAssignedNotice(user, { ...facts, assignedByName, dueOn }) }, tx)
 */
export function taskAssignedNotice(user: NoticeRecipient, task: TaskNoticeFacts & { assignedByName: string; dueOn?: string | null }): NoticeContent {
  const subject = `Task assigned to you: ${task.title}`;
  const line = `${task.assignedByName} assigned you a refactor task in ${task.repositoryName}: "${task.title}"${task.dueOn ? `, due on ${task.dueOn}` : ''}.`;
  return {
    subject,
    text: [`Hello ${user.name},`, '', line, '', `Open the task: ${task.taskUrl}`].join('\n'),
    html: `<p>Hello ${escapeHtml(user.name)},</p><p>${escapeHtml(line)}</p><p><a href="${escapeHtml(task.taskUrl)}">Open the task</a></p>`,
  };
}

/**
 * "Your task done or reopened by a load": a snapshot no longer has the task's copies (done), or
 * has them again (reopened).
 */
export function taskAutoChangedNotice(
  user: NoticeRecipient,
  task: TaskNoticeFacts & { change: 'done' | 'reopened'; snapshotLabel: string },
): NoticeContent {
  const subject = task.change === 'done' ? `Task done by release ${task.snapshotLabel}: ${task.title}` : `Task reopened by release ${task.snapshotLabel}: ${task.title}`;
  const line =
    task.change === 'done'
      ? `The snapshot ${task.snapshotLabel} of ${task.repositoryName} no longer has the copies of your task "${task.title}", so it was marked done.`
      : `The snapshot ${task.snapshotLabel} of ${task.repositoryName} has the copies of your task "${task.title}" again, so it was reopened.`;
  return {
    subject,
    text: [`Hello ${user.name},`, '', line, '', `Open the task: ${task.taskUrl}`].join('\n'),
    html: `<p>Hello ${escapeHtml(user.name)},</p><p>${escapeHtml(line)}</p><p><a href="${escapeHtml(task.taskUrl)}">Open the task</a></p>`,
  };
}

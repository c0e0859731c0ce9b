/**
 * The refactor-task notices (sent through sendNotice, which adds the footer saying how to turn
 * them off): a task assigned to you, and your task done or reopened by a load. They name the task,
 * its repository and the snapshot; they never hold source text.
 */
import { loadConfig } from '../config';
import type { NoticeContent } from './notices';

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** The link to a task's page. */
export function taskLink(taskId: number): string {
  return `${loadConfig().publicUrl.replace(/\/$/, '')}/tasks/${taskId}`;
}

/** A task as its notices name it. */
export interface TaskMailFacts {
  id: number;
  title: string;
  repositoryName: string;
}

function render(greetingName: string, lines: string[], task: TaskMailFacts): { text: string; html: string } {
  const link = taskLink(task.id);
  const text = [`Hello ${greetingName},`, '', ...lines, '', link].join('\n');
  const html =
    `<p>${escapeHtml(`Hello ${greetingName},`)}</p>` +
    lines.map((line) => `<p>${escapeHtml(line)}</p>`).join('') +
    `<p><a href="${escapeHtml(link)}">Open task #${task.id}</a></p>`;
  return { text, html };
}

/**
 * "Task assigned to you": on creation and on reassignment.
 *
 * @example
 * taskAssignedMail({ name: 'Priya' }, { id: 3, title: 'Merge the tariff rules', repositoryName: 'freight-platform' }, { byName: 'Tomasz', dueOn: null })
 */
export function taskAssignedMail(to: { name: string }, task: TaskMailFacts, input: { byName: string; dueOn: string | null }): NoticeContent {
  const lines = [
    `${input.byName} assigned you the refactor task #${task.id} "${task.title}" in ${task.repositoryName}.`,
    input.dueOn ? `It is due on ${input.dueOn}.` : 'It has no due date.',
  ];
  return { subject: `Task assigned to you: ${task.title}`, ...render(to.name, lines, task) };
}

/**
 * "Your task was done automatically": a load no longer has the task's copies.
 *
 * @example
 * taskDoneAutomaticallyMail({ name: 'Priya' }, task, { snapshotLabel: '2026.12' })
 */
export function taskDoneAutomaticallyMail(to: { name: string }, task: TaskMailFacts, input: { snapshotLabel: string }): NoticeContent {
  const lines = [
    `Snapshot ${input.snapshotLabel} of ${task.repositoryName} no longer has the copies of your refactor task #${task.id} "${task.title}" (they were merged or removed).`,
    'Doublet marked the task done. It reopens by itself if the copies come back in a later snapshot.',
  ];
  return { subject: `Your task was done automatically: ${task.title}`, ...render(to.name, lines, task) };
}

/**
 * "Your task was reopened": a later load has the task's copies again.
 *
 * @example
 * taskReopenedMail({ name: 'Priya' }, task, { snapshotLabel: '2027.01' })
 */
export function taskReopenedMail(to: { name: string }, task: TaskMailFacts, input: { snapshotLabel: string }): NoticeContent {
  const lines = [
    `Snapshot ${input.snapshotLabel} of ${task.repositoryName} has the copies of your refactor task #${task.id} "${task.title}" again.`,
    'Doublet reopened the task, which it had marked done when the copies were gone.',
  ];
  return { subject: `Your task was reopened: ${task.title}`, ...render(to.name, lines, task) };
}

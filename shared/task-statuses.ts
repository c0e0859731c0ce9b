/**
 * A refactor task's statuses and their names, apart from the API's schemas (shared/api/tasks.ts
 * re-exports them) so the server's load path reads them without loading zod.
 */

/** A task's statuses, in the order work moves through them; won't do is a lead's close with a reason. */
export const TASK_STATUSES = ['open', 'in_progress', 'in_review', 'done', 'wont_do'] as const;
/** A task status. */
export type TaskStatus = (typeof TASK_STATUSES)[number];

/** The statuses of a task still to be worked on (the rest are closed). */
export const ACTIVE_TASK_STATUSES: readonly TaskStatus[] = ['open', 'in_progress', 'in_review'];

/** Human labels for the UI and the mails. */
export const TASK_STATUS_LABELS: Record<TaskStatus, string> = {
  open: 'Open',
  in_progress: 'In progress',
  in_review: 'In review',
  done: 'Done',
  wont_do: "Won't do",
};

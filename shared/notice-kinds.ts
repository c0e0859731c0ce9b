/**
 * The kinds of notice mail and their names, apart from the API's schemas (shared/api/notices.ts
 * re-exports them) so the server's mail code reads them without loading zod.
 */

/** The kinds of notice mail, in the order the account page lists them. */
export const NOTICE_KINDS = ['taskAssigned', 'taskAutoChanged', 'budgetExceeded', 'classesDrifted'] as const;

/** One kind of notice mail. */
export type NoticeKind = (typeof NOTICE_KINDS)[number];

/** What each kind is about, as the account page names it. */
export const NOTICE_LABELS: Record<NoticeKind, { label: string; description: string }> = {
  taskAssigned: { label: 'Task assigned to you', description: 'A lead assigns a refactor task to you.' },
  taskAutoChanged: {
    label: 'Your task done or reopened by a load',
    description: 'A new snapshot no longer has the copies of your task (done), or has them again (reopened).',
  },
  budgetExceeded: {
    label: 'Snapshot over its clone budget',
    description: 'For leads and admins: a new snapshot’s clone ratio without waived classes is over its repository’s budget.',
  },
  classesDrifted: {
    label: 'Drifted classes in a new snapshot',
    description: 'For leads, admins and assignees of their tasks: some copies of a class changed in a new snapshot while others did not.',
  },
};

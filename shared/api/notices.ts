/**
 * API types and schemas of /api/account/notices: which kinds of notice mail a user receives.
 * Every kind is on until the user turns it off; invitations are not notices and always go out.
 */
import { z } from 'zod';

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

/** Answer of GET and PUT /api/account/notices: every kind with whether it is on. */
export interface NoticePreferencesDTO {
  notices: Record<NoticeKind, boolean>;
}

const kindSwitches = Object.fromEntries(
  NOTICE_KINDS.map((kind) => [kind, z.boolean({ error: `notices.${kind} must be true or false.` }).optional()]),
) as { [K in NoticeKind]: z.ZodOptional<z.ZodBoolean> };

/** Body of PUT /api/account/notices: the kinds to change (others keep their setting). */
export const noticePreferencesInputSchema = z.strictObject({
  notices: z.strictObject(kindSwitches, {
    error: (issue) =>
      issue.code === 'unrecognized_keys'
        ? `Unknown notice kind ${issue.keys.map((k) => `"${k}"`).join(', ')}; the kinds are ${NOTICE_KINDS.join(', ')}.`
        : 'notices must be an object of notice kinds, each true or false.',
  }),
});

/** Parsed body of PUT /api/account/notices. */
export type NoticePreferencesInput = z.infer<typeof noticePreferencesInputSchema>;

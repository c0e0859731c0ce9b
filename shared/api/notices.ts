/**
 * API types and schemas of /api/account/notices: which kinds of notice mail a user receives.
 * Every kind is on until the user turns it off; invitations are not notices and always go out.
 */
import { z } from 'zod';
import { NOTICE_KINDS, type NoticeKind } from '../notice-kinds';

export { NOTICE_KINDS, NOTICE_LABELS, type NoticeKind } from '../notice-kinds';

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

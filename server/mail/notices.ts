import type { Transaction } from 'sequelize';
import { NOTICE_LABELS, type NoticeKind } from '../../shared/notice-kinds';
import { appUrl } from '../config';
import { noticeRecipients, type NoticeRecipientRow } from '../queries/notices';
import { sendMail } from './send';
import { escapeHtml } from './html';

export { NOTICE_KINDS, type NoticeKind } from '../../shared/notice-kinds';

/** One person a notice goes to, as compose() sees them. */
export type NoticeRecipient = NoticeRecipientRow;

/** What compose() writes for one recipient. Never put source text in it: mail leaves the machine. */
export interface NoticeContent {
  subject: string;
  text: string;
  html: string;
}

/** A notice to send: its kind, who it is meant for, and the mail for each of them. */
export interface Notice {
  kind: NoticeKind;
  /** User ids; duplicates, deactivated users and users who turned the kind off are dropped. */
  recipientIds: string[];
  compose: (user: NoticeRecipient) => NoticeContent;
}

/** Where a user turns notices off. */
export function noticeSettingsLink(): string {
  return appUrl('/account#notices');
}

/** The line under every notice: why it came and where to turn it off. */
function footer(kind: NoticeKind): { text: string; html: string } {
  const link = noticeSettingsLink();
  const label = NOTICE_LABELS[kind].label;
  return {
    text: `\n\n--\nYou receive this notice ("${label}") from Doublet. Turn it off in your account settings: ${link}`,
    html: `<hr><p style="color:#555;font-size:small">You receive this notice (“${escapeHtml(label)}”) from Doublet. <a href="${escapeHtml(link)}">Turn it off in your account settings</a>.</p>`,
  };
}

/**
 * Queues one notice mail to each recipient who still wants this kind: recipients who turned the
 * kind off in their account settings, deactivated users and duplicates are dropped first. Each mail
 * is written by `compose` for its recipient, carries a footer that says how to turn the kind off,
 * and is filed under the recipient's organisation. With `transaction`, the recipients are read and
 * the mails queued inside it, so they go out only if it commits. Resolves with the users mailed.
 *
 * @example
 * await sendNotice({ kind: 'budgetExceeded', recipientIds: leadIds, compose: (user) => budgetMail(user, snapshot) });
 */
export async function sendNotice(notice: Notice, transaction?: Transaction): Promise<NoticeRecipient[]> {
  const recipients = await noticeRecipients(notice.kind, notice.recipientIds, transaction);
  const end = footer(notice.kind);
  for (const user of recipients) {
    const content = notice.compose(user);
    await sendMail(
      { to: user.email, subject: content.subject, text: content.text + end.text, html: content.html + end.html, organisationId: user.organisationId },
      { transaction },
    );
  }
  return recipients;
}

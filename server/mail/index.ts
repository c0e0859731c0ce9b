/**
 * Mail: sendMail() queues a message (the `mail.send` job delivers it over SMTP, with retries), the
 * local catcher receives and stores what `npm start` sends when no SMTP_URL is set, and the
 * templates write the messages.
 */
export { sendMail } from './send';
export { deliver, mailTarget, newMessageId, setMailTarget, ORGANISATION_HEADER, type MailMessage, type MailTarget, type OutgoingMail } from './transport';
export { startMailCatcher, CATCHER_MAX_BYTES, CATCHER_MAX_RECIPIENTS, type MailCatcher } from './catcher';
export { storeReceivedMail, OUTBOX_LIMIT } from './store';
export { invitationMail } from './templates';
export { taskAssignedNotice, taskAutoChangedNotice, type TaskNoticeFacts } from './task-notices';
export { sendNotice, noticeSettingsLink, NOTICE_KINDS, type Notice, type NoticeContent, type NoticeKind, type NoticeRecipient } from './notices';

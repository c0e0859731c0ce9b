import type { Transaction } from 'sequelize';
import { send } from '../jobs/queue';
import { newMessageId, type MailMessage } from './transport';

/**
 * Queues one e-mail: a `mail.send` job delivers it over SMTP and retries while the mail server is
 * down, so mail is delayed, never lost. Resolves with the Message-ID once the job is stored.
 * Called after a write has committed, it sends no mail for a write that did not happen, but a
 * failure to queue leaves the write without its mail; with `transaction`, the job is stored inside
 * the caller's transaction instead, so write and mail happen both or neither.
 *
 * @example
 * await sendMail({ to: 'ana@example.test', subject: 'Hello', text: 'Hi', organisationId });
 * await sendMail(mail, { transaction });
 */
export async function sendMail(message: MailMessage, options: { transaction?: Transaction } = {}): Promise<string> {
  const messageId = newMessageId();
  await send('mail.send', { ...message, messageId }, { transaction: options.transaction });
  return messageId;
}

import { send } from '../jobs/queue';
import { newMessageId, type MailMessage } from './transport';

/**
 * Queues one e-mail: a `mail.send` job delivers it over SMTP and retries while the mail server is
 * down, so mail is delayed, never lost. Resolves with the Message-ID once the job is stored (in
 * the caller's process: after its own transaction has committed, so no mail goes out for a
 * write that did not happen).
 *
 * @example
 * await sendMail({ to: 'ana@example.test', subject: 'Hello', text: 'Hi', organisationId });
 */
export async function sendMail(message: MailMessage): Promise<string> {
  const messageId = newMessageId();
  await send('mail.send', { ...message, messageId });
  return messageId;
}

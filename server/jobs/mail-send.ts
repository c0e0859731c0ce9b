import { deliver, type OutgoingMail } from '../mail/transport';
import { defineJob } from './definition';

/**
 * `mail.send`: delivers one queued e-mail over SMTP. A mail server that is down fails the attempt;
 * pg-boss tries again after 10 s, then about twice as long each time (12 retries: roughly half a
 * day), so an outage delays mail and loses none. The Message-ID is fixed when the mail is queued,
 * so the catcher stores a message delivered twice (accepted, then the answer lost) only once.
 * A job may wait up to two days for its turn (longer than the whole retry schedule).
 */
export const mailSendJob = defineJob<OutgoingMail>({
  queue: 'mail.send',
  sendOptions: { retryLimit: 12, retryDelay: 10, retryBackoff: true, expireInSeconds: 120, retentionHours: 48 },
  workers: 2,
  handler: async (mail, job) => {
    try {
      await deliver(mail);
    } catch (error) {
      // Recipient and subject only: the body can hold a one-time link.
      if (!process.env.DOUBLET_TEST) {
        const reason = error instanceof Error ? error.message : String(error);
        console.error(`mail: "${mail.subject}" to ${mail.to} not delivered (attempt ${job.retryCount + 1}): ${reason}`);
      }
      throw error;
    }
  },
});

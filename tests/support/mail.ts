import crypto from 'node:crypto';
import type PgBoss from 'pg-boss';
import { Op } from 'sequelize';
import { afterAll, beforeAll } from 'vitest';
import { db } from '../../server/db/connection';
import { startJobs, stopJobs, type StartJobsOptions } from '../../server/jobs';
import { setMailTarget, startMailCatcher, type MailCatcher } from '../../server/mail';
import { OutboxMessage } from '../../server/models/OutboxMessage';

/** What useMail() gives a test file. */
export interface MailHarness {
  /** The file's catcher (started in beforeAll). */
  readonly catcher: MailCatcher;
  /** The file's pg-boss schema. */
  readonly schema: string;
}

/**
 * Real mail for one test file, as `npm start` runs it: a local catcher (smtp-server) on an
 * ephemeral port, delivery pointed at it, and the job queue with a worker. The queue lives in a
 * pg-boss schema of the file's own, so another file's worker (files run in parallel on one
 * database) never takes this file's mail to its catcher. Call after useDatabase().
 */
export function useMail(options: { sendOptions?: StartJobsOptions['sendOptions'] } = {}): MailHarness {
  const schema = `pgboss_test_${process.pid}_${crypto.randomBytes(3).toString('hex')}`;
  const harness = { schema } as { catcher: MailCatcher; schema: string };
  beforeAll(async () => {
    harness.catcher = await startMailCatcher({ port: 0 });
    setMailTarget({ host: harness.catcher.host, port: harness.catcher.port });
    await startJobs({
      connectionString: process.env.DATABASE_URL,
      schema,
      work: true,
      pollingIntervalSeconds: 0.5,
      sendOptions: options.sendOptions,
    });
  });
  afterAll(async () => {
    await stopJobs({ timeoutMs: 1000 });
    await harness.catcher?.stop();
    setMailTarget(undefined);
    await db().query(`drop schema if exists "${schema}" cascade`);
  });
  return harness;
}

/** Retry options that keep a test's outage short: a retry every second, no back-off. */
export const QUICK_RETRIES: PgBoss.SendOptions = { retryLimit: 30, retryDelay: 1, retryBackoff: false };

/**
 * The messages the catcher stored for an address, oldest first, once at least `count` have
 * arrived (mail goes through a job, so it lands a moment after the request that sent it).
 * Throws after `timeoutMs`.
 *
 * @example
 * const [invitation] = await mailTo(email);
 */
export async function mailTo(email: string, count = 1, timeoutMs = 15_000): Promise<OutboxMessage[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const messages = await OutboxMessage.findAll({
      where: { toAddresses: { [Op.contains]: [email.toLowerCase()] } },
      order: [['receivedAt', 'ASC']],
    });
    if (messages.length >= count) return messages;
    if (Date.now() > deadline) throw new Error(`${messages.length} of ${count} mail(s) to ${email} arrived within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/**
 * The one-time token in the `count`-th invitation mailed to an address (the newest when `count`
 * is how many were sent).
 *
 * @example
 * const token = await invitationTokenMailedTo(email);
 */
export async function invitationTokenMailedTo(email: string, count = 1): Promise<string> {
  const message = (await mailTo(email, count))[count - 1];
  const match = /\/invitations\/([A-Za-z0-9_-]{43})\b/.exec(message.text);
  if (!match) throw new Error('no invitation link in the mail');
  return match[1];
}

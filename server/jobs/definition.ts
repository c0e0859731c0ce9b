import type PgBoss from 'pg-boss';

/** What a handler learns about the job it runs, besides its data. */
export interface JobContext {
  id: string;
  /** 0 on the first attempt, 1 on the first retry… */
  retryCount: number;
}

/**
 * One kind of background job: its queue name, the retry and expiry defaults every job of the
 * queue is sent with, how many a process works at once, and the handler. A handler that throws
 * fails the attempt; pg-boss retries it (after `retryDelay`, doubled each time with
 * `retryBackoff`) until `retryLimit` is used up. Handlers may run more than once for one job (a
 * worker killed mid-job is retried when its lease, `expireInSeconds`, runs out), so they must be
 * safe to repeat.
 */
export interface JobDefinition<T extends object> {
  queue: string;
  sendOptions: PgBoss.SendOptions;
  /** Jobs of this queue one process works at the same time (default 1). */
  workers?: number;
  handler(data: T, context: JobContext): Promise<unknown>;
}

/**
 * Declares a job kind (the type parameter is the job's data).
 *
 * @example
 * export const mailSendJob = defineJob<MailMessage>({ queue: 'mail.send', sendOptions: { retryLimit: 12 }, handler });
 */
export function defineJob<T extends object>(definition: JobDefinition<T>): JobDefinition<T> {
  return definition;
}

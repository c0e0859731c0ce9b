import type { ClientBase } from 'pg';
import type PgBoss from 'pg-boss';
import type { Transaction } from 'sequelize';
import { loadConfig } from '../config';
import { connectedUrl } from '../db/connection';
import { localDatabaseUrl } from '../db/postgres';
import { jobDefinition, jobDefinitions, QUEUE_NAMES, type JobData, type QueueName } from './registry';

/** How startJobs() runs pg-boss in this process. */
export interface StartJobsOptions {
  /**
   * The database; default the one this process is connected to (so a job queued in a transaction
   * lands beside the write), else DATABASE_URL or the local cluster's database (the app's own).
   */
  connectionString?: string;
  /** PostgreSQL schema of pg-boss's tables (default DOUBLET_JOBS_SCHEMA, `pgboss`); tests use one a file. */
  schema?: string;
  /** Work every registered queue in this process (the embedded worker, or `npm run worker`). */
  work?: boolean;
  /** How often an idle worker looks for jobs (pg-boss's minimum is 0.5 s). */
  pollingIntervalSeconds?: number;
  /** Per-queue changes to the registered send options (tests shorten retry delays). */
  sendOptions?: { [Q in QueueName]?: PgBoss.SendOptions };
}

interface Running {
  boss: PgBoss;
  schema: string;
  working: boolean;
  sendOptions: { [Q in QueueName]?: PgBoss.SendOptions };
}

let running: Running | undefined;
let starting: Promise<Running> | undefined;

/**
 * Starts this process's one PgBoss (creating or upgrading its schema on first use), creates every
 * registered queue, and with `work` starts the workers. Calling it again while started is a no-op.
 *
 * @example
 * await startJobs({ work: true });
 */
export async function startJobs(options: StartJobsOptions = {}): Promise<void> {
  if (running) return;
  starting ??= open(options).finally(() => {
    starting = undefined;
  });
  running = await starting;
}

async function open(options: StartJobsOptions): Promise<Running> {
  const config = loadConfig();
  const schema = options.schema ?? config.jobsSchema;
  // imported here, not at the top: a process that never queues a job never loads pg-boss
  const { default: PgBossClass } = await import('pg-boss');
  const boss = new PgBossClass({
    connectionString: options.connectionString ?? connectedUrl() ?? config.externalDatabaseUrl ?? localDatabaseUrl(config.databaseName),
    schema,
    application_name: 'doublet-jobs',
    max: 4,
    // No cron schedules yet: skip the clock monitor and its polling.
    schedule: false,
    // How soon a job whose worker died (its lease, expireInSeconds, ran out) is failed and retried.
    maintenanceIntervalSeconds: config.jobsMaintenanceSeconds,
    // Finished jobs keep their data (a mail's body holds one-time links) for a day, not pg-boss's week.
    archiveCompletedAfterSeconds: 3600,
    deleteAfterDays: 1,
  });
  // pg-boss reports connection trouble as events; without a listener an 'error' would crash the process.
  boss.on('error', (error) => console.error(`jobs: ${error.message}`));
  await boss.start();
  for (const queue of QUEUE_NAMES) await boss.createQueue(queue);
  if (options.work) {
    for (const definition of await jobDefinitions()) {
      for (let i = 0; i < (definition.workers ?? 1); i++) {
        await boss.work<object>(
          definition.queue,
          { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2 },
          async ([job]) => definition.handler(job.data, { id: job.id, retryCount: job.retryCount }),
        );
      }
    }
  }
  return { boss, schema, working: Boolean(options.work), sendOptions: options.sendOptions ?? {} };
}

/**
 * Stops the workers, lets running jobs finish for up to `timeoutMs` (what is still running then is
 * failed and retried later by any worker), and closes the queue's connections. Safe to call when
 * not started; the drain on SIGTERM calls it.
 *
 * @example
 * process.on('SIGTERM', () => stopJobs().then(() => process.exit(0)));
 */
export async function stopJobs(options: { timeoutMs?: number } = {}): Promise<void> {
  if (starting) await starting.catch(() => undefined);
  const current = running;
  running = undefined;
  if (!current) return;
  await current.boss.stop({ graceful: true, wait: true, timeout: options.timeoutMs ?? 10_000 });
}

/** Options of send(): pg-boss's, plus the caller's transaction. */
export type SendJobOptions = Omit<PgBoss.SendOptions, 'db'> & {
  /**
   * Store the job in this (Sequelize) transaction: it exists only if the transaction commits, so
   * a write and the job that follows it up happen both or neither.
   */
  transaction?: Transaction;
};

/**
 * pg-boss's database hook over the transaction's own connection. Sequelize keeps the pg client a
 * transaction runs on as `transaction.connection` (not in its typings).
 */
function inTransaction(transaction: Transaction): PgBoss.Db {
  const client = (transaction as unknown as { connection?: ClientBase }).connection;
  if (!client) throw new Error('send(): the transaction has no connection (has it finished?)');
  return { executeSql: (text, values) => client.query(text, values) };
}

/**
 * Puts a job on a registered queue with that queue's retry and expiry options (the caller's
 * options win) and returns its id. Any process that works the queue runs it. In a process that
 * has not called startJobs() (a command-line tool, a test), the first send opens the queue with
 * the configured defaults, for sending only.
 *
 * @example
 * await send('mail.send', { to, subject, text, messageId });
 * await send('mail.send', mail, { transaction }); // stored only if the transaction commits
 */
export async function send<Q extends QueueName>(queue: Q, data: JobData<Q>, options: SendJobOptions = {}): Promise<string> {
  if (!running) await startJobs();
  const current = running!;
  const { transaction, ...sendOptions } = options;
  const id = await current.boss.send(queue, data as object, {
    ...(await jobDefinition(queue)).sendOptions,
    ...current.sendOptions[queue],
    ...sendOptions,
    ...(transaction ? { db: inTransaction(transaction) } : {}),
  });
  if (!id) throw new Error(`pg-boss refused a job on ${queue}`);
  return id;
}

/**
 * How many jobs of a queue are not done yet (waiting for an attempt or a retry, or in one), among
 * those whose data contains `match` (a JSON containment test). Opens the queue like send() when
 * needed.
 *
 * @example
 * await waitingJobs('mail.send', { organisationId }) // mails not yet accepted by the mail server
 */
export async function waitingJobs(queue: QueueName, match: Record<string, string | number>): Promise<number> {
  if (!running) await startJobs();
  const current = running!;
  // The schema is a checked SQL name (config) or a test's own; everything else is a parameter.
  const { rows } = await current.boss
    .getDb()
    .executeSql(
      `select count(*)::int as n from "${current.schema}".job where name = $1 and state in ('created', 'retry', 'active') and data @> $2::jsonb`,
      [queue, JSON.stringify(match)],
    );
  return (rows[0] as { n: number }).n;
}

/** The running PgBoss (tests read job states with it); throws when not started. */
export function jobQueue(): PgBoss {
  if (!running) throw new Error('The job queue is not started in this process.');
  return running.boss;
}

/** Whether this process works the queues (an embedded or stand-alone worker). */
export function isWorking(): boolean {
  return running?.working ?? false;
}

import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../../server/config';
import { db } from '../../../server/db/connection';
import { jobQueue, send, startJobs, stopJobs } from '../../../server/jobs';
import { newMessageId, sendMail, startMailCatcher, type MailCatcher } from '../../../server/mail';
import { buildOrganisation, mailTo, uniqueEmail, useDatabase } from '../../support';

useDatabase();

const SCHEMA = `pgboss_test_worker_${process.pid}`;
let catcher: MailCatcher;
let worker: ChildProcess | undefined;
let workerOutput = '';

/** Resolves when the worker prints a line matching `pattern`; rejects after `ms`. */
function workerSays(pattern: RegExp, ms: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`worker did not print ${pattern} within ${ms} ms:\n${workerOutput}`)), ms);
    const check = () => {
      if (pattern.test(workerOutput)) {
        clearTimeout(timer);
        resolve();
      } else setTimeout(check, 100);
    };
    check();
  });
}

beforeAll(async () => {
  catcher = await startMailCatcher({ port: 0 });
  // This process only queues; the worker process below is the only one working SCHEMA's queues.
  await startJobs({ connectionString: process.env.DATABASE_URL, schema: SCHEMA });
});

afterAll(async () => {
  if (worker && worker.exitCode === null) worker.kill('SIGKILL');
  await stopJobs({ timeoutMs: 1000 });
  await catcher?.stop();
  await db().query(`drop schema if exists "${SCHEMA}" cascade`);
});

describe('npm run worker (server/worker.ts)', () => {
  it('works the queue from a process of its own against the same database, and stops on SIGTERM', async () => {
    worker = spawn(process.execPath, ['--import', 'tsx', path.join(projectRoot, 'server', 'worker.ts')], {
      cwd: projectRoot,
      // Without DOUBLET_TEST the worker logs each delivery as it would in production.
      env: { ...process.env, DOUBLET_TEST: '', DOUBLET_JOBS_SCHEMA: SCHEMA, DOUBLET_SMTP_PORT: String(catcher.port), SMTP_URL: '' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    worker.stdout!.on('data', (d: Buffer) => (workerOutput += d.toString()));
    worker.stderr!.on('data', (d: Buffer) => (workerOutput += d.toString()));
    await workerSays(/is working: mail\.send/, 30_000);

    const organisation = await buildOrganisation();
    const to = uniqueEmail('from-worker');
    await sendMail({ to, subject: 'Queued here, sent there', text: 'Delivered by the worker process.', organisationId: organisation.id });
    const [mail] = await mailTo(to, 1, 20_000);
    expect(mail).toMatchObject({ subject: 'Queued here, sent there', organisationId: organisation.id });

    const exited = new Promise<number | null>((resolve) => worker!.once('exit', (code) => resolve(code)));
    worker.kill('SIGTERM');
    expect(await exited).toBe(0);
    expect(workerOutput).toMatch(/SIGTERM: finishing the jobs in hand/);
    // Only the recipient and subject are ever printed, never the body.
    expect(workerOutput).toContain(`mail: "Queued here, sent there" to ${to}`);
    expect(workerOutput).not.toContain('Delivered by the worker process.');
  }, 60_000);

  it('gives each job the retry options of its queue', async () => {
    const id = await send('mail.send', { to: uniqueEmail(), subject: 's', text: 't', messageId: newMessageId() }, { startAfter: 3600 });
    const job = await jobQueue().getJobById('mail.send', id);
    expect(job).toMatchObject({ retryLimit: 12, retryDelay: 10, retryBackoff: true });
  });

  describe('edge cases', () => {
    it('opens the queue on the first send in a process that never started it (sending only)', async () => {
      await stopJobs();
      process.env.DOUBLET_JOBS_SCHEMA = SCHEMA;
      try {
        await sendMail({ to: uniqueEmail(), subject: 'Queued lazily', text: 't' });
      } finally {
        delete process.env.DOUBLET_JOBS_SCHEMA;
      }
      const [rows] = await db().query(`select count(*)::int as n from "${SCHEMA}".job where name = 'mail.send' and data->>'subject' = 'Queued lazily'`);
      expect((rows as { n: number }[])[0].n).toBe(1);
    });
  });
});

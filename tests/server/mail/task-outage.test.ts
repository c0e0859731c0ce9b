import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import { db } from '../../../server/db/connection';
import { startJobs, stopJobs } from '../../../server/jobs';
import { setMailTarget, startMailCatcher, type MailCatcher } from '../../../server/mail';
import { OutboxMessage } from '../../../server/models/OutboxMessage';
import { buildRepository, buildTeam, loadFolder, mailTo, QUICK_RETRIES, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

const SCHEMA = `pgboss_test_task_outage_${process.pid}`;
let app: Express;
let catcher: MailCatcher | undefined;
let port: number;

beforeAll(async () => {
  app = createApp();
  catcher = await startMailCatcher({ port: 0 });
  port = catcher.port;
  setMailTarget({ host: '127.0.0.1', port });
  // Retries every second instead of the production back-off, so the outage takes seconds.
  await startJobs({ connectionString: process.env.DATABASE_URL, schema: SCHEMA, work: true, pollingIntervalSeconds: 0.5, sendOptions: { 'mail.send': QUICK_RETRIES } });
});

afterAll(async () => {
  await stopJobs({ timeoutMs: 1000 });
  await catcher?.stop();
  setMailTarget(undefined);
  await db().query(`drop schema if exists "${SCHEMA}" cascade`);
});

/** The mail.send jobs of this file's queue, by state. */
async function jobStates(): Promise<Record<string, number>> {
  const [rows] = await db().query(`select state, count(*)::int as n from "${SCHEMA}".job where name = 'mail.send' group by state`);
  return Object.fromEntries((rows as { state: string; n: number }[]).map((r) => [r.state, r.n]));
}

describe('a task assigned while the mail server is down', () => {
  it('is mailed to the assignee once the mail server is back', { timeout: 120_000 }, async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
    const [cloneClass] = await select<{ id: number }>(undefined, 'select id from clone_classes where snapshot_id = $1 order by ordinal limit 1', [snapshotId]);
    const lead = await signedInAgent(app, team.lead);

    await catcher!.stop();
    catcher = undefined;
    await lead.post('/api/tasks').send({ cloneClassId: cloneClass.id, assigneeId: team.engineer.id, title: 'Merge the copies' }).expect(201);

    // At least one delivery attempt fails while nothing listens: the job waits for a retry.
    const deadline = Date.now() + 15_000;
    while (!((await jobStates()).retry > 0)) {
      if (Date.now() > deadline) throw new Error(`no failed attempt within 15 s: ${JSON.stringify(await jobStates())}`);
      await new Promise((r) => setTimeout(r, 200));
    }
    expect(await OutboxMessage.count({ where: { organisationId: team.organisation.id } })).toBe(0);

    catcher = await startMailCatcher({ port });
    const [mail] = await mailTo(team.engineer.email, 1, 20_000);
    expect(mail.subject).toBe('Task assigned to you: Merge the copies');
    expect(mail.organisationId).toBe(team.organisation.id);
  });
});

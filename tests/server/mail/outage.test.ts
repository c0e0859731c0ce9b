import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { db } from '../../../server/db/connection';
import { setMailTarget, startMailCatcher, type MailCatcher } from '../../../server/mail';
import { OutboxMessage } from '../../../server/models/OutboxMessage';
import { startJobs, stopJobs } from '../../../server/jobs';
import { buildTeam, mailTo, QUICK_RETRIES, signedInAgent, uniqueEmail, useDatabase } from '../../support';

useDatabase();

const SCHEMA = `pgboss_test_outage_${process.pid}`;
let app: Express;
let catcher: MailCatcher | undefined;
let port: number;

beforeAll(async () => {
  app = createApp();
  catcher = await startMailCatcher({ port: 0 });
  port = catcher.port;
  setMailTarget({ host: '127.0.0.1', port });
  // Retries every second instead of the production back-off, so the outage test takes seconds.
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

describe('mail while the mail server is down', () => {
  it('is retried by its job and arrives once the server is back on the same port', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);

    await catcher!.stop();
    catcher = undefined;
    const email = uniqueEmail('during-outage');
    await admin.post('/api/invitations').send({ email, name: 'Rhea Castellan', role: 'viewer' }).expect(201);

    // At least one delivery attempt fails while nothing listens: the job waits for a retry.
    const deadline = Date.now() + 15_000;
    while (!((await jobStates()).retry > 0)) {
      if (Date.now() > deadline) throw new Error(`no failed attempt within 15 s: ${JSON.stringify(await jobStates())}`);
      await new Promise((r) => setTimeout(r, 200));
    }
    expect(await OutboxMessage.count({ where: { organisationId: team.organisation.id } })).toBe(0);
    // The admin's Outbox says a message is waiting for the mail server.
    expect((await admin.get('/api/outbox').expect(200)).body).toMatchObject({ messages: [], waiting: 1 });

    catcher = await startMailCatcher({ port });
    const [mail] = await mailTo(email, 1, 20_000);
    expect(mail.organisationId).toBe(team.organisation.id);
    expect(mail.text).toMatch(/\/invitations\/[A-Za-z0-9_-]{43}/);
    // The catcher stores before it answers 250, so the job completes a moment after the mail is stored.
    const settled = Date.now() + 10_000;
    while ((await jobStates()).completed !== 1) {
      if (Date.now() > settled) throw new Error(`the job did not complete: ${JSON.stringify(await jobStates())}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    const list = await admin.get('/api/outbox').expect(200);
    expect(list.body.messages.map((m: { to: string }) => m.to)).toEqual([email]);
    expect(list.body.waiting).toBe(0);
  }, 60_000);
});

import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import { db } from '../../../server/db/connection';
import { startMailCatcher, type MailCatcher } from '../../../server/mail';
import { OutboxMessage } from '../../../server/models/OutboxMessage';
import { buildRepository, buildTeam, loadFolder, mailTo, QUICK_RETRIES, RELEASES, signedInAgent, useDatabase, useMail } from '../../support';

useDatabase();
// Retries every second instead of the production back-off, so the outage takes seconds.
const mail = useMail({ sendOptions: { 'mail.send': QUICK_RETRIES } });

let app: Express;
let restarted: MailCatcher | undefined;
beforeAll(() => {
  app = createApp();
});
afterAll(async () => {
  await restarted?.stop();
});

/** This file's mail.send jobs to an address, by state. */
async function jobStates(email: string): Promise<Record<string, number>> {
  const [rows] = await db().query(`select state, count(*)::int as n from "${mail.schema}".job where name = 'mail.send' and data->>'to' = $1 group by state`, {
    bind: [email],
  });
  return Object.fromEntries((rows as { state: string; n: number }[]).map((r) => [r.state, r.n]));
}

/** Stops whichever catcher is listening now (the file's, or one a test restarted); gives its port. */
async function stopCatcher(): Promise<number> {
  const current = restarted ?? mail.catcher;
  await current.stop();
  restarted = undefined;
  return current.port;
}

async function until(what: string, check: () => Promise<boolean>, timeoutMs = 20_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`not within ${timeoutMs} ms: ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('a notice while the mail server is down', () => {
  it('waits in its job and arrives once the catcher is back on the same port', { timeout: 120_000 }, async () => {
    const team = await buildTeam();
    const port = await stopCatcher();

    // A load over its budget queues a budget notice to the lead.
    const repository = await buildRepository({ organisationId: team.organisation.id, name: 'wagon-ledger', cloneBudget: 0.001 });
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    await until('a failed delivery attempt', async () => ((await jobStates(team.lead.email)).retry ?? 0) > 0);
    expect(await OutboxMessage.count({ where: { organisationId: team.organisation.id } })).toBe(0);
    const admin = await signedInAgent(app, team.admin);
    // Two notices wait: the lead's and the admin's.
    expect((await admin.get('/api/outbox').expect(200)).body).toMatchObject({ messages: [], waiting: 2 });

    restarted = await startMailCatcher({ port });
    const [notice] = await mailTo(team.lead.email, 1, 30_000);
    expect(notice.subject).toMatch(/^wagon-ledger 2026\.09 is over its clone budget/);
    expect(notice.text).toContain(`/snapshots/${snapshotId}`);
    await until('the job completed', async () => (await jobStates(team.lead.email)).completed === 1);
    expect(await mailTo(team.lead.email)).toHaveLength(1);
  });
});

describe('a task assigned while the mail server is down', () => {
  it('is mailed to the assignee once the mail server is back', { timeout: 120_000 }, async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
    const [cloneClass] = await select<{ id: number }>(undefined, 'select id from clone_classes where snapshot_id = $1 order by ordinal limit 1', [snapshotId]);
    const lead = await signedInAgent(app, team.lead);

    const port = await stopCatcher();
    await lead.post('/api/tasks').send({ cloneClassId: cloneClass.id, assigneeId: team.engineer.id, title: 'Merge the copies' }).expect(201);
    await until('a failed delivery attempt', async () => ((await jobStates(team.engineer.email)).retry ?? 0) > 0);
    expect(await OutboxMessage.count({ where: { organisationId: team.organisation.id } })).toBe(0);

    restarted = await startMailCatcher({ port });
    const [assigned] = await mailTo(team.engineer.email, 1, 30_000);
    expect(assigned.subject).toBe('Task assigned to you: Merge the copies');
    expect(assigned.organisationId).toBe(team.organisation.id);
  });
});

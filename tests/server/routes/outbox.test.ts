import crypto from 'node:crypto';
import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { OutboxMessage } from '../../../server/models/OutboxMessage';
import type { Organisation } from '../../../server/models/Organisation';
import { anonymousAgent, buildTeam, signedInAgent, uniqueEmail, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});

/** A stored message as the catcher would have stored it, received `minutesAgo` ago. */
function storeMessage(organisation: Organisation | null, subject: string, minutesAgo: number) {
  return OutboxMessage.create({
    organisationId: organisation?.id ?? null,
    messageId: `<${crypto.randomUUID()}@doublet.test>`,
    fromAddress: 'Doublet <doublet@localhost>',
    toAddresses: [uniqueEmail('to')],
    subject,
    text: `Body of ${subject}`,
    html: `<p>Body of ${subject}</p>`,
    sizeBytes: 400,
    receivedAt: new Date(Date.now() - minutesAgo * 60_000),
  });
}

describe('GET /api/outbox', () => {
  it('lists the organisation’s mail newest first, a page at a time, without bodies', async () => {
    const team = await buildTeam();
    for (const [subject, ago] of [['oldest', 30], ['newest', 1], ['middle', 10]] as const) await storeMessage(team.organisation, subject, ago);
    const admin = await signedInAgent(app, team.admin);

    const first = await admin.get('/api/outbox?pageSize=2').expect(200);
    expect(first.body).toMatchObject({ total: 3, page: 1, pageSize: 2, waiting: 0 });
    expect(first.body.messages.map((m: { subject: string }) => m.subject)).toEqual(['newest', 'middle']);
    expect(Object.keys(first.body.messages[0]).sort()).toEqual(['from', 'id', 'receivedAt', 'sizeBytes', 'subject', 'to']);
    const second = await admin.get('/api/outbox?pageSize=2&page=2').expect(200);
    expect(second.body.messages.map((m: { subject: string }) => m.subject)).toEqual(['oldest']);
  });

  it('shows an admin only their own organisation’s mail', async () => {
    const ours = await buildTeam();
    const theirs = await buildTeam();
    await storeMessage(theirs.organisation, 'theirs', 1);
    await storeMessage(null, 'nobody’s', 1);
    const admin = await signedInAgent(app, ours.admin);
    expect((await admin.get('/api/outbox').expect(200)).body).toMatchObject({ messages: [], total: 0 });
  });

  it('answers 400 naming the field for a bad page or page size', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    expect((await admin.get('/api/outbox?pageSize=101').expect(400)).body.error.field).toBe('pageSize');
    expect((await admin.get('/api/outbox?page=0').expect(400)).body.error.field).toBe('page');
    expect((await admin.get('/api/outbox?page=two').expect(400)).body.error.field).toBe('page');
  });

  it('answers 401 to anonymous callers and 403 to every role below admin', async () => {
    const team = await buildTeam();
    await (await anonymousAgent(app)).get('/api/outbox').expect(401);
    for (const role of ['lead', 'engineer', 'viewer'] as const) {
      const res = await (await signedInAgent(app, team[role])).get('/api/outbox').expect(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });
});

describe('GET /api/outbox/:id', () => {
  it('shows one message with its text and HTML', async () => {
    const team = await buildTeam();
    const stored = await storeMessage(team.organisation, 'Snapshot over budget', 2);
    const admin = await signedInAgent(app, team.admin);
    const res = await admin.get(`/api/outbox/${stored.id}`).expect(200);
    expect(res.body.message).toMatchObject({
      id: stored.id,
      subject: 'Snapshot over budget',
      to: stored.toAddresses[0],
      text: 'Body of Snapshot over budget',
      html: '<p>Body of Snapshot over budget</p>',
    });
  });

  it('answers 404 for another organisation’s message, 400 for a malformed id', async () => {
    const ours = await buildTeam();
    const theirs = await buildTeam();
    const stored = await storeMessage(theirs.organisation, 'theirs', 1);
    const admin = await signedInAgent(app, ours.admin);
    await admin.get(`/api/outbox/${stored.id}`).expect(404);
    expect((await admin.get('/api/outbox/not-a-uuid').expect(400)).body.error.field).toBe('id');
  });

  it('answers 401 to anonymous callers and 403 to a lead', async () => {
    const team = await buildTeam();
    const stored = await storeMessage(team.organisation, 'x', 1);
    await (await anonymousAgent(app)).get(`/api/outbox/${stored.id}`).expect(401);
    await (await signedInAgent(app, team.lead)).get(`/api/outbox/${stored.id}`).expect(403);
  });
});

import crypto from 'node:crypto';
import type { Express } from 'express';
import nodemailer, { type Transporter } from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { CATCHER_MAX_BYTES, CATCHER_MAX_RECIPIENTS, ORGANISATION_HEADER, startMailCatcher, type MailCatcher } from '../../../server/mail';
import { OutboxMessage } from '../../../server/models/OutboxMessage';
import { buildTeam, mailTo, signedInAgent, uniqueEmail, useDatabase } from '../../support';

useDatabase();

let app: Express;
let catcher: MailCatcher;
let smtp: Transporter;

beforeAll(async () => {
  app = createApp();
  catcher = await startMailCatcher({ port: 0 });
  // A plain nodemailer client, as any program on the machine would send: nothing of Doublet's queue.
  smtp = nodemailer.createTransport({ host: '127.0.0.1', port: catcher.port, secure: false, ignoreTLS: true });
});

afterAll(async () => {
  smtp?.close();
  await catcher?.stop();
});

describe('the local mail catcher', () => {
  it('stores a message sent over SMTP, and its organisation’s admin reads it through GET /api/outbox', async () => {
    const team = await buildTeam();
    const to = uniqueEmail('dispatch');
    const info = await smtp.sendMail({
      from: 'Yard office <yard@brackenfold.example>',
      to,
      subject: 'Wagon 4471 inspection due',
      text: 'Inspection of wagon 4471 is due on Friday.',
      html: '<p>Inspection of wagon <b>4471</b> is due on Friday.</p>',
      headers: { [ORGANISATION_HEADER]: team.organisation.id },
    });
    expect(info.response).toMatch(/^250/);

    const admin = await signedInAgent(app, team.admin);
    const list = await admin.get('/api/outbox').expect(200);
    expect(list.body.total).toBe(1);
    expect(list.body.messages[0]).toMatchObject({ to, subject: 'Wagon 4471 inspection due' });
    expect(list.body.messages[0].from).toContain('<yard@brackenfold.example>');
    expect(list.body.messages[0]).not.toHaveProperty('text');
    const one = await admin.get(`/api/outbox/${list.body.messages[0].id}`).expect(200);
    expect(one.body.message.text.trim()).toBe('Inspection of wagon 4471 is due on Friday.');
    expect(one.body.message.html).toContain('<b>4471</b>');
  });

  it('files a message without the header under the organisation of a recipient who has an account', async () => {
    const team = await buildTeam();
    await smtp.sendMail({ from: 'ops@brackenfold.example', to: team.engineer.email, subject: 'Shift change', text: 'Shift starts at six.' });
    const [stored] = await mailTo(team.engineer.email);
    expect(stored.organisationId).toBe(team.organisation.id);
  });

  it('stores a message for an address nobody has, with no organisation: no admin sees it', async () => {
    const to = uniqueEmail('stranger');
    await smtp.sendMail({ from: 'ops@brackenfold.example', to, subject: 'Nobody’s', text: 'x' });
    const [stored] = await mailTo(to);
    expect(stored.organisationId).toBeNull();
  });

  it('keeps one copy of a message delivered twice with the same Message-ID (a retried delivery)', async () => {
    const to = uniqueEmail('twice');
    const messageId = `<${crypto.randomUUID()}@doublet.test>`;
    for (let i = 0; i < 2; i++) await smtp.sendMail({ from: 'a@b.example', to, subject: 'Once', text: 'once', messageId });
    await smtp.sendMail({ from: 'a@b.example', to, subject: 'Marker', text: 'after' });
    const stored = await mailTo(to, 2);
    expect(stored.map((m) => m.subject)).toEqual(['Once', 'Marker']);
  });

  describe('edge cases', () => {
    it('refuses a message over the size limit with 552 and stores nothing', async () => {
      const to = uniqueEmail('big');
      const error = await smtp
        .sendMail({ from: 'a@b.example', to, subject: 'Too big', text: 'x'.repeat(CATCHER_MAX_BYTES + 1024) })
        .then(() => null, (e: { responseCode?: number }) => e);
      expect(error?.responseCode).toBe(552);
      expect(await OutboxMessage.count({ where: { subject: 'Too big' } })).toBe(0);
    });

    it('takes at most 100 recipients a message and refuses the rest with 452', async () => {
      const recipients = Array.from({ length: CATCHER_MAX_RECIPIENTS + 1 }, (_, i) => uniqueEmail(`crew${i}`));
      const info = await smtp.sendMail({ from: 'a@b.example', to: recipients, subject: 'Crew roster', text: 'x' });
      expect(info.rejected).toEqual([recipients[CATCHER_MAX_RECIPIENTS]]);
      const [stored] = await mailTo(recipients[0]);
      expect(stored.toAddresses).toHaveLength(CATCHER_MAX_RECIPIENTS);
    });

    it('files a message under no organisation when a recipient belongs to another one than the header names', async () => {
      const ours = await buildTeam();
      const theirs = await buildTeam();
      await smtp.sendMail({
        from: 'a@b.example',
        to: theirs.viewer.email,
        subject: 'Invitation to someone with an account elsewhere',
        text: 'x',
        headers: { [ORGANISATION_HEADER]: ours.organisation.id },
      });
      const [stored] = await mailTo(theirs.viewer.email);
      expect(stored.organisationId).toBeNull();
      expect((await (await signedInAgent(app, ours.admin)).get('/api/outbox').expect(200)).body.total).toBe(0);
      expect((await (await signedInAgent(app, theirs.admin)).get('/api/outbox').expect(200)).body.total).toBe(0);
    });

    it('ignores an organisation header that names no organisation', async () => {
      const to = uniqueEmail('forged');
      await smtp.sendMail({ from: 'a@b.example', to, subject: 'Forged', text: 'x', headers: { [ORGANISATION_HEADER]: crypto.randomUUID() } });
      const [stored] = await mailTo(to);
      expect(stored.organisationId).toBeNull();
    });

    it('says which port is taken when it cannot listen', async () => {
      await expect(startMailCatcher({ port: catcher.port })).rejects.toThrow(new RegExp(`127.0.0.1:${catcher.port}, which is in use`));
    });
  });
});

import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { db } from '../../../server/db/connection';
import { sendNotice, type NoticeRecipient } from '../../../server/mail';
import { saveNoticeSettings } from '../../../server/queries/notices';
import { buildTeam, buildUser, mailTo, signedInAgent, uniqueEmail, useDatabase, useMail } from '../../support';

useDatabase();
const mail = useMail();

/** The subjects of mail.send jobs queued to an address in this file's queue, whatever their state. */
async function queuedSubjects(email: string): Promise<string[]> {
  const [rows] = await db().query(
    `select data->>'subject' as subject from "${mail.schema}".job where name = 'mail.send' and data->>'to' = $1 order by created_on`,
    { bind: [email] },
  );
  return (rows as { subject: string }[]).map((r) => r.subject);
}

const compose = (user: NoticeRecipient) => ({
  subject: `Wagon 4471 for ${user.name}`,
  text: `Hello ${user.name}, wagon 4471 is due.`,
  html: `<p>Hello ${user.name}, wagon <b>4471</b> is due.</p>`,
});

describe('sendNotice', () => {
  it('mails each recipient once, written for them, with a footer that says where to turn the kind off', async () => {
    const team = await buildTeam();
    const sent = await sendNotice({ kind: 'budgetExceeded', recipientIds: [team.lead.id, team.admin.id, team.lead.id], compose });
    expect(sent.map((u) => u.id)).toEqual([team.lead.id, team.admin.id]);

    const [toLead] = await mailTo(team.lead.email);
    expect(toLead.subject).toBe(`Wagon 4471 for ${team.lead.name}`);
    expect(toLead.text).toContain(`Hello ${team.lead.name}, wagon 4471 is due.`);
    expect(toLead.text).toMatch(/Turn it off in your account settings: http\S+\/account#notices/);
    expect(toLead.text).toContain('Snapshot over its clone budget');
    expect(toLead.html).toContain('<b>4471</b>');
    expect(toLead.organisationId).toBe(team.organisation.id);
    expect(await mailTo(team.admin.email)).toHaveLength(1);

    // Over SMTP into the catcher, and from there to the organisation's admin through GET /api/outbox.
    const admin = await signedInAgent(createApp(), team.admin);
    const outbox = (await admin.get('/api/outbox').expect(200)).body as { messages: { to: string; subject: string }[] };
    expect(outbox.messages.map((m) => m.to).sort()).toEqual([team.admin.email, team.lead.email].sort());
    expect(outbox.messages.map((m) => m.subject)).toContain(`Wagon 4471 for ${team.lead.name}`);
  });

  it('drops recipients who turned that kind off, and only that kind', async () => {
    const team = await buildTeam();
    await saveNoticeSettings(team.lead.id, { budgetExceeded: false, classesDrifted: true });
    const sent = await sendNotice({ kind: 'budgetExceeded', recipientIds: [team.lead.id, team.engineer.id], compose });
    expect(sent.map((u) => u.id)).toEqual([team.engineer.id]);
    await sendNotice({ kind: 'classesDrifted', recipientIds: [team.lead.id], compose });

    const [drift] = await mailTo(team.lead.email);
    expect(drift.text).toContain('Drifted classes in a new snapshot');
    await mailTo(team.engineer.email);
    // The lead's budget notice was never queued.
    expect(await queuedSubjects(team.lead.email)).toEqual([drift.subject]);
  });

  it('turns a kind on again', async () => {
    const lead = await buildUser({ role: 'lead' });
    await saveNoticeSettings(lead.id, { taskAssigned: false });
    await saveNoticeSettings(lead.id, { taskAssigned: true });
    expect(await sendNotice({ kind: 'taskAssigned', recipientIds: [lead.id], compose })).toHaveLength(1);
    await mailTo(lead.email);
  });

  it('sends nothing to deactivated users or ids nobody has', async () => {
    const gone = await buildUser({ role: 'lead', deactivated: true, email: uniqueEmail('gone') });
    const sent = await sendNotice({ kind: 'budgetExceeded', recipientIds: [gone.id, '00000000-0000-4000-8000-000000000000'], compose });
    expect(sent).toEqual([]);
    expect(await sendNotice({ kind: 'budgetExceeded', recipientIds: [], compose })).toEqual([]);
  });

  it('queues inside the caller’s transaction: nothing goes out when it rolls back', async () => {
    const team = await buildTeam();
    const rolledBack = db().transaction(async (transaction) => {
      const sent = await sendNotice({ kind: 'taskAssigned', recipientIds: [team.viewer.id], compose: () => ({ subject: 'Rolled back', text: 'x', html: '<p>x</p>' }) }, transaction);
      expect(sent).toHaveLength(1);
      throw new Error('roll back');
    });
    await expect(rolledBack).rejects.toThrow('roll back');
    await db().transaction((transaction) =>
      sendNotice({ kind: 'taskAssigned', recipientIds: [team.viewer.id], compose: () => ({ subject: 'Committed', text: 'y', html: '<p>y</p>' }) }, transaction),
    );
    const [committed] = await mailTo(team.viewer.email);
    expect(committed.subject).toBe('Committed');
    // The rolled-back mail's job went with its transaction.
    expect(await queuedSubjects(team.viewer.email)).toEqual(['Committed']);
  });
});

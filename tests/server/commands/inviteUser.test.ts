import { describe, expect, it } from 'vitest';
import { inviteUser } from '../../../server/commands/inviteUser';
import { db } from '../../../server/db/connection';
import { Invitation } from '../../../server/models/Invitation';
import { buildTeam, invitationTokenMailedTo, uniqueEmail, useDatabase, useMail } from '../../support';

useDatabase();
const mail = useMail();

/** mail.send jobs queued to an address in this file's queue, whatever their state. */
async function queuedTo(email: string): Promise<number> {
  const [rows] = await db().query(`select count(*)::int as n from "${mail.schema}".job where name = 'mail.send' and data->>'to' = $1`, { bind: [email] });
  return (rows as { n: number }[])[0].n;
}

describe('inviteUser and its mail', () => {
  it('queues the mail with the invitation: a committed invitation sends its link', async () => {
    const { admin } = await buildTeam();
    const email = uniqueEmail('committed');
    await db().transaction((transaction) => inviteUser({ actor: admin, invitee: { email, name: 'Orla Fenwick', role: 'viewer' }, transaction }));
    expect(await invitationTokenMailedTo(email)).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(await queuedTo(email)).toBe(1);
  });

  it('sends nothing when the caller’s transaction rolls back after the invitation was written', async () => {
    const { admin } = await buildTeam();
    const email = uniqueEmail('rolled-back');
    const attempt = db().transaction(async (transaction) => {
      await inviteUser({ actor: admin, invitee: { email, name: 'Piet Dagger', role: 'engineer' }, transaction });
      // Inside the transaction the job exists…
      const [rows] = await db().query(`select count(*)::int as n from "${mail.schema}".job where data->>'to' = $1`, { bind: [email], transaction });
      expect((rows as { n: number }[])[0].n).toBe(1);
      throw new Error('the caller gave up');
    });
    await expect(attempt).rejects.toThrow('the caller gave up');
    // …and went with it: neither the invitation nor its mail is left.
    expect(await Invitation.count({ where: { email } })).toBe(0);
    expect(await queuedTo(email)).toBe(0);
  });

  it('queues nothing for an invitation that is refused', async () => {
    const team = await buildTeam();
    await expect(inviteUser({ actor: team.admin, invitee: { email: team.viewer.email, name: 'Again', role: 'viewer' } })).rejects.toThrow(/already has an account/);
    expect(await queuedTo(team.viewer.email)).toBe(0);
  });
});

import { describe, expect, it } from 'vitest';
import { acceptInvitation } from '../../../server/commands/acceptInvitation';
import { inviteUser } from '../../../server/commands/inviteUser';
import { Invitation } from '../../../server/models/Invitation';
import { buildUser, invitationTokenMailedTo, uniqueEmail, useDatabase, useMail } from '../../support';

useDatabase();
useMail();

/** The token of the one invitation mailed to the address, from the catcher's outbox. */
const lastToken = (email: string) => invitationTokenMailedTo(email);

describe('acceptInvitation', () => {
  it('stores only the hash of the token', async () => {
    const admin = await buildUser({ role: 'admin' });
    const email = uniqueEmail();
    const invitation = await inviteUser({ actor: admin, invitee: { email, name: 'Kit', role: 'viewer' } });
    const token = await lastToken(email);
    const stored = await Invitation.findByPk(invitation.id);
    expect(stored!.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored!.tokenHash).not.toContain(token);
  });

  describe('edge cases', () => {
    it('creates one account when the same link is accepted twice at once', async () => {
      const admin = await buildUser({ role: 'admin' });
      const email = uniqueEmail();
      await inviteUser({ actor: admin, invitee: { email, name: 'Twin', role: 'engineer' } });
      const token = await lastToken(email);
      const results = await Promise.allSettled([
        acceptInvitation({ token, name: 'Twin', password: 'first-click-password' }),
        acceptInvitation({ token, name: 'Twin', password: 'second-click-password' }),
      ]);
      expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
      const failure = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
      expect(failure.reason.status).toBe(404);
    });

    it('refuses an expired link', async () => {
      const admin = await buildUser({ role: 'admin' });
      const email = uniqueEmail();
      const invitation = await inviteUser({ actor: admin, invitee: { email, name: 'Late', role: 'viewer' } });
      await invitation.update({ expiresAt: new Date(Date.now() - 1000) });
      await expect(acceptInvitation({ token: await lastToken(email), name: 'Late', password: 'too-late-password' })).rejects.toMatchObject({
        status: 404,
      });
    });
  });
});

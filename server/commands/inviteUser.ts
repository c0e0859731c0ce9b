import { Op, type Transaction } from 'sequelize';
import type { InviteUserInput } from '../../shared/api/invitations';
import { ROLE_LABELS } from '../../shared/roles';
import { hashToken, oneTimeToken } from '../auth/tokens';
import { appUrl } from '../config';
import { db } from '../db/connection';
import { ConflictError } from '../errors';
import { invitationMail, sendMail } from '../mail';
import { Invitation } from '../models/Invitation';
import { Organisation } from '../models/Organisation';
import { User } from '../models/User';

/** How long an invitation link works. */
export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

/** The client route that opens an invitation link. */
export function invitationLink(token: string): string {
  return appUrl(`/invitations/${token}`);
}

/**
 * Invites someone to the actor's organisation: stores the invitation (only the token's hash),
 * retires earlier pending invitations to the same address, and mails the one-time link. The mail's
 * job is queued in the same transaction (the caller's, when given): a rolled-back invitation never
 * sends a link that does not work, and a committed one always sends its mail.
 *
 * An address that already has an account in another organisation gets the same answer as any
 * other (the admin must not learn who has an account elsewhere): the invitation is stored and
 * listed as pending, and the mail, which only the address's owner reads, says that the address
 * already has an account (one address belongs to one organisation) instead of holding a link.
 */
export async function inviteUser(input: {
  actor: User;
  invitee: InviteUserInput;
  transaction?: Transaction;
}): Promise<Invitation> {
  const { actor, invitee } = input;
  const token = oneTimeToken();
  const now = new Date();

  const write = async (transaction: Transaction) => {
    const existing = await User.findOne({ where: { email: invitee.email }, transaction });
    // Someone of the admin's own organisation: the admin sees them in the user list anyway.
    if (existing?.organisationId === actor.organisationId) {
      throw new ConflictError('Someone in your organisation already has an account with this e-mail address.', 'email');
    }
    await Invitation.update(
      { expiresAt: now },
      {
        where: { organisationId: actor.organisationId, email: invitee.email, acceptedAt: null, expiresAt: { [Op.gt]: now } },
        transaction,
      },
    );
    const invitation = await Invitation.create(
      {
        organisationId: actor.organisationId,
        invitedById: actor.id,
        email: invitee.email,
        name: invitee.name,
        role: invitee.role,
        tokenHash: hashToken(token),
        expiresAt: new Date(now.getTime() + INVITATION_TTL_MS),
      },
      { transaction },
    );
    const organisation = await Organisation.findByPk(actor.organisationId, { transaction, rejectOnEmpty: true });
    // Queued in the same transaction: a rolled-back invitation sends nothing, a committed one always sends.
    await sendMail(
      {
        organisationId: invitation.organisationId,
        ...invitationMail({
          to: invitation.email,
          inviteeName: invitation.name,
          inviterName: actor.name,
          organisationName: organisation.name,
          roleLabel: ROLE_LABELS[invitation.role],
          link: invitationLink(token),
          expiresAt: invitation.expiresAt,
          hasAccountElsewhere: existing !== null,
          signInLink: appUrl('/sign-in'),
        }),
      },
      { transaction },
    );
    return invitation;
  };

  return input.transaction ? write(input.transaction) : db().transaction(write);
}

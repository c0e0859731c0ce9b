import type { Transaction } from 'sequelize';
import type { AcceptInvitationInput } from '../../shared/api/invitations';
import { hashPassword } from '../auth/passwords';
import { hashToken } from '../auth/tokens';
import { db } from '../db/connection';
import { ConflictError, NotFoundError } from '../errors';
import { Invitation } from '../models/Invitation';
import { User } from '../models/User';

/** 404 for an unknown, used or expired link: the failure the sign-in limits count for invitation links. */
export class UnusableInvitationError extends NotFoundError {
  constructor() {
    super('Invitation link (it may be used or expired)');
  }
}

/**
 * The usable invitation behind a one-time token, or a 404 (unknown, used, or expired: the answer
 * is the same so a link reveals nothing once it is spent).
 */
export async function findUsableInvitation(token: string, transaction?: Transaction): Promise<Invitation> {
  const invitation = await Invitation.findOne({
    where: { tokenHash: hashToken(token) },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!invitation || !invitation.isUsable()) throw new UnusableInvitationError();
  return invitation;
}

/**
 * Accepts an invitation: creates the user with the invited role and the chosen password, and
 * spends the link. The invitation row is locked, so two clicks cannot create two accounts.
 */
export async function acceptInvitation(input: AcceptInvitationInput & { token: string; transaction?: Transaction }): Promise<User> {
  const passwordHash = await hashPassword(input.password);
  const write = async (transaction: Transaction) => {
    const invitation = await findUsableInvitation(input.token, transaction);
    if (await User.findOne({ where: { email: invitation.email }, transaction })) {
      throw new ConflictError('Someone with this e-mail address already has an account.', 'email');
    }
    const user = await User.create(
      {
        organisationId: invitation.organisationId,
        email: invitation.email,
        name: input.name,
        role: invitation.role,
        passwordHash,
      },
      { transaction },
    );
    invitation.acceptedAt = new Date();
    await invitation.save({ transaction });
    return user;
  };
  return input.transaction ? write(input.transaction) : db().transaction(write);
}

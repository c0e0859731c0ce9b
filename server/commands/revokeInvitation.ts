import type { Transaction } from 'sequelize';
import type { Invitation } from '../models/Invitation';

/**
 * Revokes an invitation by expiring it now: the link stops working and the row stays as a record.
 * A used or expired invitation is left as it is.
 */
export async function revokeInvitation(invitation: Invitation, transaction?: Transaction): Promise<Invitation> {
  if (invitation.isUsable()) await invitation.update({ expiresAt: new Date() }, { transaction });
  return invitation;
}

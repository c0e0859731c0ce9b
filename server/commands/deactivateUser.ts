import type { Transaction } from 'sequelize';
import { endSessionsOf } from '../auth/session';
import { db } from '../db/connection';
import { ConflictError } from '../errors';
import type { User } from '../models/User';

/**
 * Deactivates a user: they can no longer sign in, and every session they hold is ended. Their
 * row stays (authorship, assignments). Admins cannot deactivate themselves, so an organisation
 * keeps an admin.
 */
export async function deactivateUser(input: { actor: User; user: User; transaction?: Transaction }): Promise<User> {
  const { actor, user, transaction } = input;
  if (actor.id === user.id) throw new ConflictError('You cannot deactivate yourself.');
  if (!user.isActive) return user;
  user.deactivatedAt = new Date();
  await user.save({ transaction });
  // Sessions also stop working without this (the user is re-read on every request and refused
  // when inactive); deleting them frees the rows at once.
  await endSessionsOf(db(), user.id);
  return user;
}

import type { Transaction } from 'sequelize';
import type { ChangeRoleInput } from '../../shared/api/users';
import { ConflictError } from '../errors';
import type { User } from '../models/User';

/**
 * Gives a user another role. Admins cannot change their own role: that keeps at least one admin
 * in every organisation (only admins change roles, and none can demote themselves).
 */
export async function changeRole(input: ChangeRoleInput & { actor: User; user: User; transaction?: Transaction }): Promise<User> {
  const { actor, user, role, transaction } = input;
  if (actor.id === user.id) throw new ConflictError('You cannot change your own role.', 'role');
  if (user.role === role) return user;
  user.role = role;
  await user.save({ transaction });
  return user;
}

import type { Transaction } from 'sequelize';
import type { ChangePasswordInput } from '../../shared/api/session';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { endSessionsOf } from '../auth/session';
import { db } from '../db/connection';
import { ValidationError } from '../errors';
import type { User } from '../models/User';

/** 400 on currentPassword: the one failure the sign-in limits count for a password change. */
export class WrongPasswordError extends ValidationError {
  constructor() {
    super('The current password is wrong.', 'currentPassword');
  }
}

/**
 * Changes a user's own password after checking the current one, and ends their other sessions
 * (a changed password should lock out whoever else was signed in); `keepSessionId` survives.
 */
export async function changePassword(
  input: ChangePasswordInput & { user: User; keepSessionId?: string; transaction?: Transaction },
): Promise<User> {
  const { user, transaction } = input;
  if (!(await verifyPassword(input.currentPassword, user.passwordHash))) {
    throw new WrongPasswordError();
  }
  user.passwordHash = await hashPassword(input.newPassword);
  await user.save({ transaction });
  await endSessionsOf(db(), user.id, { except: input.keepSessionId });
  return user;
}

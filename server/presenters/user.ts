import type { UserDTO } from '../../shared/api/users';
import type { User } from '../models/User';

/**
 * A user as the API shows it: an explicit list of fields, so the password hash (or any column
 * added later) never leaks by accident.
 */
export function presentUser(user: User): UserDTO {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    active: user.isActive,
    createdAt: user.createdAt.toISOString(),
    lastSignedInAt: user.lastSignedInAt ? user.lastSignedInAt.toISOString() : null,
  };
}

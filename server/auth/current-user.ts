import type { Request } from 'express';
import { AuthenticationError } from '../errors';
import type { User } from '../models/User';
import './types';

/**
 * The signed-in, active user of a request, or a 401. Route guards have already run, so in a
 * handler of a non-public route this never throws; it gives the handler a non-null type.
 *
 * @example
 * const actor = currentUser(req);
 */
export function currentUser(req: Request): User {
  const user = req.user;
  if (!user || !user.isActive) throw new AuthenticationError();
  return user;
}

/** The signed-in user of a request, or null (for public routes such as GET /api/session). */
export function optionalUser(req: Request): User | null {
  const user = req.user;
  return user && user.isActive ? user : null;
}

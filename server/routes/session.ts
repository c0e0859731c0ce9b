import type { Request } from 'express';
import { changePasswordSchema, signInSchema } from '../../shared/api/session';
import { csrfTokenOf } from '../auth/csrf';
import { currentUser, optionalUser } from '../auth/current-user';
import { authenticateLocal } from '../auth/passport';
import { changePassword } from '../commands/changePassword';
import { AuthenticationError } from '../errors';
import type { User } from '../models/User';
import { presentSession } from '../presenters/session';
import { findOrganisation } from '../queries/people';
import { defineRoutes } from './define';
import { parse } from './validate';

function logIn(req: Request, user: User): Promise<void> {
  // passport 0.7 regenerates the session id here (no fixation), dropping the old CSRF token too.
  return new Promise((resolve, reject) => req.logIn(user, (error) => (error ? reject(error) : resolve())));
}

function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logOut((error) => (error ? reject(error) : resolve())));
}

async function sessionOf(req: Request) {
  const user = optionalUser(req);
  const organisation = user ? await findOrganisation(user.organisationId) : null;
  return presentSession(user, organisation, csrfTokenOf(req));
}

/**
 * /api/session: who is signed in (and the CSRF token), sign in, sign out, change password.
 */
export const sessionRoutes = defineRoutes('/session', [
  {
    method: 'get',
    path: '/',
    guard: 'public',
    handler: async (req, res) => res.json(await sessionOf(req)),
  },
  {
    method: 'post',
    path: '/',
    guard: 'public',
    use: ['signInRateLimit'],
    handler: async (req, res) => {
      req.body = parse(signInSchema, req.body);
      const { user, info } = await authenticateLocal(req, res);
      if (!user) throw new AuthenticationError(info?.message ?? 'Wrong e-mail or password.');
      await logIn(req, user);
      user.lastSignedInAt = new Date();
      await user.save();
      res.json(await sessionOf(req));
    },
  },
  {
    method: 'delete',
    path: '/',
    guard: 'signedIn',
    handler: async (req, res) => {
      await logOut(req);
      res.json(await sessionOf(req));
    },
  },
  {
    method: 'put',
    path: '/password',
    guard: 'signedIn',
    handler: async (req, res) => {
      const body = parse(changePasswordSchema, req.body);
      await changePassword({ user: currentUser(req), ...body, keepSessionId: req.sessionID });
      res.status(204).end();
    },
  },
]);

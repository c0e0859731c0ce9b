import type { Request, Response } from 'express';
import { changePasswordSchema, signInSchema } from '../../shared/api/session';
import { clientAddress, credentialLimiterOf } from '../auth/credential-limit';
import { csrfTokenOf } from '../auth/csrf';
import { currentUser, optionalUser } from '../auth/current-user';
import { authenticateLocal, WrongCredentialsError } from '../auth/passport';
import { startSignedInSession } from '../auth/session';
import { changePassword, WrongPasswordError } from '../commands/changePassword';
import { presentSession } from '../presenters/session';
import { findOrganisation } from '../queries/people';
import { defineRoutes } from './define';
import { parse } from './validate';

function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logOut((error) => (error ? reject(error) : resolve())));
}

async function sessionOf(req: Request, res: Response) {
  const user = optionalUser(req);
  const organisation = user ? await findOrganisation(user.organisationId) : null;
  return presentSession(user, organisation, csrfTokenOf(req, res));
}

/**
 * /api/session: who is signed in (and the CSRF token), sign in, sign out, change password. Sign-in
 * and change password check a password under the sign-in limits: only a wrong password counts.
 */
export const sessionRoutes = defineRoutes('/session', [
  {
    method: 'get',
    path: '/',
    guard: 'public',
    handler: async (req, res) => res.json(await sessionOf(req, res)),
  },
  {
    method: 'post',
    path: '/',
    guard: 'public',
    handler: async (req, res) => {
      req.body = parse(signInSchema, req.body);
      const { email } = req.body;
      const limiter = credentialLimiterOf(req);
      const user = await limiter.guard(
        limiter.accountKeys(email, clientAddress(req)),
        () => authenticateLocal(req, res),
        (error) => error instanceof WrongCredentialsError,
      );
      await startSignedInSession(req, user);
      user.lastSignedInAt = new Date();
      await user.save();
      res.json(await sessionOf(req, res));
    },
  },
  {
    method: 'delete',
    path: '/',
    guard: 'signedIn',
    handler: async (req, res) => {
      await logOut(req);
      res.json(await sessionOf(req, res));
    },
  },
  {
    method: 'put',
    path: '/password',
    guard: 'signedIn',
    handler: async (req, res) => {
      const body = parse(changePasswordSchema, req.body);
      const user = currentUser(req);
      const limiter = credentialLimiterOf(req);
      await limiter.guard(
        limiter.accountKeys(user.email, clientAddress(req)),
        () => changePassword({ user, ...body, keepSessionId: req.sessionID }),
        (error) => error instanceof WrongPasswordError,
      );
      res.status(204).end();
    },
  },
]);

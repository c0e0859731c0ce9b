import type { Request, Response } from 'express';
import passportModule from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { AuthenticationError } from '../errors';
import { User } from '../models/User';
import { verifyPassword } from './passwords';
import './types';

/** 401 for a wrong e-mail or password: the one failure the sign-in limits count. */
export class WrongCredentialsError extends AuthenticationError {
  constructor() {
    super('Wrong e-mail or password.');
  }
}

/**
 * The active user with this e-mail and password, or a 401: WrongCredentialsError for an unknown
 * address or a wrong password (the same answer and the same time, so it does not reveal which
 * addresses have accounts), a plain AuthenticationError for a deactivated account with the right
 * password.
 *
 * @example
 * const user = await checkCredentials('ines@brackenfold.example', 'brackenfold-admin');
 */
export async function checkCredentials(email: string, password: string): Promise<User> {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const ok = await verifyPassword(password, user?.passwordHash);
  if (!user || !ok) throw new WrongCredentialsError();
  if (!user.isActive) throw new AuthenticationError('This account has been deactivated.');
  return user;
}

/**
 * A passport instance of our own (not the module-wide singleton) that keeps the user id in the
 * session. Its local strategy checks an e-mail and password with checkCredentials(); the user is
 * re-read on every request, so a deactivated user's sessions stop working at once.
 */
export function createPassport() {
  const passport = new passportModule.Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: false }, (email, password, done) => {
      checkCredentials(email, password).then((user) => done(null, user), done);
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => {
    User.findByPk(id)
      .then((user) => done(null, user && user.isActive ? user : false))
      .catch(done);
  });
  return passport;
}

/** The server's passport instance: app.ts installs its middleware, the session routes sign in and out with it. */
export const passport = createPassport();

/**
 * Runs the local strategy on a validated sign-in body: the user, or the strategy's error
 * (WrongCredentialsError, or AuthenticationError for a deactivated account).
 *
 * @example
 * const user = await authenticateLocal(req, res);
 */
export function authenticateLocal(req: Request, res: Response): Promise<User> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (error: unknown, user: User | false) => {
      if (error) reject(error);
      else if (user) resolve(user);
      else reject(new WrongCredentialsError());
    })(req, res, reject);
  });
}

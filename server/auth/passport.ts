import passportModule from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models/User';
import { verifyPassword } from './passwords';
import './types';

/** Why a sign-in failed, passed from the strategy to the route as passport's `info`. */
export interface SignInFailure {
  code: 'wrong_credentials' | 'deactivated';
  message: string;
}

/**
 * A passport instance of our own (not the module-wide singleton) with the local strategy (e-mail + password) and a session that stores the user id
 * only. The user is re-read on every request, so a deactivated user's sessions stop working at once.
 */
export function createPassport() {
  const passport = new passportModule.Passport();

  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: email.trim().toLowerCase() } })
        .then(async (user) => {
          const ok = await verifyPassword(password, user?.passwordHash);
          if (!user || !ok) {
            const info: SignInFailure = { code: 'wrong_credentials', message: 'Wrong e-mail or password.' };
            return done(null, false, info);
          }
          if (!user.isActive) {
            const info: SignInFailure = { code: 'deactivated', message: 'This account has been deactivated.' };
            return done(null, false, info);
          }
          return done(null, user);
        })
        .catch(done);
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
 * Runs the local strategy on a request (body: email, password) and resolves with the user, or
 * false and why.
 */
export function authenticateLocal(
  req: import('express').Request,
  res: import('express').Response,
): Promise<{ user: User | false; info?: SignInFailure }> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (error: unknown, user: User | false, info?: SignInFailure) =>
      error ? reject(error) : resolve({ user, info }),
    )(req, res, reject);
  });
}

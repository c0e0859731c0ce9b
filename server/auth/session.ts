import connectPgSimple from 'connect-pg-simple';
import type { Request, RequestHandler } from 'express';
import session from 'express-session';
import type { Sequelize } from 'sequelize';
import { loadConfig } from '../config';
import type { User } from '../models/User';
import { sessionSecret } from './secret';
import './types';

/** Name of the session cookie. */
export const SESSION_COOKIE = 'doublet.sid';

/** Name of the table created by migration 0004. */
export const SESSION_TABLE = 'sessions';

/**
 * A pg-Pool-shaped adapter over Sequelize's own connections, so the session store shares the
 * application's pool (and closes with it) instead of opening a second one.
 */
function poolOf(sequelize: Sequelize) {
  const manager = sequelize.connectionManager as unknown as {
    getConnection(options: { type: 'write' }): Promise<{ query(text: string, params?: unknown[]): Promise<unknown> }>;
    releaseConnection(connection: unknown): Promise<void> | void;
  };
  return {
    async query(text: string, params?: unknown[]) {
      const connection = await manager.getConnection({ type: 'write' });
      try {
        return await connection.query(text, params);
      } finally {
        await manager.releaseConnection(connection);
      }
    },
  };
}

/**
 * express-session with sessions in PostgreSQL (connect-pg-simple, table from a migration) and an
 * httpOnly, SameSite=Lax cookie. Lax (not Strict) so a link from a mail to a page still arrives
 * signed in; cross-site POSTs carry no cookie, and the CSRF token guards the rest. Only a sign-in
 * stores a session (`saveUninitialized: false`, and nothing else writes to an anonymous one); it
 * ends after SESSION_IDLE_HOURS without a request (the cookie's rolling max-age and the row's expiry).
 */
export function createSessionMiddleware(sequelize: Sequelize, options: { idleMs?: number } = {}) {
  const config = loadConfig();
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool: poolOf(sequelize) as never,
    tableName: SESSION_TABLE,
    createTableIfMissing: false,
    // Expired rows are deleted every 15 minutes; the timer is unref'd by the store.
    pruneSessionInterval: 15 * 60,
  });
  return session({
    name: SESSION_COOKIE,
    secret: sessionSecret(),
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, maxAge: options.idleMs ?? config.sessionIdleMs, path: '/' },
  });
}

/**
 * Signs a user in: a new session id (passport regenerates it, so no fixation and the old CSRF token
 * dies with the old id) and the time of sign-in, from which the absolute lifetime is counted.
 */
export function startSignedInSession(req: Request, user: User): Promise<void> {
  return new Promise((resolve, reject) =>
    req.logIn(user, (error) => {
      if (error) return reject(error);
      req.session.signedInAt = Date.now();
      resolve();
    }),
  );
}

/**
 * Ends a signed-in session that is older than `maxAgeMs` since its sign-in (SESSION_MAX_DAYS),
 * however busy it has been, and one that has no sign-in time; the request goes on as anonymous
 * (guarded routes answer 401). Runs after passport has read the session.
 */
export function absoluteSessionLifetime(maxAgeMs: number): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next();
    const signedInAt = req.session?.signedInAt;
    if (typeof signedInAt === 'number' && Date.now() - signedInAt <= maxAgeMs) return next();
    delete req.user;
    // A fresh, empty session (the old row is deleted; the new one is stored only if someone signs in).
    req.session.regenerate((error) => next(error));
  };
}

/**
 * Ends every stored session of a user (deactivation, password change elsewhere). Pass the id of a
 * session to keep, such as the one that changed the password.
 */
export async function endSessionsOf(
  sequelize: Sequelize,
  userId: string,
  options: { except?: string } = {},
): Promise<number> {
  const [, meta] = await sequelize.query(
    `delete from ${SESSION_TABLE} where sess -> 'passport' ->> 'user' = $1 and sid <> $2`,
    { bind: [userId, options.except ?? ''] },
  );
  return (meta as { rowCount?: number } | undefined)?.rowCount ?? 0;
}

import crypto from 'node:crypto';
import { doubleCsrf } from 'csrf-csrf';
import type { Request, RequestHandler, Response } from 'express';
import { CSRF_HEADER } from '../../shared/api/session';
import { loadConfig } from '../config';
import { HttpError } from '../errors';
import { isTokenRequest } from './bearer';
import { optionalUser } from './current-user';
import { sessionSecret } from './secret';
import './types';

/** Name of the cookie that holds the signed CSRF token (`__Host-` prefixed behind HTTPS). */
export function csrfCookieName(): string {
  return loadConfig().secureCookies ? '__Host-doublet.csrf' : 'doublet.csrf';
}

/**
 * Signed double-submit tokens (csrf-csrf): the token is an HMAC, under a key derived from the
 * session secret, of a random value and the session it belongs to. The client reads it from
 * GET /api/session and sends it back in the `x-csrf-token` header; the same token sits in an
 * httpOnly, SameSite=Strict cookie, and both must match and verify. A signed-in request's token is
 * bound to its session id, so it dies with the session (sign-in and sign-out rotate it). A visitor
 * who is not signed in gets a token bound to no session, so showing the sign-in form stores
 * nothing on the server.
 */
function createCsrf() {
  const secureCookies = loadConfig().secureCookies;
  return doubleCsrf({
    getSecret: () => crypto.createHmac('sha256', sessionSecret()).update('doublet csrf tokens').digest('base64url'),
    getSessionIdentifier: (req) => (optionalUser(req) ? `session:${req.sessionID}` : 'anonymous'),
    cookieName: csrfCookieName(),
    cookieOptions: { sameSite: 'strict', path: '/', secure: secureCookies, httpOnly: true },
    getCsrfTokenFromRequest: (req) => req.headers[CSRF_HEADER],
  });
}

let csrf: ReturnType<typeof createCsrf> | undefined;
let csrfFor: string | undefined;

function csrfUtilities() {
  const key = `${csrfCookieName()}`;
  if (!csrf || csrfFor !== key) {
    csrf = createCsrf();
    csrfFor = key;
  }
  return csrf;
}

/**
 * The CSRF token for this request's session (or for a visitor who is not signed in), set in the
 * cookie too. Reuses the cookie's token while it is still valid for the session.
 *
 * @example
 * res.json(presentSession(user, organisation, csrfTokenOf(req, res)));
 */
export function csrfTokenOf(req: Request, res: Response): string {
  return csrfUtilities().generateCsrfToken(req, res);
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses (403 `csrf`) every state-changing request whose header token does not match its cookie
 * and verify for its session. The one exemption is a request authenticated by a valid API token
 * (server/auth/bearer.ts): it carries no cookie a browser could send on its own, its session and
 * cookies were never read, and an invalid or unusable Bearer header was already refused with 401.
 */
export function csrfProtection(): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || isTokenRequest(req)) return next();
    if (!csrfUtilities().validateRequest(req)) {
      return next(new HttpError(403, 'csrf', 'Missing or stale CSRF token: reload the page and try again.'));
    }
    next();
  };
}

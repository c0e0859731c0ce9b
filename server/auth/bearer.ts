import type { Request, RequestHandler } from 'express';
import { HttpError } from '../errors';

/** A request that names a Bearer token (any case of the scheme, as RFC 6750 allows). */
const BEARER = /^\s*bearer(\s|$)/i;

/**
 * True when the request carries `Authorization: Bearer …`. Such a request is authenticated by its
 * token alone: cookies are ignored for it (no session is read, so no CSRF exemption can be earned
 * with a cookie), and sign-in never accepts one.
 */
export function isBearerRequest(req: Request): boolean {
  return BEARER.test(req.headers.authorization ?? '');
}

/** 401 for a Bearer token that does not authenticate. */
export class InvalidTokenError extends HttpError {
  constructor() {
    super(401, 'invalid_token', 'This API token is not valid here: API tokens are not accepted yet. Sign in instead.');
  }
}

/**
 * The single place Bearer requests are authenticated, mounted first on /api (before cookies and
 * sessions are read). API tokens do not exist yet, so every Bearer request is refused with 401 on
 * every route. When they arrive, this is where the token is looked up: set `req.user` from it, mark
 * the request as token-authenticated (routes a token may not use refuse it, and only such a request
 * skips the CSRF check), and skip the session middleware; everything else stays as it is.
 */
export function bearerAuthentication(): RequestHandler {
  return (req, _res, next) => {
    if (!isBearerRequest(req)) return next();
    next(new InvalidTokenError());
  };
}

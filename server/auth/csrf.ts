import crypto from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { CSRF_HEADER } from '../../shared/api/session';
import { HttpError } from '../errors';
import './types';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * The session's CSRF token, created on first use. It is a synchronizer token: stored in the
 * session, handed to the client by GET /api/session, and sent back in the `x-csrf-token` header.
 */
export function csrfTokenOf(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = crypto.randomBytes(32).toString('base64url');
  return req.session.csrfToken;
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && crypto.timingSafeEqual(left, right);
}

/**
 * Refuses (403 `csrf`) every state-changing request whose header does not match its session's
 * token. A request with no session has no token and is refused too, which also stops forged
 * sign-ins. The one exception is a request that carries no cookie at all and a Bearer
 * Authorization header (API tokens for CI, added later): a browser cannot be tricked into sending
 * that, so there is nothing to forge.
 */
export function csrfProtection(): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    if (!req.headers.cookie && /^Bearer\s/i.test(req.headers.authorization ?? '')) return next();
    const sent = req.get(CSRF_HEADER);
    const expected = req.session?.csrfToken;
    if (!sent || !expected || !sameToken(sent, expected)) {
      return next(
        new HttpError(403, 'csrf', 'Missing or stale CSRF token: reload the page and try again.'),
      );
    }
    next();
  };
}

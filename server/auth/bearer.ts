import type { Request, RequestHandler } from 'express';
import { API_TOKEN_PATTERN } from '../../shared/api/tokens';
import { fromDatabaseError, HttpError } from '../errors';
import { User } from '../models/User';
import { scopeToToken, tokenScopeOf } from '../policies/api-tokens';
import { findUsableApiToken, touchApiToken, type UsableApiToken } from '../queries/apiTokens';
import { hashToken } from './tokens';
import './types';

/** A request that names a Bearer token (any case of the scheme, as RFC 6750 allows). */
const BEARER = /^\s*bearer(\s|$)/i;

/** The credential of a Bearer header: one run of non-space characters after the scheme. */
const CREDENTIAL = /^\s*bearer\s+(\S+)\s*$/i;

/**
 * True when the request carries `Authorization: Bearer …`. Such a request is authenticated by its
 * token alone: cookies are ignored for it (no session is read, so no CSRF exemption can be earned
 * with a cookie), and sign-in never accepts one.
 */
export function isBearerRequest(req: Request): boolean {
  return BEARER.test(req.headers.authorization ?? '');
}

/** True when the request was authenticated by a valid API token (by bearerAuthentication). */
export function isTokenRequest(req: Request): boolean {
  return req.user !== undefined && tokenScopeOf(req.user) !== undefined;
}

/** 401 for a Bearer token that does not authenticate: the same answer whether unknown, revoked or expired. */
export class InvalidTokenError extends HttpError {
  constructor() {
    super(401, 'invalid_token', 'This API token is not valid: it is unknown, revoked or expired. Ask a lead for a new one.');
  }
}

/**
 * The actor of a token request: a User built for this request only (never saved), in the token's
 * organisation, with no password and no powers of its own; its scope (server/policies/api-tokens.ts)
 * decides what it may do, not its role or its creator's.
 */
function tokenActor(token: UsableApiToken): User {
  const actor = User.build({
    organisationId: token.organisationId,
    email: '',
    name: `API token ${token.name}`,
    role: 'viewer',
    passwordHash: '',
    deactivatedAt: null,
  });
  return scopeToToken(actor, { tokenId: token.id, repositoryId: token.repositoryId });
}

/**
 * The single place Bearer requests are authenticated, mounted first on /api (before bodies,
 * cookies and sessions are read). The secret must be well formed and name a token that is neither
 * revoked nor expired, or the answer is 401 on every route. A valid token sets `req.user` to its
 * actor; the session middleware is then skipped (see skipForTokens), the CSRF check passes (there
 * is no cookie to ride on), and routes that do not opt in answer 403 (server/routes/define.ts).
 * `last_used_at` is written at most once a minute per token.
 */
export function bearerAuthentication(): RequestHandler {
  return async (req, _res, next) => {
    if (!isBearerRequest(req)) return next();
    const secret = CREDENTIAL.exec(req.headers.authorization ?? '')?.[1];
    if (!secret || !API_TOKEN_PATTERN.test(secret)) return next(new InvalidTokenError());
    try {
      const token = await findUsableApiToken(hashToken(secret));
      if (!token) return next(new InvalidTokenError());
      await touchApiToken(token.id);
      req.user = tokenActor(token);
      next();
    } catch (error) {
      next(fromDatabaseError(error));
    }
  };
}

/**
 * Runs `middleware` for every request except those authenticated by an API token: wraps the
 * session, cookie and passport middleware so a token request never reads or creates a session.
 *
 * @example
 * api.use(skipForTokens(createSessionMiddleware(sequelize, options)));
 */
export function skipForTokens(middleware: RequestHandler): RequestHandler {
  return (req, res, next) => (isTokenRequest(req) ? next() : middleware(req, res, next));
}

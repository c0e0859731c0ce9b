import express, { type RequestHandler } from 'express';
import { optionalUser } from '../auth/current-user';
import { csrfProtection } from '../auth/csrf';
import { AuthenticationError, fromDatabaseError, HttpError } from '../errors';
import { declaredRoutes, guardMiddleware, type DeclaredRoute, type RouteGroup } from './define';
import { healthRoutes } from './health';
import { invitationRoutes } from './invitations';
import { sessionRoutes } from './session';
import { userRoutes } from './users';
import { cloneClassRoutes } from './clone-classes';
import { crossClassRoutes } from './cross-classes';
import { organisationRoutes } from './organisation';
import { findCopiesRoutes } from './find-copies';
import { repositoryRoutes } from './repositories';
import { snapshotRoutes } from './snapshots';
import { outboxRoutes } from './outbox';
import { apiTokenRoutes } from './tokens';
import { memberRoutes, taskRoutes } from './tasks';
import { gitLinkRoutes } from './git-links';
import { accountRoutes } from './account';

/** Every resource's routes. Add new router files here; tests read this list. */
export const ROUTE_GROUPS: RouteGroup[] = [
  healthRoutes,
  sessionRoutes,
  userRoutes,
  invitationRoutes,
  repositoryRoutes,
  snapshotRoutes,
  cloneClassRoutes,
  crossClassRoutes,
  organisationRoutes,
  findCopiesRoutes,
  outboxRoutes,
  apiTokenRoutes,
  taskRoutes,
  memberRoutes,
  gitLinkRoutes,
  accountRoutes,
];

/** Every declared API route with its full path and guard (what the route × role tests enumerate). */
export function registeredRoutes(): DeclaredRoute[] {
  return declaredRoutes(ROUTE_GROUPS);
}

/**
 * The /api router: each declared route runs its guard (401/403), the CSRF check (state-changing
 * methods only), then its handler. Anything else under /api answers 401 to anonymous callers (so
 * unknown routes reveal nothing) and 404 to signed-in ones. Sign-in limits are not middleware: they
 * wrap the credential check itself (server/auth/credential-limit.ts), so refusals before it never count.
 */
export function buildApiRouter(): express.Router {
  const router = express.Router();
  const csrf = csrfProtection();

  for (const group of ROUTE_GROUPS) {
    for (const route of group.routes) {
      const path = `${group.prefix}${route.path === '/' ? '' : route.path}` || '/';
      const handler: RequestHandler = async (req, res, next) => {
        try {
          await route.handler(req, res);
        } catch (error) {
          next(fromDatabaseError(error));
        }
      };
      router[route.method](path, guardMiddleware(route.guard, route.token), csrf, handler);
    }
  }

  router.use((req, _res, next) => {
    if (!optionalUser(req)) return next(new AuthenticationError());
    next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}.`));
  });
  return router;
}

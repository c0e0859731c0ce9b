/**
 * How every router declares its routes. A route is data: method, path, guard, handler. The guard
 * runs before the handler:
 *   - 'public'   anyone (sign in, the session probe, the invitation link);
 *   - 'signedIn' any signed-in, active user (sign out, change your own password);
 *   - an Action  a signed-in user whose role the matrix in shared/permissions.ts allows it.
 * Requests authenticated by an API token (server/auth/bearer.ts) reach only routes that opt in with
 * `token: 'read'` or `token: 'upload'`; every other route, public ones and sign-in included,
 * answers them 403. The opt-in must match the guard (TOKEN_USES in server/policies/api-tokens.ts),
 * and the handler's `authorize(actor, action, record)` holds the token to its own repository.
 * Anonymous requests to guarded routes get 401, roles without the action 403, before the handler
 * validates anything. Record rules (same organisation, an engineer's own task) are the handler's
 * job: load the record, then `authorize(actor, action, record)`.
 *
 * Adding a resource:
 *   export const repositoryRoutes = defineRoutes('/repositories', [
 *     { method: 'get', path: '/', guard: 'repositories.read', handler: async (req, res) => { … } },
 *   ]);
 * then list it in ROUTE_GROUPS in server/routes/index.ts. Tests enumerate every declared route ×
 * every role from there, so an unguarded route cannot slip in.
 */
import type { Request, RequestHandler, Response } from 'express';
import type { Action } from '../../shared/permissions';
import { optionalUser } from '../auth/current-user';
import { AuthenticationError, AuthorizationError } from '../errors';
import { allows } from '../policies';
import { TOKEN_USES, tokenScopeOf, type TokenUse } from '../policies/api-tokens';

/** Who may reach a route at all. */
export type Guard = 'public' | 'signedIn' | Action;

/** HTTP methods a route may use. */
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** One route as a router file declares it. */
export interface RouteSpec {
  method: Method;
  /** Path inside the group, Express syntax (`/:id/role`). */
  path: string;
  guard: Guard;
  /** Whether a request authenticated by an API token may use this route (absent: it may not). */
  token?: TokenUse;
  handler: (req: Request, res: Response) => unknown;
}

/** The routes of one resource, mounted under `/api${prefix}`. */
export interface RouteGroup {
  prefix: string;
  routes: RouteSpec[];
}

/**
 * Declares a resource's routes. Pure data: buildApiRouter() mounts the groups.
 *
 * @example
 * export const userRoutes = defineRoutes('/users', [{ method: 'get', path: '/', guard: 'users.manage', handler }]);
 */
export function defineRoutes(prefix: string, routes: RouteSpec[]): RouteGroup {
  if (prefix !== '' && !/^\/[a-z0-9-/]*[a-z0-9]$/.test(prefix)) {
    throw new Error(`route prefix "${prefix}" must start with / and be lower-case kebab-case`);
  }
  for (const route of routes) {
    if (route.token && !(TOKEN_USES[route.token] as readonly string[]).includes(route.guard)) {
      throw new Error(`route ${route.method.toUpperCase()} ${prefix}${route.path} opts in to token use '${route.token}' but is guarded by ${route.guard}`);
    }
  }
  return { prefix, routes };
}

/** 403 for a request authenticated by an API token on a route that does not accept tokens. */
export class TokenNotAllowedError extends AuthorizationError {
  constructor() {
    super('API tokens may not use this route.');
  }
}

/**
 * The guard as middleware: 403 for an API token unless the route opts in, 401 without an active
 * signed-in user (unless public), 403 when the role may not perform the action.
 */
export function guardMiddleware(guard: Guard, token?: TokenUse): RequestHandler {
  return (req, _res, next) => {
    if (req.user && tokenScopeOf(req.user) && !token) return next(new TokenNotAllowedError());
    if (guard === 'public') return next();
    const user = optionalUser(req);
    if (!user) return next(new AuthenticationError());
    if (guard !== 'signedIn' && !allows(user, guard)) return next(new AuthorizationError());
    next();
  };
}

/** A declared route with its full path, as tests enumerate them. */
export interface DeclaredRoute {
  method: Method;
  /** Full path, e.g. `/api/users/:id/role`. */
  path: string;
  guard: Guard;
  token?: TokenUse;
}

/** Flattens groups into full-path routes. */
export function declaredRoutes(groups: RouteGroup[]): DeclaredRoute[] {
  return groups.flatMap((group) =>
    group.routes.map((route) => ({
      method: route.method,
      path: `/api${group.prefix}${route.path === '/' ? '' : route.path}`,
      guard: route.guard,
      ...(route.token ? { token: route.token } : {}),
    })),
  );
}

import { beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import { registeredRoutes } from '../../../server/routes';
import { can } from '../../../shared/permissions';
import { ROLES, type Role } from '../../../shared/roles';
import { anonymousAgent, buildTeam, signedInAgent, useDatabase, type Agent } from '../../support';

useDatabase();

/** Fills path parameters with well-formed values that match nothing. */
function concretePath(path: string): string {
  return path
    .replace(/:id\b/g, '00000000-0000-4000-8000-000000000000')
    .replace(/:token\b/g, 'x'.repeat(43))
    .replace(/:(\w+)/g, 'unknown');
}

const routes = registeredRoutes();

describe('the route registry', () => {
  it('declares the session, users and invitations routes', () => {
    const names = routes.map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(names).toEqual(
      expect.arrayContaining([
        'GET /api/session',
        'POST /api/session',
        'DELETE /api/session',
        'PUT /api/session/password',
        'GET /api/users',
        'PUT /api/users/:id/role',
        'POST /api/users/:id/deactivate',
        'GET /api/invitations',
        'POST /api/invitations',
      ]),
    );
  });

  it('keeps public routes to the ones anybody needs before signing in', () => {
    const publicRoutes = routes.filter((r) => r.guard === 'public').map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(publicRoutes.sort()).toEqual(
      [
        'GET /api/health',
        'GET /api/session',
        'POST /api/session',
        'GET /api/invitations/token/:token',
        'POST /api/invitations/token/:token/accept',
      ].sort(),
    );
  });
});

describe('every guarded route × every role', () => {
  let app: Express;
  const agents = {} as Record<Role | 'anonymous', Agent>;

  beforeAll(async () => {
    app = createApp();
    const team = await buildTeam();
    agents.anonymous = await anonymousAgent(app);
    for (const role of ROLES) agents[role] = await signedInAgent(app, team[role]);
  });

  for (const route of routes.filter((r) => r.guard !== 'public')) {
    const label = `${route.method.toUpperCase()} ${route.path}`;
    it(`${label}: 401 for anonymous callers`, async () => {
      const res = await agents.anonymous[route.method](concretePath(route.path)).send({});
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('unauthenticated');
    });

    for (const role of ROLES) {
      const guard = route.guard;
      const allowed = guard === 'signedIn' || can(role, guard as Exclude<typeof guard, 'signedIn' | 'public'>);
      if (allowed) {
        // Mutating signed-in routes (sign out…) are exercised in their own files; here only
        // action-guarded ones, whose dummy ids and empty bodies change nothing.
        if (guard === 'signedIn') continue;
        it(`${label}: passes the guard for ${role}`, async () => {
          const res = await agents[role][route.method](concretePath(route.path)).send({});
          expect([401, 403]).not.toContain(res.status);
        });
        continue;
      }
      it(`${label}: 403 for ${role}`, async () => {
        const res = await agents[role][route.method](concretePath(route.path)).send({});
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      });
    }
  }

  it('answers 401 to anonymous callers of routes that do not exist (yet), before any 404', async () => {
    for (const path of ['/api/repositories', '/api/clone-classes/1', '/api/nothing/at/all']) {
      expect((await agents.anonymous.get(path)).status).toBe(401);
      expect((await agents.anonymous.post(path).send({})).status).toBe(401);
    }
  });

  it('answers 404 to signed-in callers of routes that do not exist', async () => {
    const res = await agents.viewer.get('/api/no-such-route');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('lets every role reach GET /api/health and GET /api/session', async () => {
    for (const who of ['anonymous', ...ROLES] as const) {
      expect((await agents[who].get('/api/health')).status).toBe(200);
      expect((await agents[who].get('/api/session')).status).toBe(200);
    }
  });
});

import { beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import { registeredRoutes } from '../../../server/routes';
import { can } from '../../../shared/permissions';
import { ROLES, type Role } from '../../../shared/roles';
import { anonymousAgent, buildTeam, signedInAgent, uniqueEmail, useDatabase, type Agent } from '../../support';

useDatabase();

/** Groups whose `:id` is a uuid (userParamsSchema, invitationParamsSchema, outboxParamsSchema). */
const UUID_ID_PREFIXES = ['/api/users/', '/api/invitations/', '/api/outbox/'];
/** Well-formed ids that match no record: `:id` elsewhere is a positive integer (repositoryParamsSchema, idParamsSchema). */
const MISSING_UUID = '00000000-0000-4000-8000-000000000000';
const MISSING_INTEGER_ID = '2147483647';

/** Fills path parameters with values of the type each route's params schema takes, matching nothing. */
function concretePath(path: string): string {
  const id = UUID_ID_PREFIXES.some((prefix) => path.startsWith(prefix)) ? MISSING_UUID : MISSING_INTEGER_ID;
  return path
    .replace(/:id\b/g, id)
    .replace(/:token\b/g, 'x'.repeat(43))
    .replace(/:(\w+)/g, 'unknown');
}

/**
 * Valid bodies for the guarded routes that validate a body before they load a record, so an
 * allowed role's request gets past validation. They change nothing another test reads: an id that
 * matches nothing, or a new row in this file's own organisation.
 */
const VALID_BODIES: Record<string, (role: Role) => object> = {
  'PUT /api/users/:id/role': () => ({ role: 'viewer' }),
  'POST /api/invitations': (role) => ({ email: uniqueEmail(`registry-${role}`), name: 'Registry Check', role: 'viewer' }),
  'POST /api/repositories': (role) => ({ name: `registry-${role}-${Date.now()}` }),
  'POST /api/find-copies': () => ({ language: 'typescript', text: 'function weighWagon(axles: number) { return axles * 2; }' }),
  'POST /api/tokens': () => ({ name: 'Registry check', repositoryId: 2147483647 }),
  'POST /api/clone-classes/:id/waiver': () => ({ reason: 'Registry check' }),
  'POST /api/tasks': () => ({ cloneClassId: 2147483647, assigneeId: MISSING_UUID, title: 'Registry check' }),
  'PATCH /api/tasks/:id': () => ({ status: 'in_progress' }),
  'POST /api/tasks/:id/comments': () => ({ body: 'Registry check' }),
  'PUT /api/repositories/:id/git': () => ({ remoteUrl: 'https://git.brackenfold.example/freight-platform.git' }),
};

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
        'GET /api/account/notices',
        'PUT /api/account/notices',
      ]),
    );
  });

  it('declares the organisation-wide review routes behind the read actions every role has', () => {
    const guards = Object.fromEntries(routes.map((r) => [`${r.method.toUpperCase()} ${r.path}`, r.guard]));
    expect(guards).toMatchObject({
      'GET /api/clone-classes': 'cloneClasses.read',
      'GET /api/cross-classes/:id': 'cloneClasses.read',
      'GET /api/organisation/loads': 'snapshots.read',
      'GET /api/organisation/trend': 'snapshots.read',
      'GET /api/repositories/:id/clone-map': 'snapshots.read',
    });
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
        it(`${label}: passes the guard and validation for ${role}`, async () => {
          const body = VALID_BODIES[label]?.(role) ?? {};
          const res = await agents[role][route.method](concretePath(route.path)).send(body);
          // 2xx, or 404 for the missing record it loads just before `authorize`.
          const seen = `${res.status} ${JSON.stringify(res.body)}`;
          expect([400, 401, 403], seen).not.toContain(res.status);
          expect(res.status, seen).toBeLessThan(500);
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

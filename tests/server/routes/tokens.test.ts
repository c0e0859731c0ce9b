import AdmZip from 'adm-zip';
import crypto from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { SESSION_COOKIE } from '../../../server/auth/session';
import { execute, select } from '../../../server/clone-index/sql';
import { registeredRoutes } from '../../../server/routes';
import type { ApiTokenDTO, ApiTokenListDTO, CreatedApiTokenDTO } from '../../../shared/api/tokens';
import { anonymousAgent, buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, TEST_PASSWORD, useDatabase, useJobs, type Agent } from '../../support';

useDatabase();
// Uploads queue loads: on a queue schema of this file's own, worked here.
useJobs({ work: true });

/** The invented demo release, zipped. */
function demoZip(): Buffer {
  const zip = new AdmZip();
  zip.addLocalFolder(`${RELEASES}/v1`, 'v1');
  return zip.toBuffer();
}

let app: Express;
beforeAll(() => {
  app = createApp();
});

function cookiesOf(res: request.Response): string[] {
  return ([] as string[]).concat(res.headers['set-cookie'] ?? []);
}

/** A lead's agent and a new token for a fresh repository of the lead's organisation. */
async function leadWithToken(expiresAt?: string) {
  const team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id });
  const lead = await signedInAgent(app, team.lead);
  const res = await lead.post('/api/tokens').send({ name: 'Nightly CI', repositoryId: repository.id, expiresAt });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { team, repository, lead, created: res.body as CreatedApiTokenDTO };
}

function bearer(token: string) {
  return { Authorization: `Bearer ${token}` };
}

describe('POST /api/tokens', () => {
  it('creates a token for a lead: the secret once, only its hash and prefix stored', async () => {
    const { repository, created, team } = await leadWithToken('2031-01-01T00:00:00Z');
    expect(created.token).toMatch(/^dblt_[A-Za-z0-9_-]{43}$/);
    expect(created.apiToken).toMatchObject({
      name: 'Nightly CI',
      repositoryId: repository.id,
      repositoryName: repository.name,
      prefix: created.token.slice(0, 9),
      createdByName: team.lead.name,
      expiresAt: '2031-01-01T00:00:00.000Z',
      lastUsedAt: null,
      revokedAt: null,
    });
    const [row] = await select<Record<string, unknown>>(undefined, 'select * from api_tokens where id = $1', [created.apiToken.id]);
    expect(row.token_hash).toBe(crypto.createHash('sha256').update(created.token).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(created.token);
  });

  it('answers 400 naming the field for a missing name, a wrong repository id, a past expiry or an unknown field', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const lead = await signedInAgent(app, team.lead);
    const cases: [object, string][] = [
      [{ repositoryId: repository.id }, 'name'],
      [{ name: '   ', repositoryId: repository.id }, 'name'],
      [{ name: 'x'.repeat(121), repositoryId: repository.id }, 'name'],
      [{ name: 'CI', repositoryId: String(repository.id) }, 'repositoryId'],
      [{ name: 'CI', repositoryId: 1.5 }, 'repositoryId'],
      [{ name: 'CI', repositoryId: repository.id, expiresAt: '2020-01-01T00:00:00Z' }, 'expiresAt'],
      [{ name: 'CI', repositoryId: repository.id, expiresAt: 'next tuesday' }, 'expiresAt'],
    ];
    for (const [body, field] of cases) {
      const res = await lead.post('/api/tokens').send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    const extra = await lead.post('/api/tokens').send({ name: 'CI', repositoryId: repository.id, scope: 'all' });
    expect(extra.status).toBe(400);
    const [{ count }] = await select<{ count: string }>(undefined, 'select count(*) from api_tokens where repository_id = $1', [repository.id]);
    expect(count).toBe('0');
  });

  it('answers 401 without a session, 403 to an engineer, 404 for a repository of another organisation', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const foreign = await buildRepository();
    const body = { name: 'CI', repositoryId: repository.id };
    expect((await (await anonymousAgent(app)).post('/api/tokens').send(body)).status).toBe(401);
    const engineer = await signedInAgent(app, team.engineer);
    const refused = await engineer.post('/api/tokens').send(body);
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('forbidden');
    const lead = await signedInAgent(app, team.lead);
    expect((await lead.post('/api/tokens').send({ name: 'CI', repositoryId: foreign.id })).status).toBe(404);
    const [{ count }] = await select<{ count: string }>(undefined, 'select count(*) from api_tokens where repository_id in ($1, $2)', [repository.id, foreign.id]);
    expect(count).toBe('0');
  });
});

describe('GET /api/tokens and DELETE /api/tokens/:id', () => {
  it("lists only the organisation's tokens, never a secret or hash, and revokes one (204) which then stays listed as revoked", async () => {
    const { lead, created } = await leadWithToken();
    await leadWithToken(); // another organisation's token
    const list = (await lead.get('/api/tokens').expect(200)).body as ApiTokenListDTO;
    expect(list.apiTokens.map((t) => t.id)).toEqual([created.apiToken.id]);
    const text = JSON.stringify(list);
    expect(text).not.toContain(created.token);
    expect(text).not.toContain(crypto.createHash('sha256').update(created.token).digest('hex'));
    await lead.delete(`/api/tokens/${created.apiToken.id}`).expect(204);
    const after = (await lead.get('/api/tokens').expect(200)).body.apiTokens as ApiTokenDTO[];
    expect(after[0].revokedAt).not.toBeNull();
  });

  it('answers 400 for a malformed id, 401 anonymous, 403 to a viewer, 404 for another organisation\'s token', async () => {
    const { created, team } = await leadWithToken();
    const other = await leadWithToken();
    const lead = await signedInAgent(app, team.lead);
    expect((await lead.delete('/api/tokens/0x1')).status).toBe(400);
    expect((await (await anonymousAgent(app)).get('/api/tokens')).status).toBe(401);
    expect((await (await anonymousAgent(app)).delete(`/api/tokens/${created.apiToken.id}`)).status).toBe(401);
    const viewer = await signedInAgent(app, team.viewer);
    expect((await viewer.get('/api/tokens')).status).toBe(403);
    expect((await viewer.delete(`/api/tokens/${created.apiToken.id}`)).status).toBe(403);
    expect((await lead.delete(`/api/tokens/${other.created.apiToken.id}`)).status).toBe(404);
    await request(app).get(`/api/repositories/${other.repository.id}`).set(bearer(other.created.token)).expect(200);
  });
});

describe('Bearer authentication by token alone', () => {
  it('authenticates a valid token on an opted-in route with no session, no cookie and no CSRF token', async () => {
    const { repository, created } = await leadWithToken();
    const res = await request(app).get(`/api/repositories/${repository.id}`).set(bearer(created.token)).expect(200);
    expect(res.body.id).toBe(repository.id);
    expect(cookiesOf(res)).toEqual([]);
    await request(app).get(`/api/repositories/${repository.id}/snapshots`).set('authorization', `bearer   ${created.token} `).expect(200);
  });

  it('answers 401 with the same message for unknown, malformed, revoked and expired tokens', async () => {
    const { repository, created, lead } = await leadWithToken();
    const expired = await leadWithToken();
    await execute(undefined, `update api_tokens set expires_at = now() - interval '1 second' where id = $1`, [expired.created.apiToken.id]);
    const revoked = await leadWithToken();
    await revoked.lead.delete(`/api/tokens/${revoked.created.apiToken.id}`).expect(204);
    const messages = new Set<string>();
    const candidates = [
      `dblt_${'A'.repeat(43)}`,
      'not-a-token',
      created.token.slice(0, -1),
      '',
      `${created.token} extra`,
      expired.created.token,
      revoked.created.token,
    ];
    for (const token of candidates) {
      const res = await request(app).get(`/api/repositories/${repository.id}`).set('Authorization', `Bearer ${token}`);
      expect(res.status, token).toBe(401);
      expect(res.body.error.code).toBe('invalid_token');
      messages.add(res.body.error.message);
    }
    expect(messages.size).toBe(1);
    // Revocation takes effect on the next request.
    await request(app).get(`/api/repositories/${repository.id}`).set(bearer(created.token)).expect(200);
    await lead.delete(`/api/tokens/${created.apiToken.id}`).expect(204);
    expect((await request(app).get(`/api/repositories/${repository.id}`).set(bearer(created.token))).status).toBe(401);
  });

  it('records last use at most once a minute', async () => {
    const { repository, created } = await leadWithToken();
    const lastUsed = async () =>
      (await select<{ at: Date | null }>(undefined, 'select last_used_at as at from api_tokens where id = $1', [created.apiToken.id]))[0].at;
    expect(await lastUsed()).toBeNull();
    await request(app).get(`/api/repositories/${repository.id}`).set(bearer(created.token)).expect(200);
    const first = await lastUsed();
    expect(first).not.toBeNull();
    await request(app).get(`/api/repositories/${repository.id}`).set(bearer(created.token)).expect(200);
    expect((await lastUsed())?.getTime()).toBe(first?.getTime());
    await execute(undefined, `update api_tokens set last_used_at = now() - interval '2 minutes' where id = $1`, [created.apiToken.id]);
    const backdated = await lastUsed();
    await request(app).get(`/api/repositories/${repository.id}`).set(bearer(created.token)).expect(200);
    expect((await lastUsed())!.getTime()).toBeGreaterThan(backdated!.getTime());
  });

  it("ignores a lead's session cookie sent with a token, and sign-in never accepts a token", async () => {
    const { team, created } = await leadWithToken();
    const agent = await anonymousAgent(app);
    const signedIn = await agent.post('/api/session').send({ email: team.lead.email, password: TEST_PASSWORD }).expect(200);
    const cookie = cookiesOf(signedIn)
      .map((c) => c.split(';')[0])
      .join('; ');
    const users = await request(app).get('/api/tokens').set('Cookie', cookie).set(bearer(created.token));
    expect(users.status).toBe(403);
    expect(users.body.error.message).toBe('API tokens may not use this route.');
    const posted = await request(app)
      .post('/api/repositories')
      .set('Cookie', cookie)
      .set('x-csrf-token', signedIn.body.csrfToken)
      .set(bearer(created.token))
      .send({ name: `token-${Date.now()}` });
    expect(posted.status).toBe(403);
    const signIn = await request(app).post('/api/session').set(bearer(created.token)).send({ email: team.lead.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(403);
    expect(cookiesOf(signIn).some((c) => c.startsWith(`${SESSION_COOKIE}=`))).toBe(false);
    const session = await request(app).get('/api/session').set(bearer(created.token));
    expect(session.status).toBe(403);
    expect(cookiesOf(session)).toEqual([]);
  });
});

/** Fills path parameters with values that match nothing (as the route × role test does). */
function concretePath(path: string): string {
  const id = ['/api/users/', '/api/invitations/'].some((p) => path.startsWith(p)) ? '00000000-0000-4000-8000-000000000000' : '2147483647';
  return path
    .replace(/:id\b/g, id)
    .replace(/:token\b/g, 'x'.repeat(43))
    .replace(/:(\w+)/g, 'unknown');
}

describe('every declared route × an API token', () => {
  const routes = registeredRoutes();
  /** Ids of the token's repository ('own'), another repository of its organisation ('sibling') and another organisation's ('foreign'). */
  const ids = {} as Record<'own' | 'sibling' | 'foreign', { repository: number; snapshot: number; cloneClass: number }>;
  let token = '';
  let lead: Agent;

  beforeAll(async () => {
    const team = await buildTeam();
    const own = await buildRepository({ organisationId: team.organisation.id });
    const sibling = await buildRepository({ organisationId: team.organisation.id });
    const foreign = await buildRepository();
    for (const [key, repository] of [['own', own], ['sibling', sibling], ['foreign', foreign]] as const) {
      const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
      const [cloneClass] = await select<{ id: number }>(undefined, 'select id from clone_classes where snapshot_id = $1 order by id limit 1', [snapshotId]);
      ids[key] = { repository: repository.id, snapshot: snapshotId, cloneClass: cloneClass.id };
    }
    lead = await signedInAgent(app, team.lead);
    token = ((await lead.post('/api/tokens').send({ name: 'Route check', repositoryId: own.id }).expect(201)).body as CreatedApiTokenDTO).token;
  }, 120_000);

  function pathFor(path: string, which: 'own' | 'sibling' | 'foreign'): string {
    const id = path.startsWith('/api/repositories/') ? ids[which].repository : path.startsWith('/api/snapshots/') ? ids[which].snapshot : ids[which].cloneClass;
    return path.replace(':id', String(id));
  }

  it('opts in exactly the read routes of a repository\'s results', () => {
    expect(
      routes
        .filter((r) => r.token)
        .map((r) => `${r.method.toUpperCase()} ${r.path} ${r.token}`)
        .sort(),
    ).toEqual(
      [
        'GET /api/repositories/:id read',
        'GET /api/repositories/:id/snapshots read',
        'GET /api/repositories/:id/metrics read',
        'GET /api/repositories/:id/clone-map read',
        'GET /api/snapshots/:id read',
        'GET /api/snapshots/:id/classes read',
        'GET /api/snapshots/:id/comparison read',
        'GET /api/clone-classes/:id read',
        'GET /api/tokens/current read',
        'POST /api/repositories/:id/git/import upload',
        'POST /api/repositories/:id/snapshots upload',
      ].sort(),
    );
  });

  /**
   * What an opted-in route answers once past the token check, where that is not 200: a git import
   * of a repository with no git link is 409 (the handler ran, after authorize()).
   */
  const HANDLED_STATUS: Record<string, number> = { 'POST /api/repositories/:id/git/import': 409 };

  for (const route of routes) {
    const label = `${route.method.toUpperCase()} ${route.path}`;
    if (label === 'POST /api/repositories/:id/snapshots') {
      it(`${label}: queues an upload for the token's repository, 403 for another of its organisation, 404 for another organisation's`, async () => {
        const send = (agent: ReturnType<typeof request> | Agent, which: 'own' | 'sibling' | 'foreign', withToken: boolean) => {
          const req = agent.post(pathFor(route.path, which));
          return (withToken ? req.set(bearer(token)) : req).field('label', `token-${which}-${withToken}`).attach('archive', demoZip(), 'release.zip');
        };
        const own = await send(request(app), 'own', true);
        expect(own.status, JSON.stringify(own.body)).toBe(202);
        expect((await send(request(app), 'sibling', true)).status).toBe(403);
        expect((await send(request(app), 'foreign', true)).status).toBe(404);
        // A signed-in lead uploads to every repository of the organisation.
        expect((await send(lead, 'sibling', false)).status).toBe(202);
      });
      continue;
    }
    if (label === 'GET /api/tokens/current') {
      it(`${label}: names the token's own repository to the token, 404 to a signed-in person`, async () => {
        const own = await request(app).get(route.path).set(bearer(token));
        expect(own.status, JSON.stringify(own.body)).toBe(200);
        expect(own.body).toMatchObject({ name: 'Route check', repository: { id: ids.own.repository } });
        expect(Object.keys(own.body as object).sort()).toEqual(['id', 'name', 'repository']);
        const person = await lead.get(route.path);
        expect(person.status).toBe(404);
        expect(person.body.error.message).toMatch(/not made with an API token/);
      });
      continue;
    }
    if (route.token) {
      it(`${label}: reaches the handler for the token's repository, 403 for another of its organisation, 404 for another organisation's`, async () => {
        const handled = HANDLED_STATUS[label] ?? 200;
        const own = await request(app)[route.method](pathFor(route.path, 'own')).set(bearer(token));
        expect(own.status, JSON.stringify(own.body)).toBe(handled);
        const sibling = await request(app)[route.method](pathFor(route.path, 'sibling')).set(bearer(token));
        expect(sibling.status).toBe(403);
        expect((await request(app)[route.method](pathFor(route.path, 'foreign')).set(bearer(token))).status).toBe(404);
        // The same routes still serve a signed-in lead every repository of the organisation.
        expect((await lead[route.method](pathFor(route.path, 'sibling'))).status).toBe(handled);
      });
      continue;
    }
    it(`${label}: 403 to a token`, async () => {
      const res = await request(app)[route.method](concretePath(route.path)).set(bearer(token)).send({});
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe('API tokens may not use this route.');
    });
  }
});

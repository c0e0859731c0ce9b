import fc from 'fast-check';
import type { Express } from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { registeredRoutes } from '../../../server/routes';
import type { DeclaredRoute } from '../../../server/routes/define';
import { db } from '../../../server/db/connection';
import { CSRF_HEADER } from '../../../shared/api/session';
import { RELEASES, buildRepository, buildTeam, loadFolder, signedInAgent, useDatabase, type Agent } from '../../support';

/**
 * Random query strings, path parameters and bodies against every declared route, as a signed-in
 * admin (with a valid CSRF token, so requests reach the handlers) and anonymously: the server
 * answers below 500 every time and keeps answering. Runs are bounded (fixed counts, small values)
 * so the file takes seconds.
 */
useDatabase();

/** Runs per route: as the admin, and anonymously (most answers are 401 then, which is quick). */
const ADMIN_RUNS = 30;
const ANONYMOUS_RUNS = 12;

/** Values that broke ids, numbers and text before, mixed into the random ones. */
const NASTY = ['0x1', '1e3', '01', '-1', '0', '1.5', '2147483648', '99999999999999999999', 'NaN', 'Infinity', '\u0000', '%', '..', 'ä', ' 1', '', '[]', '{}'];

/** Ids of records the admin may see (a repository, its snapshot, a clone class), filled in beforeAll. */
const realIds: string[] = [];

/** Characters that text columns, parsers and encoders trip on, often inside otherwise plain strings. */
const printable = fc.integer({ min: 0x20, max: 0x7e }).map((c) => String.fromCharCode(c));
const oddChar = fc.constantFrom('\ud800', '\uffff', '%', '\\', '"', '\n', '*', '_', 'é');
const rawText = fc.string({
  unit: fc.oneof({ arbitrary: printable, weight: 100 }, { arbitrary: oddChar, weight: 8 }, { arbitrary: fc.constant('\u0000'), weight: 1 }),
  maxLength: 30,
});

const text = fc.oneof(
  { arbitrary: rawText, weight: 3 },
  { arbitrary: fc.constantFrom(...NASTY), weight: 3 },
  { arbitrary: fc.nat().map((i) => realIds[i % Math.max(1, realIds.length)] ?? '1'), weight: 3 },
  { arbitrary: fc.integer().map(String), weight: 1 },
  { arbitrary: fc.uuid(), weight: 1 },
  // Shaped like an invitation token, so the link routes get past their format check.
  { arbitrary: fc.stringMatching(/^[A-Za-z0-9_-]{43}$/), weight: 1 },
);

/** Path parameters: the nasty values more often than in bodies, since every id goes through one parser. */
const param = fc.oneof({ arbitrary: fc.constantFrom(...NASTY), weight: 1 }, { arbitrary: text, weight: 2 });

const fieldValue = fc.oneof(
  { arbitrary: text, weight: 5 },
  { arbitrary: fc.array(text, { maxLength: 4 }), weight: 2 },
  { arbitrary: fc.double(), weight: 1 },
  { arbitrary: fc.integer(), weight: 1 },
  { arbitrary: fc.constantFrom(true, null, 0.8, 0.7999999999999999, 1e308, -0, 2147483648, 'admin', 'python'), weight: 1 },
  { arbitrary: fc.jsonValue({ maxDepth: 3 }), weight: 1 },
);

/**
 * A valid body for each route that takes one (by method and path), so that changing one or two of
 * its fields at random gets past the rest of the checks and into the handler.
 */
const VALID_BODIES: [RegExp, Record<string, unknown>][] = [
  [/^post \/api\/session$/, { email: 'fuzz-nobody@test.example', password: 'long-enough-password' }],
  [/^put \/api\/session\/password$/, { currentPassword: 'not-the-password', newPassword: 'long-enough-password' }],
  [/^post \/api\/invitations$/, { email: 'fuzz-invitee@test.example', name: 'Fuzz Person', role: 'viewer' }],
  [/^post \/api\/invitations\/token\/:token\/accept$/, { name: 'Fuzz Person', password: 'long-enough-password' }],
  [/^put \/api\/users\/:id\/role$/, { role: 'viewer' }],
  // No name: a new one per run is added below for POST, and PATCH keeps the repository's own.
  [/^(post|patch) \/api\/repositories/, { description: 'd', threshold: 0.8, minTokens: 20, shingleSize: 3, ignore: ['vendor/'], cloneBudget: 0.2 }],
  [/^post \/api\/find-copies$/, { language: 'javascript', text: 'function a(b) { return b + 1; }', threshold: 0.8 }],
];

/** Query fields of the routes that read a query (the class list), and a few nobody reads. */
const QUERY_FIELDS = ['sort', 'order', 'type', 'language', 'path', 'status', 'page', 'pageSize', 'q', 'id'];

let created = 0;

function validBodyOf(route: DeclaredRoute): Record<string, unknown> | undefined {
  return VALID_BODIES.find(([pattern]) => pattern.test(`${route.method} ${route.path}`))?.[1];
}

/** Bodies for one route: its valid body with one or two fields replaced or added, or anything at all. */
function bodyFor(route: DeclaredRoute) {
  const valid = validBodyOf(route);
  const anything = fc.oneof(fc.jsonValue({ maxDepth: 4 }), fc.constant(undefined));
  if (!valid) return anything;
  const fields = Object.keys(valid);
  const named = route.method === 'post' && route.path === '/api/repositories';
  const mutated = fc
    .tuple(
      fc.dictionary(fc.oneof({ arbitrary: fc.constantFrom(...fields), weight: 4 }, { arbitrary: fc.string({ maxLength: 6 }), weight: 1 }), fieldValue, {
        minKeys: 1,
        maxKeys: 2,
      }),
      fc.nat(),
    )
    .map(([changes, n]) => ({ ...(named ? { name: `fuzz-${n}-${++created}` } : {}), ...valid, ...changes }));
  return fc.oneof({ arbitrary: mutated, weight: 4 }, { arbitrary: anything, weight: 1 });
}

const query = fc.dictionary(fc.constantFrom(...QUERY_FIELDS), fc.oneof(text, fc.array(text, { maxLength: 3 })), { maxKeys: 4 });

/** Percent-encodes a value; a lone surrogate (not encodable) goes out as the bytes of one, which is not UTF-8. */
function encode(value: string): string {
  try {
    return encodeURIComponent(value);
  } catch {
    return value.replace(/[\ud800-\udfff]/g, '%ED%A0%80').replace(/[^%A-Za-z0-9]/g, (c) => encodeURIComponent(c));
  }
}

function queryString(values: Record<string, string | string[]>): string {
  const parts = Object.entries(values).flatMap(([key, value]) =>
    ([] as string[]).concat(value).map((v) => `${encode(key)}=${encode(v)}`),
  );
  return parts.length ? `?${parts.join('&')}` : '';
}

function fillPath(route: DeclaredRoute, values: string[]): string {
  let i = 0;
  return route.path.replace(/:(\w+)/g, () => encode(values[i++ % values.length] ?? ''));
}

/** Failed checks the fuzz makes count against an address of its own, not the rest of the suite's. */
const FUZZ_ADDRESS = `2001:db8:f022::${process.pid.toString(16)}`;

function send(agent: Agent | null, route: DeclaredRoute, url: string, payload: unknown) {
  const call = (agent ?? request(app))[route.method](url).set('X-Forwarded-For', FUZZ_ADDRESS);
  return payload === undefined ? call : call.set('content-type', 'application/json').send(JSON.stringify(payload));
}

let app: Express;
let admin: Agent;
let routes: DeclaredRoute[];
let csrfToken: string;

beforeAll(async () => {
  app = createApp({ trustProxy: true });
  const team = await buildTeam();
  admin = await signedInAgent(app, team.admin);
  const repository = await buildRepository({ organisationId: team.organisation.id });
  const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
  const [classes] = await db().query('select id from clone_classes where snapshot_id = $1 limit 1', { bind: [snapshotId] });
  realIds.push(String(repository.id), String(snapshotId), ...(classes as { id: number }[]).map((c) => String(c.id)));
  csrfToken = (await admin.get('/api/session').expect(200)).body.csrfToken;
  // Signing out would leave the rest of the run anonymous; sign-out has its own tests.
  routes = registeredRoutes().filter((r) => !(r.method === 'delete' && r.path === '/api/session'));
});

describe('every declared route under random input', () => {
  it('is fuzzed route by route (every declared route but sign-out is on the list)', () => {
    expect(routes.length).toBe(registeredRoutes().length - 1);
  });

  for (const actor of ['admin', 'anonymous'] as const) {
    it(`answers below 500 on every route (${actor})`, async () => {
      for (const [index, route] of routes.entries()) {
        await fc.assert(
          fc.asyncProperty(fc.array(param, { minLength: 1, maxLength: 2 }), query, bodyFor(route), async (params, q, payload) => {
            const url = `${fillPath(route, params)}${queryString(q)}`;
            const res = await send(actor === 'admin' ? admin : null, route, url, payload);
            if (res.status >= 500) throw new Error(`${route.method.toUpperCase()} ${url} answered ${res.status}: ${JSON.stringify(res.body)}`);
            expect(res.headers['cache-control']).toBe('no-store');
            if (res.status >= 400) expect(typeof res.body?.error?.message).toBe('string');
          }),
          { numRuns: actor === 'admin' ? ADMIN_RUNS : ANONYMOUS_RUNS, seed: 92_026 + index * 2 + (actor === 'admin' ? 0 : 1) },
        );
      }
    }, 60_000);
  }

  it('answers below 500 to raw bodies that are not JSON, under any content type', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...routes.filter((r) => r.method !== 'get')),
        fc.string({ maxLength: 60 }),
        fc.constantFrom('application/json', 'application/json; charset=utf-16', 'text/plain', 'application/x-www-form-urlencoded', 'application/vnd.api+json'),
        async (route, raw, contentType) => {
          const res = await send(admin, route, fillPath(route, ['1']), undefined).set('content-type', contentType).send(raw);
          if (res.status >= 500) throw new Error(`${route.method.toUpperCase()} ${route.path} with ${contentType} answered ${res.status}`);
        },
      ),
      { numRuns: 100, seed: 9_2028 },
    );
  }, 60_000);

  it('still answers afterwards, with the admin still signed in', async () => {
    await request(app).get('/api/health').expect(200);
    const me = await admin.get('/api/session').expect(200);
    expect(me.body.user).not.toBeNull();
    // The admin's CSRF token still works (the fuzz changed nothing about the session).
    await admin.post('/api/session').set(CSRF_HEADER, csrfToken).send({}).expect(400);
  });
});

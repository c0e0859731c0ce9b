import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { resolveSessionSecret } from '../../../server/auth/secret';
import { SESSION_COOKIE } from '../../../server/auth/session';
import { db } from '../../../server/db/connection';
import { CSRF_HEADER } from '../../../shared/api/session';
import { TEST_PASSWORD, anonymousAgent, buildRepository, buildTeam, buildUser, invitationTokenMailedTo, mailTo, signedInAgent, uniqueEmail, useDatabase, useMail } from '../../support';

/**
 * One block per finding (2–9) of the hardening review: each test failed against the code before
 * the fix. Finding 1 (unbounded analysis) is covered with the analyzers.
 */
useDatabase();
useMail();

let addressCounter = 0;
/** A distinct IPv6 documentation address (RFC 3849) for each call in this file. */
function freshAddress(): string {
  addressCounter += 1;
  return `2001:db8::${process.pid.toString(16)}:${addressCounter.toString(16)}:${Math.floor(Math.random() * 0xffff).toString(16)}`;
}

function cookiesOf(res: request.Response): string[] {
  return ([] as string[]).concat(res.headers['set-cookie'] ?? []);
}

describe('finding 2: sign-in limits cannot lock others out', () => {
  it('ten cookie-less empty POSTs from an address do not block a correct sign-in from it', async () => {
    const app = createApp({ trustProxy: true });
    const address = freshAddress();
    const user = await buildUser();
    for (let i = 0; i < 10; i += 1) {
      const res = await request(app).post('/api/session').set('X-Forwarded-For', address).send({});
      expect(res.status).toBe(403);
    }
    const agent = request.agent(app);
    const session = await agent.get('/api/session').set('X-Forwarded-For', address).expect(200);
    await agent
      .post('/api/session')
      .set('X-Forwarded-For', address)
      .set(CSRF_HEADER, session.body.csrfToken)
      .send({ email: user.email, password: TEST_PASSWORD })
      .expect(200);
  });

  it('validation refusals (400) do not count either', async () => {
    const app = createApp({ trustProxy: true, limits: { perAccount: 2, perAddress: 2 } });
    const address = freshAddress();
    const user = await buildUser();
    const agent = await anonymousAgent(app);
    agent.set('X-Forwarded-For', address);
    for (let i = 0; i < 12; i += 1) await agent.post('/api/session').send({ email: user.email }).expect(400);
    await agent.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
  });

  it('N wrong passwords for one account give 429 for that account only', async () => {
    const app = createApp({ trustProxy: true, limits: { perAccount: 3 } });
    const address = freshAddress();
    const [target, other] = [await buildUser(), await buildUser()];
    const agent = await anonymousAgent(app);
    agent.set('X-Forwarded-For', address);
    for (let i = 0; i < 3; i += 1) {
      await agent.post('/api/session').send({ email: target.email, password: `wrong-${i}-password` }).expect(401);
    }
    const blocked = await agent.post('/api/session').send({ email: target.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    await agent.post('/api/session').send({ email: other.email, password: TEST_PASSWORD }).expect(200);
  });

  it('the per-address limit holds across accounts, and another address is not affected (TRUST_PROXY)', async () => {
    const app = createApp({ trustProxy: true, limits: { perAddress: 3 } });
    const [guesser, colleague] = [freshAddress(), freshAddress()];
    const user = await buildUser();
    const agent = await anonymousAgent(app);
    for (let i = 0; i < 3; i += 1) {
      await agent.post('/api/session').set('X-Forwarded-For', guesser).send({ email: uniqueEmail(), password: 'not-a-password' }).expect(401);
    }
    await agent.post('/api/session').set('X-Forwarded-For', guesser).send({ email: user.email, password: TEST_PASSWORD }).expect(429);
    await agent.post('/api/session').set('X-Forwarded-For', colleague).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
  });

  it('limits invitation links the same way: unusable tokens from one address end in 429, a good link elsewhere still works', async () => {
    const app = createApp({ trustProxy: true, limits: { perAddress: 3 } });
    const [guesser, invitee] = [freshAddress(), freshAddress()];
    const team = await buildTeam();
    // the admin signs in through an app with the default limits: other files' failed sign-ins from
    // 127.0.0.1 count towards this app's lowered per-address limit
    const admin = await signedInAgent(createApp({ trustProxy: true }), team.admin);
    const email = uniqueEmail('linked');
    await admin.post('/api/invitations').send({ email, name: 'Linked Person', role: 'viewer' }).expect(201);
    const token = await invitationTokenMailedTo(email);
    const visitor = await anonymousAgent(app);
    for (let i = 0; i < 3; i += 1) {
      const guess = `${'A'.repeat(42)}${i}`;
      await visitor.post(`/api/invitations/token/${guess}/accept`).set('X-Forwarded-For', guesser).send({ name: 'X', password: 'long-enough-password' }).expect(404);
    }
    await visitor.get(`/api/invitations/token/${token}`).set('X-Forwarded-For', guesser).expect(429);
    // A body that fails validation is refused before the link is looked at, so it does not count.
    await visitor.post(`/api/invitations/token/${token}/accept`).set('X-Forwarded-For', invitee).send({ name: '' }).expect(400);
    await visitor.post(`/api/invitations/token/${token}/accept`).set('X-Forwarded-For', invitee).send({ name: 'Linked Person', password: 'long-enough-password' }).expect(201);
  });

  it('keeps the counts in PostgreSQL, so every process (here: two apps) sees them', async () => {
    const limits = { perAccount: 2 };
    const [first, second] = [createApp({ trustProxy: true, limits }), createApp({ trustProxy: true, limits })];
    const address = freshAddress();
    const user = await buildUser();
    const one = await anonymousAgent(first);
    one.set('X-Forwarded-For', address);
    for (let i = 0; i < 2; i += 1) await one.post('/api/session').send({ email: user.email, password: 'wrong-password-x' }).expect(401);
    const two = await anonymousAgent(second);
    two.set('X-Forwarded-For', address);
    await two.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(429);
  });
});

describe('finding 3: security headers and caching', () => {
  it('serves index.html with a CSP (no inline script), frame-ancestors none, nosniff, a referrer policy and no-cache', async () => {
    const res = await request(createApp()).get('/repositories').expect(200);
    const csp = res.headers['content-security-policy'] as string;
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
    expect(csp).toMatch(/object-src 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('same-origin');
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['cache-control']).toBe('no-cache');
    // Plain HTTP (no SECURE_COOKIES): no HSTS, no upgrade of requests to HTTPS.
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(csp).not.toMatch(/upgrade-insecure-requests/);
  });

  it('answers every API request with Cache-Control: no-store and nosniff', async () => {
    const app = createApp();
    for (const res of [await request(app).get('/api/session'), await request(app).get('/api/repositories'), await request(app).get('/api/nowhere')]) {
      expect(res.headers['cache-control']).toBe('no-store');
      expect(res.headers['x-content-type-options']).toBe('nosniff');
    }
  });

  it('serves hashed assets for a year, immutable', async () => {
    const app = createApp();
    const index = (await request(app).get('/').expect(200)).text;
    const asset = /\/assets\/[^"']+\.js/.exec(index)?.[0];
    expect(asset).toBeDefined();
    const res = await request(app).get(asset!).expect(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    // A missing asset is a 404, not the page.
    await request(app).get('/assets/index-0000000.js').expect(404);
  });
});

describe('finding 4: malformed requests get a 4xx with a message', () => {
  it('refuses a find-copies threshold with more than six decimals', async () => {
    const { engineer } = await buildTeam();
    const agent = await signedInAgent(createApp(), engineer);
    const res = await agent.post('/api/find-copies').send({ language: 'javascript', text: 'function a(){return 1}', threshold: 0.7999999999999999 });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('threshold');
  });

  it('refuses a clone-class id above the int4 range', async () => {
    const { viewer } = await buildTeam();
    const agent = await signedInAgent(createApp(), viewer);
    for (const id of ['2147483648', '99999999999999999999']) {
      const res = await agent.get(`/api/clone-classes/${id}`);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(/id/);
    }
    expect((await agent.get('/api/clone-classes/2147483647')).status).toBe(404);
  });

  it('refuses a NUL in an ignore line, and stores nothing', async () => {
    const team = await buildTeam();
    const agent = await signedInAgent(createApp(), team.lead);
    const name = `nul-${Date.now()}`;
    const res = await agent.post('/api/repositories').send({ name, ignore: ['vendor/\u0000'] });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('ignore.0');
    const list = await agent.get('/api/repositories').expect(200);
    expect(list.body.repositories.map((r: { name: string }) => r.name)).not.toContain(name);
  });

  it('refuses a JSON body in latin1, content-encoding compress, and gzip that is not gzip', async () => {
    const team = await buildTeam();
    const agent = await signedInAgent(createApp(), team.lead);
    const body = JSON.stringify({ name: 'x' });
    const latin1 = await agent.post('/api/repositories').set('content-type', 'application/json; charset=latin1').send(body);
    expect(latin1.status).toBe(415);
    expect(latin1.body.error.message).toMatch(/charset/i);
    const compress = await agent.post('/api/repositories').set('content-type', 'application/json').set('content-encoding', 'compress').send(body);
    expect(compress.status).toBe(415);
    expect(compress.body.error.message).toMatch(/encoding/i);
    const notGzip = await agent.post('/api/repositories').set('content-type', 'application/json').set('content-encoding', 'gzip').send(body);
    expect(notGzip.status).toBe(400);
    expect(notGzip.body.error.message).toMatch(/gzip|encoding/i);
    // Real gzip still works.
    const name = `gzip-${Date.now()}`;
    const gzipped = await agent
      .post('/api/repositories')
      .set('content-type', 'application/json')
      .set('content-encoding', 'gzip')
      .serialize((body: Buffer) => body as never)
      .send(zlib.gzipSync(JSON.stringify({ name })));
    expect(gzipped.status).toBe(201);
  });
});

describe('finding 5: sessions', () => {
  it('stores no session row for 50 anonymous GET /api/session', async () => {
    const app = createApp();
    const count = async () => {
      const [rows] = await db().query(`select count(*)::int as n from sessions where sess -> 'passport' ->> 'user' is null`);
      return (rows as { n: number }[])[0].n;
    };
    const before = await count();
    for (let i = 0; i < 50; i += 1) {
      const res = await request(app).get('/api/session').expect(200);
      expect(cookiesOf(res).some((c) => c.startsWith(`${SESSION_COOKIE}=`))).toBe(false);
    }
    expect(await count()).toBe(before);
  });

  it('refuses a session older than the absolute lifetime, even while in use', async () => {
    const app = createApp();
    const user = await buildUser({ role: 'viewer' });
    const agent = await signedInAgent(app, user);
    await agent.get('/api/repositories').expect(200);
    const eightDaysAgo = Date.now() - 8 * 24 * 60 * 60 * 1000;
    await db().query(`update sessions set sess = jsonb_set(sess, '{signedInAt}', to_jsonb($2::bigint)) where sess -> 'passport' ->> 'user' = $1`, {
      bind: [user.id, eightDaysAgo],
    });
    await agent.get('/api/repositories').expect(401);
    const after = await agent.get('/api/session').expect(200);
    expect(after.body.user).toBeNull();
    // The old row is gone, and signing in again starts a new lifetime.
    const [rows] = await db().query(`select count(*)::int as n from sessions where sess -> 'passport' ->> 'user' = $1`, { bind: [user.id] });
    expect((rows as { n: number }[])[0].n).toBe(0);
    await agent.post('/api/session').set(CSRF_HEADER, after.body.csrfToken).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    await agent.get('/api/repositories').expect(200);
  });
});

describe('finding 6: invitations do not tell who has an account elsewhere', () => {
  it('answers 201 for an address with an account in another organisation, as for an unknown one, and the mail says what applies', async () => {
    const team = await buildTeam();
    const elsewhere = await buildUser();
    const admin = await signedInAgent(createApp(), team.admin);
    const unknown = uniqueEmail('nobody');
    const a = await admin.post('/api/invitations').send({ email: unknown, name: 'Unknown Person', role: 'viewer' });
    const b = await admin.post('/api/invitations').send({ email: elsewhere.email, name: 'Known Person', role: 'viewer' });
    expect(a.status).toBe(201);
    expect(b.status).toBe(201);
    expect(Object.keys(b.body).sort()).toEqual(Object.keys(a.body).sort());
    expect(b.body.acceptedAt).toBeNull();
    const [mail] = await mailTo(elsewhere.email);
    expect(mail.text).toMatch(/already has a Doublet account/);
    expect(mail.text).not.toMatch(/\/invitations\/[A-Za-z0-9_-]{43}/);
    const [invitation] = await mailTo(unknown);
    expect(invitation.text).toMatch(/\/invitations\/[A-Za-z0-9_-]{43}/);
    // The local catcher's Outbox shows the inviting admin the invitation, never the mail to the other organisation's member.
    expect(invitation.organisationId).toBe(team.organisation.id);
    expect(mail.organisationId).toBeNull();
  });
});

describe('finding 7: change password is limited', () => {
  it('answers 429 after too many wrong current passwords', async () => {
    const app = createApp({ trustProxy: true });
    const user = await buildUser();
    const agent = await signedInAgent(app, user);
    agent.set('X-Forwarded-For', freshAddress());
    const statuses: number[] = [];
    for (let i = 0; i < 15; i += 1) {
      const res = await agent.put('/api/session/password').send({ currentPassword: `wrong-${i}-password`, newPassword: 'a-new-long-passphrase' });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 10).every((s) => s === 400)).toBe(true);
    expect(statuses.slice(10).every((s) => s === 429)).toBe(true);
  });
});

describe('finding 8: Bearer requests never skip the CSRF check', () => {
  it('refuses a cookie-less sign-in with a Bearer header and no CSRF token', async () => {
    const app = createApp();
    const user = await buildUser();
    const res = await request(app).post('/api/session').set('Authorization', 'Bearer anything').send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(401);
    expect(cookiesOf(res).some((c) => c.startsWith(`${SESSION_COOKIE}=`))).toBe(false);
  });

  it('refuses Bearer + a valid session cookie + no CSRF token, and ignores the cookie on reads too', async () => {
    const app = createApp();
    const team = await buildTeam();
    const agent = await anonymousAgent(app);
    const signedIn = await agent.post('/api/session').send({ email: team.lead.email, password: TEST_PASSWORD }).expect(200);
    const cookie = cookiesOf(signedIn)
      .map((c) => c.split(';')[0])
      .join('; ');
    expect(cookie).toContain(`${SESSION_COOKIE}=`);
    const res = await request(app).post('/api/repositories').set('Cookie', cookie).set('Authorization', 'Bearer some-token').send({ name: `bearer-${Date.now()}` });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_token');
    await request(app).get('/api/repositories').set('Cookie', cookie).set('Authorization', 'Bearer some-token').expect(401);
    await request(app).get('/api/repositories').set('Cookie', cookie).expect(200);
  });
});

describe('finding 9: secrets, lifetimes and ids', () => {
  it('refuses to run in production without SESSION_SECRET, and otherwise keeps a generated secret in the data directory (0600)', () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-secret-'));
    try {
      expect(() => resolveSessionSecret({ configured: undefined, production: true, dataDir })).toThrow(/SESSION_SECRET/);
      expect(() => resolveSessionSecret({ configured: 'doublet-local-development-secret', production: true, dataDir })).toThrow(/SESSION_SECRET/);
      const first = resolveSessionSecret({ configured: undefined, production: false, dataDir });
      const file = path.join(dataDir, 'session-secret');
      expect(fs.statSync(file).mode & 0o777).toBe(0o600);
      expect(first.length).toBeGreaterThanOrEqual(43);
      expect(resolveSessionSecret({ configured: undefined, production: false, dataDir })).toBe(first);
      const configured = 'x'.repeat(48);
      expect(resolveSessionSecret({ configured, production: true, dataDir })).toBe(configured);
    } finally {
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  });

  it('accepts only plain positive decimal ids in range', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const agent = await signedInAgent(createApp(), team.viewer);
    await agent.get(`/api/repositories/${repository.id}`).expect(200);
    for (const id of ['0x1', '1e3', `0${repository.id}`, '-1', '0', '1.0', ' 1', '+1', '2147483648']) {
      const res = await agent.get(`/api/repositories/${encodeURIComponent(id)}`);
      expect({ id, status: res.status }).toEqual({ id, status: 400 });
    }
  });
});

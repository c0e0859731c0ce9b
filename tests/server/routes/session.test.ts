import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { SESSION_COOKIE } from '../../../server/auth/session';
import { db } from '../../../server/db/connection';
import { User } from '../../../server/models/User';
import { CSRF_HEADER } from '../../../shared/api/session';
import { TEST_PASSWORD, anonymousAgent, buildUser, signedInAgent, useDatabase } from '../../support';

useDatabase();

function sessionCookie(res: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  return cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
}

describe('GET /api/session', () => {
  it('answers anonymous callers with no user and a CSRF token', async () => {
    const res = await request(createApp()).get('/api/session').expect(200);
    expect(res.body.user).toBeNull();
    expect(res.body.csrfToken).toMatch(/^[0-9a-f]{64}\.[0-9a-f]{64}$/);
  });

  it('sets no session cookie for anonymous callers, and an httpOnly, SameSite=Lax one at sign-in', async () => {
    const app = createApp();
    const anonymous = await request(app).get('/api/session').expect(200);
    expect(sessionCookie(anonymous)).toBeUndefined();
    const agent = await anonymousAgent(app);
    const user = await buildUser();
    const res = await agent.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    const cookie = sessionCookie(res);
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('stores the session in the sessions table', async () => {
    const app = createApp();
    const user = await buildUser({ role: 'viewer' });
    await signedInAgent(app, user);
    const [rows] = await db().query(`select count(*)::int as n from sessions where sess -> 'passport' ->> 'user' = $1`, {
      bind: [user.id],
    });
    expect((rows as { n: number }[])[0].n).toBe(1);
  });
});

describe('POST /api/session (sign in)', () => {
  it('signs in with the right password, shows the user without the hash, and regenerates the session id', async () => {
    const app = createApp();
    const user = await buildUser({ role: 'lead', name: 'Ada Signal' });
    const agent = request.agent(app);
    const before = await agent.get('/api/session').expect(200);
    const res = await agent
      .post('/api/session')
      .set(CSRF_HEADER, before.body.csrfToken)
      .send({ email: user.email.toUpperCase(), password: TEST_PASSWORD })
      .expect(200);
    expect(res.body.user).toMatchObject({ id: user.id, email: user.email, role: 'lead', name: 'Ada Signal', active: true });
    expect(JSON.stringify(res.body)).not.toContain('passwordHash');
    expect(JSON.stringify(res.body)).not.toContain(user.passwordHash);
    expect(res.body.organisation.id).toBe(user.organisationId);
    // A session only from sign-in on (no fixation: nothing existed before), and a new CSRF token.
    expect(sessionCookie(before)).toBeUndefined();
    expect(sessionCookie(res)).toBeDefined();
    expect(res.body.csrfToken).not.toBe(before.body.csrfToken);
    const me = await agent.get('/api/session').expect(200);
    expect(me.body.user.id).toBe(user.id);
    expect((await User.findByPk(user.id))!.lastSignedInAt).not.toBeNull();
  });

  it('refuses a wrong password with 401 and stays anonymous', async () => {
    const app = createApp();
    const user = await buildUser();
    const agent = await anonymousAgent(app);
    const res = await agent.post('/api/session').send({ email: user.email, password: 'not-the-password' }).expect(401);
    expect(res.body.error.code).toBe('unauthenticated');
    expect((await agent.get('/api/session')).body.user).toBeNull();
  });

  it('refuses an unknown e-mail with the same answer as a wrong password', async () => {
    const app = createApp();
    const agent = await anonymousAgent(app);
    const res = await agent.post('/api/session').send({ email: 'nobody-here@test.example', password: 'whatever-it-is' });
    expect(res.status).toBe(401);
    expect(res.body.error.message).toBe('Wrong e-mail or password.');
  });

  it('refuses a deactivated user', async () => {
    const app = createApp();
    const user = await buildUser({ deactivated: true });
    const agent = await anonymousAgent(app);
    await agent.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(401);
  });

  it('answers 400 naming the field on a bad body', async () => {
    const agent = await anonymousAgent(createApp());
    const res = await agent.post('/api/session').send({ email: 'not-an-address', password: 'x' }).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_request', field: 'email' });
    const missing = await agent.post('/api/session').send({}).expect(400);
    expect(missing.body.error.field).toBe('email');
  });

  it('refuses sign-in without the CSRF token (403)', async () => {
    const app = createApp();
    const user = await buildUser();
    const agent = request.agent(app);
    await agent.get('/api/session').expect(200);
    const res = await agent.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(403);
    expect(res.body.error.code).toBe('csrf');
    const forged = await agent
      .post('/api/session')
      .set(CSRF_HEADER, 'A'.repeat(43))
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(forged.status).toBe(403);
  });

  it('limits failed attempts per client (429), and does not count successful ones', async () => {
    const app = createApp({ limits: { perAccount: 3 } });
    const user = await buildUser();
    const agent = await anonymousAgent(app);
    const ok = await agent.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    agent.set(CSRF_HEADER, ok.body.csrfToken);
    for (let i = 0; i < 3; i += 1) {
      await agent.post('/api/session').send({ email: user.email, password: `wrong-${i}-password` }).expect(401);
    }
    const blocked = await agent.post('/api/session').send({ email: user.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
  });
});

describe('DELETE /api/session (sign out)', () => {
  it('signs out: the next request is anonymous and guarded routes answer 401', async () => {
    const app = createApp();
    const agent = await signedInAgent(app, await buildUser({ role: 'admin' }));
    await agent.get('/api/users').expect(200);
    const res = await agent.delete('/api/session').expect(200);
    expect(res.body.user).toBeNull();
    await agent.get('/api/users').expect(401);
  });

  it('answers 401 to anonymous callers', async () => {
    const agent = await anonymousAgent(createApp());
    await agent.delete('/api/session').expect(401);
  });
});

describe('PUT /api/session/password', () => {
  it('changes the password: the old one stops working, the new one works, other sessions end', async () => {
    const app = createApp();
    const user = await buildUser();
    const agent = await signedInAgent(app, user);
    const elsewhere = await signedInAgent(app, user);
    await agent
      .put('/api/session/password')
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'a-brand-new-passphrase' })
      .expect(204);
    expect((await agent.get('/api/session')).body.user.id).toBe(user.id);
    expect((await elsewhere.get('/api/session')).body.user).toBeNull();
    const fresh = await anonymousAgent(app);
    await fresh.post('/api/session').send({ email: user.email, password: TEST_PASSWORD }).expect(401);
    await fresh.post('/api/session').send({ email: user.email, password: 'a-brand-new-passphrase' }).expect(200);
  });

  it('refuses a wrong current password (400 on currentPassword)', async () => {
    const agent = await signedInAgent(createApp(), await buildUser());
    const res = await agent
      .put('/api/session/password')
      .send({ currentPassword: 'not-my-password', newPassword: 'another-long-passphrase' })
      .expect(400);
    expect(res.body.error.field).toBe('currentPassword');
  });

  it('refuses a short new password (400 on newPassword)', async () => {
    const agent = await signedInAgent(createApp(), await buildUser());
    const res = await agent
      .put('/api/session/password')
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'short' })
      .expect(400);
    expect(res.body.error.field).toBe('newPassword');
  });

  it('answers 401 to anonymous callers', async () => {
    const agent = await anonymousAgent(createApp());
    await agent.put('/api/session/password').send({ currentPassword: 'x', newPassword: 'y' }).expect(401);
  });
});

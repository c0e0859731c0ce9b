import { beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import type { UserDTO } from '../../../shared/api/users';
import { TEST_PASSWORD, anonymousAgent, buildTeam, buildUser, signedInAgent, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});

describe('GET /api/users', () => {
  it("lists the admin's organisation only, without password hashes", async () => {
    const team = await buildTeam();
    const stranger = await buildUser({ role: 'admin' });
    const agent = await signedInAgent(app, team.admin);
    const res = await agent.get('/api/users').expect(200);
    const ids = (res.body.users as UserDTO[]).map((u) => u.id).sort();
    expect(ids).toEqual([team.admin.id, team.lead.id, team.engineer.id, team.viewer.id].sort());
    expect(ids).not.toContain(stranger.id);
    for (const user of res.body.users) {
      expect(Object.keys(user).sort()).toEqual(['active', 'createdAt', 'email', 'id', 'lastSignedInAt', 'name', 'role']);
    }
  });

  it('is forbidden to a lead (403) and to anonymous callers (401)', async () => {
    const team = await buildTeam();
    await (await signedInAgent(app, team.lead)).get('/api/users').expect(403);
    await (await anonymousAgent(app)).get('/api/users').expect(401);
  });
});

describe('PUT /api/users/:id/role', () => {
  it('changes a role, and the new role takes effect on the next request', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const viewer = await signedInAgent(app, team.viewer);
    await viewer.get('/api/users').expect(403);
    const res = await admin.put(`/api/users/${team.viewer.id}/role`).send({ role: 'admin' }).expect(200);
    expect(res.body).toMatchObject({ id: team.viewer.id, role: 'admin' });
    await viewer.get('/api/users').expect(200);
  });

  it('answers 400 on an unknown role or a malformed id', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const bad = await admin.put(`/api/users/${team.lead.id}/role`).send({ role: 'owner' }).expect(400);
    expect(bad.body.error.field).toBe('role');
    await admin.put('/api/users/not-a-uuid/role').send({ role: 'lead' }).expect(400);
  });

  it('answers 404 for a user of another organisation', async () => {
    const team = await buildTeam();
    const stranger = await buildUser({ role: 'viewer' });
    const admin = await signedInAgent(app, team.admin);
    await admin.put(`/api/users/${stranger.id}/role`).send({ role: 'lead' }).expect(404);
  });

  it('refuses an admin changing their own role (409), so an organisation keeps an admin', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const res = await admin.put(`/api/users/${team.admin.id}/role`).send({ role: 'viewer' }).expect(409);
    expect(res.body.error.code).toBe('conflict');
  });

  it('is forbidden to an engineer (403)', async () => {
    const team = await buildTeam();
    const engineer = await signedInAgent(app, team.engineer);
    await engineer.put(`/api/users/${team.engineer.id}/role`).send({ role: 'admin' }).expect(403);
  });
});

describe('POST /api/users/:id/deactivate', () => {
  it('deactivates: their live session stops working and they cannot sign in again', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const engineer = await signedInAgent(app, team.engineer);
    expect((await engineer.get('/api/session')).body.user.id).toBe(team.engineer.id);
    const res = await admin.post(`/api/users/${team.engineer.id}/deactivate`).expect(200);
    expect(res.body).toMatchObject({ id: team.engineer.id, active: false });
    expect((await engineer.get('/api/session')).body.user).toBeNull();
    await engineer.get('/api/no-such-route').expect(401);
    const again = await anonymousAgent(app);
    await again.post('/api/session').send({ email: team.engineer.email, password: TEST_PASSWORD }).expect(401);
  });

  it('refuses deactivating yourself (409) and is forbidden to a lead (403)', async () => {
    const team = await buildTeam();
    await (await signedInAgent(app, team.admin)).post(`/api/users/${team.admin.id}/deactivate`).expect(409);
    await (await signedInAgent(app, team.lead)).post(`/api/users/${team.viewer.id}/deactivate`).expect(403);
  });
});

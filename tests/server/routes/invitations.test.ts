import { beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import { anonymousAgent, buildTeam, buildUser, invitationTokenMailedTo, mailTo, signedInAgent, uniqueEmail, useDatabase, useMail } from '../../support';

useDatabase();
useMail();

let app: Express;
beforeAll(() => {
  app = createApp();
});

/** The one-time token of the `count`-th invitation mailed to an address, read from the catcher's outbox. */
const tokenMailedTo = invitationTokenMailedTo;

describe('the invitation flow', () => {
  it('invite → the mail holds a one-time link → accept sets a password → sign in → the link is spent', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const email = uniqueEmail('invitee');

    const invited = await admin.post('/api/invitations').send({ email, name: 'Noor Halvorsen', role: 'engineer' }).expect(201);
    expect(invited.body).toMatchObject({ email, name: 'Noor Halvorsen', role: 'engineer', acceptedAt: null });
    expect(JSON.stringify(invited.body)).not.toMatch(/token/i);

    const [mail] = await mailTo(email);
    expect(mail.subject).toContain(team.organisation.name);
    expect(mail.organisationId).toBe(team.organisation.id);
    const token = await tokenMailedTo(email);
    expect(mail.html).toContain(token);

    const listed = await admin.get('/api/invitations').expect(200);
    expect(listed.body.invitations.map((i: { email: string }) => i.email)).toContain(email);

    const visitor = await anonymousAgent(app);
    const preview = await visitor.get(`/api/invitations/token/${token}`).expect(200);
    expect(preview.body).toEqual({ email, name: 'Noor Halvorsen', role: 'engineer', organisationName: team.organisation.name });

    const accepted = await visitor
      .post(`/api/invitations/token/${token}/accept`)
      .send({ name: 'Noor Halvorsen', password: 'points-and-signals-42' })
      .expect(201);
    expect(accepted.body).toMatchObject({ email, role: 'engineer', active: true });

    const signedIn = await visitor.post('/api/session').send({ email, password: 'points-and-signals-42' }).expect(200);
    expect(signedIn.body.user.role).toBe('engineer');
    expect(signedIn.body.organisation.id).toBe(team.organisation.id);

    const late = await anonymousAgent(app);
    await late.get(`/api/invitations/token/${token}`).expect(404);
    await late.post(`/api/invitations/token/${token}/accept`).send({ name: 'Someone', password: 'another-password-1' }).expect(404);
    const after = await admin.get('/api/invitations').expect(200);
    expect(after.body.invitations.map((i: { email: string }) => i.email)).not.toContain(email);
  });

  it('refuses inviting an address that already has an account (409 on email)', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const res = await admin.post('/api/invitations').send({ email: team.viewer.email, name: 'Again', role: 'viewer' }).expect(409);
    expect(res.body.error.field).toBe('email');
  });

  it('answers 400 on a bad body, naming the field', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    expect((await admin.post('/api/invitations').send({ email: 'x', name: 'X', role: 'viewer' }).expect(400)).body.error.field).toBe('email');
    expect((await admin.post('/api/invitations').send({ email: uniqueEmail(), name: '', role: 'viewer' }).expect(400)).body.error.field).toBe('name');
    expect((await admin.post('/api/invitations').send({ email: uniqueEmail(), name: 'X', role: 'root' }).expect(400)).body.error.field).toBe('role');
  });

  it('refuses a weak password on accept (400) and leaves the link usable', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const email = uniqueEmail('weak');
    await admin.post('/api/invitations').send({ email, name: 'Wren', role: 'viewer' }).expect(201);
    const token = await tokenMailedTo(email);
    const visitor = await anonymousAgent(app);
    const res = await visitor.post(`/api/invitations/token/${token}/accept`).send({ name: 'Wren', password: 'short' }).expect(400);
    expect(res.body.error.field).toBe('password');
    await visitor.get(`/api/invitations/token/${token}`).expect(200);
  });

  it('a newer invitation to the same address retires the older link; revoking ends the newer one', async () => {
    const team = await buildTeam();
    const admin = await signedInAgent(app, team.admin);
    const email = uniqueEmail('twice');
    await admin.post('/api/invitations').send({ email, name: 'Ola', role: 'viewer' }).expect(201);
    const first = await tokenMailedTo(email);
    const second = await admin.post('/api/invitations').send({ email, name: 'Ola', role: 'lead' }).expect(201);
    const secondToken = await tokenMailedTo(email, 2);
    const visitor = await anonymousAgent(app);
    await visitor.get(`/api/invitations/token/${first}`).expect(404);
    expect((await visitor.get(`/api/invitations/token/${secondToken}`).expect(200)).body.role).toBe('lead');
    await admin.delete(`/api/invitations/${second.body.id}`).expect(204);
    await visitor.get(`/api/invitations/token/${secondToken}`).expect(404);
  });

  it('is forbidden to leads (403); an admin of another organisation cannot revoke (404)', async () => {
    const team = await buildTeam();
    const lead = await signedInAgent(app, team.lead);
    await lead.post('/api/invitations').send({ email: uniqueEmail(), name: 'X', role: 'viewer' }).expect(403);
    await lead.get('/api/invitations').expect(403);
    const admin = await signedInAgent(app, team.admin);
    const made = await admin.post('/api/invitations').send({ email: uniqueEmail(), name: 'Y', role: 'viewer' }).expect(201);
    const otherAdmin = await signedInAgent(app, await buildUser({ role: 'admin' }));
    await otherAdmin.delete(`/api/invitations/${made.body.id}`).expect(404);
  });

  it('answers 400 to a malformed token and 404 to a well-formed unknown one', async () => {
    const visitor = await anonymousAgent(app);
    await visitor.get('/api/invitations/token/short').expect(400);
    await visitor.get(`/api/invitations/token/${'a'.repeat(43)}`).expect(404);
  });
});

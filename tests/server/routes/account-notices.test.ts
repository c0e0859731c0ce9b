import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { sendNotice } from '../../../server/mail';
import { NOTICE_KINDS } from '../../../shared/api/notices';
import { ROLES } from '../../../shared/roles';
import { anonymousAgent, buildTeam, signedInAgent, useDatabase, useMail } from '../../support';

useDatabase();
useMail();

let app: Express;
beforeAll(() => {
  app = createApp();
});

const ALL_ON = Object.fromEntries(NOTICE_KINDS.map((k) => [k, true]));

describe('GET/PUT /api/account/notices × role', () => {
  for (const role of ROLES) {
    it(`lets a ${role} read every kind (on until turned off) and turn one off for themself only`, async () => {
      const team = await buildTeam();
      const agent = await signedInAgent(app, team[role]);
      expect((await agent.get('/api/account/notices').expect(200)).body).toEqual({ notices: ALL_ON });

      const put = await agent.put('/api/account/notices').send({ notices: { budgetExceeded: false } }).expect(200);
      expect(put.body.notices).toEqual({ ...ALL_ON, budgetExceeded: false });
      expect((await agent.get('/api/account/notices').expect(200)).body.notices.budgetExceeded).toBe(false);

      // A teammate's settings are their own.
      const other = await signedInAgent(app, team[role === 'viewer' ? 'lead' : 'viewer']);
      expect((await other.get('/api/account/notices').expect(200)).body).toEqual({ notices: ALL_ON });
    });
  }

  it('answers 401 to anonymous callers', async () => {
    const agent = await anonymousAgent(app);
    expect((await agent.get('/api/account/notices')).status).toBe(401);
    expect((await agent.put('/api/account/notices').send({ notices: { taskAssigned: false } })).status).toBe(401);
  });
});

describe('PUT /api/account/notices', () => {
  it('keeps the kinds it does not name, and turns a kind on again', async () => {
    const { engineer } = await buildTeam();
    const agent = await signedInAgent(app, engineer);
    await agent.put('/api/account/notices').send({ notices: { taskAssigned: false, classesDrifted: false } }).expect(200);
    const res = await agent.put('/api/account/notices').send({ notices: { taskAssigned: true } }).expect(200);
    expect(res.body.notices).toEqual({ ...ALL_ON, classesDrifted: false });
  });

  it('is what sendNotice honours', async () => {
    const team = await buildTeam();
    await (await signedInAgent(app, team.lead)).put('/api/account/notices').send({ notices: { budgetExceeded: false } }).expect(200);
    const sent = await sendNotice({ kind: 'budgetExceeded', recipientIds: [team.lead.id, team.admin.id], compose: () => ({ subject: 's', text: 't', html: '<p>h</p>' }) });
    expect(sent.map((u) => u.email)).toEqual([team.admin.email]);
  });

  describe('bad input: 400 naming what was wrong, nothing stored', () => {
    const cases: [string, unknown, RegExp][] = [
      ['an unknown kind', { notices: { invitations: false } }, /Unknown notice kind "invitations"/],
      ['a value that is not true or false', { notices: { taskAssigned: 'no' } }, /notices\.taskAssigned: notices\.taskAssigned must be true or false/],
      ['no notices object', {}, /notices/],
      ['notices not an object', { notices: [false] }, /notices must be an object/],
      ['an extra top-level field', { notices: {}, userId: 'someone-else' }, /userId|Unrecognized/],
    ];
    for (const [what, body, message] of cases) {
      it(`refuses ${what}`, async () => {
        const { viewer } = await buildTeam();
        const agent = await signedInAgent(app, viewer);
        const res = await agent.put('/api/account/notices').send(body as object).expect(400);
        expect(res.body.error.message).toMatch(message);
        expect((await agent.get('/api/account/notices').expect(200)).body).toEqual({ notices: ALL_ON });
      });
    }
  });
});

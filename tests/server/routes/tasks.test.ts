import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import type { CloneClassPageDTO } from '../../../shared/api/snapshots';
import type { MemberListDTO, TaskAnswerDTO, TaskCommentAnswerDTO, TaskDetailDTO, TaskPageDTO } from '../../../shared/api/tasks';
import { buildRepository, buildTeam, buildUser, loadFolder, mailTo, RELEASES, signedInAgent, useDatabase, useMail } from '../../support';

useDatabase();
useMail();

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 120_000;

let app: Express;
beforeAll(() => {
  app = createApp();
});

const RULE = 'billing/tariff.js,yard/shunting.js';
const INSPECT = 'tools/depot_inspect.py,tools/inspect.py';

/** A team with a repository holding the demo's v1 (two classes), signed-in agents, and its classes by their paths. */
async function setup() {
  const team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id, name: `freight-${Date.now()}` });
  const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
  const lead = await signedInAgent(app, team.lead);
  const engineer = await signedInAgent(app, team.engineer);
  const viewer = await signedInAgent(app, team.viewer);
  const classes = ((await lead.get(`/api/snapshots/${snapshotId}/classes`).expect(200)).body as CloneClassPageDTO).classes;
  const byPaths = (paths: string) => classes.find((c) => c.paths.join(',') === paths)!;
  return { team, repository, snapshotId, lead, engineer, viewer, rule: byPaths(RULE), inspect: byPaths(INSPECT) };
}

async function taskCount(repositoryId: number): Promise<number> {
  const [{ n }] = await select<{ n: number }>(undefined, 'select count(*)::int as n from tasks where repository_id = $1', [repositoryId]);
  return n;
}

describe('POST /api/tasks', () => {
  it('creates a task on the class lineage for a lead, keeps a "created" entry, mails the assignee, and refuses a second open task on the lineage', { timeout: SLOW }, async () => {
    const { team, repository, lead, engineer, viewer, rule } = await setup();
    const res = await lead
      .post('/api/tasks')
      .send({ cloneClassId: rule.id, assigneeId: team.engineer.id, title: '  Merge the tariff rules  ', description: 'One rule, two callers.', dueOn: '2031-03-14' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const { task } = res.body as TaskAnswerDTO;
    expect(task).toMatchObject({
      title: 'Merge the tariff rules',
      description: 'One rule, two callers.',
      status: 'open',
      dueOn: '2031-03-14',
      overdue: false,
      repositoryId: repository.id,
      repositoryName: repository.name,
      lineageId: rule.lineageId,
      cloneClassId: rule.id,
      snapshotLabel: 'v1',
      assignee: { id: team.engineer.id, name: team.engineer.name },
      createdBy: { id: team.lead.id, name: team.lead.name },
      closedBySnapshot: null,
      commentCount: 0,
      comments: [],
    });
    expect(task.events).toHaveLength(1);
    expect(task.events[0]).toMatchObject({ kind: 'created', automatic: false, actor: { id: team.lead.id }, to: 'Open' });

    const [mail] = await mailTo(team.engineer.email);
    expect(mail.subject).toBe('Task assigned to you: Merge the tariff rules');
    expect(mail.text).toContain(`${team.lead.name} assigned you a refactor task in ${repository.name}: "Merge the tariff rules", due on 2031-03-14.`);
    expect(mail.text).toContain(`/tasks/${task.id}`);

    const again = await lead.post('/api/tasks').send({ cloneClassId: rule.id, assigneeId: team.engineer.id, title: 'Again' });
    expect(again.status).toBe(409);
    expect(again.body.error.field).toBe('cloneClassId');

    // everyone in the organisation reads it; an engineer finds it under "mine"
    expect(((await viewer.get(`/api/tasks/${task.id}`).expect(200)).body as TaskDetailDTO).title).toBe('Merge the tariff rules');
    const mine = (await engineer.get('/api/tasks?assignee=me').expect(200)).body as TaskPageDTO;
    expect(mine.tasks.map((t) => t.id)).toEqual([task.id]);
    // the class page finds the lineage's open task
    const ofLineage = (await viewer.get(`/api/tasks?lineageId=${rule.lineageId}&status=active`).expect(200)).body as TaskPageDTO;
    expect(ofLineage.tasks.map((t) => t.id)).toEqual([task.id]);
    expect(await taskCount(repository.id)).toBe(1);
  });

  it('answers 400 naming the field for bad bodies and assignees who cannot work, 404 for another organisation\'s class, and stores nothing', { timeout: SLOW }, async () => {
    const { team, repository, lead, rule } = await setup();
    const deactivated = await buildUser({ role: 'engineer', organisation: team.organisation, deactivated: true });
    const stranger = await buildUser({ role: 'engineer' });
    const good = { cloneClassId: rule.id, assigneeId: team.engineer.id, title: 'Merge' };
    const cases: [object, string][] = [
      [{ ...good, title: '   ' }, 'title'],
      [{ ...good, title: 'x'.repeat(201) }, 'title'],
      [{ ...good, title: 'Merge\nBcc: someone@example.test' }, 'title'],
      [{ ...good, description: 'x'.repeat(5001) }, 'description'],
      [{ ...good, dueOn: '2026-02-30' }, 'dueOn'],
      [{ ...good, dueOn: 'next friday' }, 'dueOn'],
      [{ ...good, cloneClassId: String(rule.id) }, 'cloneClassId'],
      [{ ...good, assigneeId: 'priya' }, 'assigneeId'],
      [{ ...good, assigneeId: team.viewer.id }, 'assigneeId'],
      [{ ...good, assigneeId: deactivated.id }, 'assigneeId'],
      [{ ...good, assigneeId: stranger.id }, 'assigneeId'],
    ];
    for (const [body, field] of cases) {
      const res = await lead.post('/api/tasks').send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field, JSON.stringify(res.body)).toBe(field);
    }
    expect((await lead.post('/api/tasks').send({ ...good, priority: 'high' })).status).toBe(400);
    const other = await setup();
    expect((await lead.post('/api/tasks').send({ ...good, cloneClassId: other.rule.id })).status).toBe(404);
    expect(await taskCount(repository.id)).toBe(0);
    expect(await taskCount(other.repository.id)).toBe(0);
  });
  it('answers 409 for a class whose copies are gone from the latest snapshot', { timeout: SLOW }, async () => {
    const { team, repository, lead, inspect } = await setup();
    await loadFolder(repository, `${RELEASES}/v2`, 'v2');
    // v3 no longer has the inspection rule's copies in one class
    await loadFolder(repository, `${RELEASES}/v3`, 'v3');
    const res = await lead.post('/api/tasks').send({ cloneClassId: inspect.id, assigneeId: team.engineer.id, title: 'Too late' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ field: 'cloneClassId' });
    expect(res.body.error.message).toContain('v3');
    expect(await taskCount(repository.id)).toBe(0);
  });
});

describe('PATCH /api/tasks/:id', () => {
  it('lets the assignee move the status step by step, keeps each change with who, from and to, and leaves the rest to a lead', { timeout: SLOW }, async () => {
    const { team, lead, engineer, viewer, rule } = await setup();
    const created = (await lead.post('/api/tasks').send({ cloneClassId: rule.id, assigneeId: team.engineer.id, title: 'Merge' }).expect(201)).body as TaskAnswerDTO;
    const id = created.task.id;
    const otherEngineer = await signedInAgent(app, await buildUser({ role: 'engineer', organisation: team.organisation }));

    expect((await engineer.patch(`/api/tasks/${id}`).send({ status: 'in_progress' })).status).toBe(200);
    const done = await engineer.patch(`/api/tasks/${id}`).send({ status: 'done' });
    expect(done.status).toBe(409);
    expect(done.body.error.field).toBe('status');
    const review = (await engineer.patch(`/api/tasks/${id}`).send({ status: 'in_review' }).expect(200)).body as TaskAnswerDTO;
    expect(review.task.status).toBe('in_review');
    expect(review.task.events.slice(1).map((e) => [e.kind, e.from, e.to, e.actor?.id])).toEqual([
      ['status', 'Open', 'In progress', team.engineer.id],
      ['status', 'In progress', 'In review', team.engineer.id],
    ]);

    // another engineer, a viewer, and the assignee's edits a lead makes
    expect((await otherEngineer.patch(`/api/tasks/${id}`).send({ status: 'done' })).status).toBe(403);
    expect((await viewer.patch(`/api/tasks/${id}`).send({ status: 'done' })).status).toBe(403);
    expect((await engineer.patch(`/api/tasks/${id}`).send({ title: 'Mine now' })).status).toBe(403);
    expect((await engineer.patch(`/api/tasks/${id}`).send({ status: 'wont_do', reason: 'no' })).status).toBe(403);

    // won't do needs a reason, and the reason goes only with it
    const noReason = await lead.patch(`/api/tasks/${id}`).send({ status: 'wont_do' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.field).toBe('reason');
    expect((await lead.patch(`/api/tasks/${id}`).send({ status: 'in_progress', reason: 'x' })).status).toBe(400);
    expect((await lead.patch(`/api/tasks/${id}`).send({})).status).toBe(400);
    const closed = (await lead.patch(`/api/tasks/${id}`).send({ status: 'wont_do', reason: 'The yard module is retired next year.' }).expect(200)).body as TaskAnswerDTO;
    expect(closed.task).toMatchObject({ status: 'wont_do', wontDoReason: 'The yard module is retired next year.' });
    expect((await engineer.patch(`/api/tasks/${id}`).send({ status: 'open' })).status).toBe(403);

    // the lead reopens, edits, dates and reassigns; the new assignee is mailed
    const lead2 = await buildUser({ role: 'lead', organisation: team.organisation });
    const edited = (
      await lead.patch(`/api/tasks/${id}`).send({ status: 'open', title: 'Merge the tariff rules', assigneeId: lead2.id, dueOn: '2020-01-31' }).expect(200)
    ).body as TaskAnswerDTO;
    expect(edited.task).toMatchObject({ status: 'open', wontDoReason: null, title: 'Merge the tariff rules', assignee: { id: lead2.id }, dueOn: '2020-01-31', overdue: true });
    expect(edited.task.events.slice(-4).map((e) => [e.kind, e.from, e.to])).toEqual([
      ['title', 'Merge', 'Merge the tariff rules'],
      ['assignee', team.engineer.name, lead2.name],
      ['due', null, '2020-01-31'],
      ['status', "Won't do", 'Open'],
    ]);
    const [mail] = await mailTo(lead2.email);
    expect(mail.subject).toBe('Task assigned to you: Merge the tariff rules');
    // the former assignee no longer works on it
    expect((await engineer.patch(`/api/tasks/${id}`).send({ status: 'in_progress' })).status).toBe(403);
    const cleared = (await lead.patch(`/api/tasks/${id}`).send({ dueOn: null }).expect(200)).body as TaskAnswerDTO;
    expect(cleared.task.dueOn).toBeNull();
    expect((await lead.patch(`/api/tasks/${id}`).send({ assigneeId: team.viewer.id })).status).toBe(400);
    expect((await lead.patch('/api/tasks/0x1').send({ status: 'open' })).status).toBe(400);
  });
});

describe('POST /api/tasks/:id/comments', () => {
  it('adds comments from engineers and up, lists them with the task, and refuses viewers and bad bodies', { timeout: SLOW }, async () => {
    const { team, lead, engineer, viewer, rule } = await setup();
    const id = ((await lead.post('/api/tasks').send({ cloneClassId: rule.id, assigneeId: team.lead.id, title: 'Merge' }).expect(201)).body as TaskAnswerDTO).task.id;
    const posted = (await engineer.post(`/api/tasks/${id}/comments`).send({ body: ' The yard copy has the fix; keep that one. ' }).expect(201)).body as TaskCommentAnswerDTO;
    expect(posted.comment).toMatchObject({ body: 'The yard copy has the fix; keep that one.', author: { id: team.engineer.id, name: team.engineer.name } });
    expect((await viewer.post(`/api/tasks/${id}/comments`).send({ body: 'hello' })).status).toBe(403);
    for (const body of [{ body: '   ' }, { body: 'x'.repeat(5001) }, {}, { body: 'ok', extra: 1 }]) {
      const res = await engineer.post(`/api/tasks/${id}/comments`).send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
    }
    const task = (await viewer.get(`/api/tasks/${id}`).expect(200)).body as TaskDetailDTO;
    expect(task.comments.map((c) => c.body)).toEqual(['The yard copy has the fix; keep that one.']);
    expect(task.commentCount).toBe(1);
    const other = await setup();
    expect((await other.engineer.post(`/api/tasks/${id}/comments`).send({ body: 'not mine' })).status).toBe(404);
    expect((await other.viewer.get(`/api/tasks/${id}`)).status).toBe(404);
  });
});

describe('GET /api/tasks', () => {
  it('filters by assignee, status, repository and overdue, sorts, and pages with a bounded page size', { timeout: SLOW }, async () => {
    const { team, repository, lead, engineer, rule, inspect } = await setup();
    const a = ((await lead.post('/api/tasks').send({ cloneClassId: rule.id, assigneeId: team.engineer.id, title: 'B tariff', dueOn: '2020-05-01' }).expect(201)).body as TaskAnswerDTO).task;
    const b = ((await lead.post('/api/tasks').send({ cloneClassId: inspect.id, assigneeId: team.lead.id, title: 'A inspect', dueOn: '2099-01-01' }).expect(201)).body as TaskAnswerDTO).task;
    const ids = async (query: string) => ((await lead.get(`/api/tasks?${query}`).expect(200)).body as TaskPageDTO).tasks.map((t) => t.id);

    expect(await ids(`assignee=${team.engineer.id}`)).toEqual([a.id]);
    expect(((await engineer.get('/api/tasks?assignee=me').expect(200)).body as TaskPageDTO).tasks.map((t) => t.id)).toEqual([a.id]);
    expect(await ids('overdue=1')).toEqual([a.id]);
    expect(await ids(`repositoryId=${repository.id}&sort=title`)).toEqual([b.id, a.id]);
    expect(await ids('sort=due')).toEqual([a.id, b.id]);
    expect(await ids('sort=due&order=desc')).toEqual([b.id, a.id]);
    await lead.patch(`/api/tasks/${b.id}`).send({ status: 'in_progress' }).expect(200);
    expect(await ids('status=in_progress')).toEqual([b.id]);
    expect(await ids('status=active&sort=status')).toEqual([a.id, b.id]);
    expect(await ids('status=closed')).toEqual([]);
    const page = (await lead.get('/api/tasks?sort=title&pageSize=1&page=2').expect(200)).body as TaskPageDTO;
    expect(page).toMatchObject({ total: 2, page: 2, pageSize: 1 });
    expect(page.tasks.map((t) => t.id)).toEqual([a.id]);

    for (const [query, field] of [
      ['pageSize=101', 'pageSize'],
      ['status=finished', 'status'],
      ['assignee=someone', 'assignee'],
      ['repositoryId=0x1', 'repositoryId'],
      ['sort=priority', 'sort'],
      ['colour=red', undefined],
    ] as const) {
      const res = await lead.get(`/api/tasks?${query}`);
      expect(res.status, query).toBe(400);
      if (field) expect(res.body.error.field).toBe(field);
    }
    // another organisation sees none of them
    const other = await setup();
    expect(((await other.lead.get('/api/tasks').expect(200)).body as TaskPageDTO).total).toBe(0);
  });
});

describe('GET /api/members', () => {
  it("lists the organisation's active members for a lead, read-only, and refuses engineers", { timeout: SLOW }, async () => {
    const team = await buildTeam();
    const gone = await buildUser({ role: 'engineer', organisation: team.organisation, deactivated: true });
    const lead = await signedInAgent(app, team.lead);
    const { members } = (await lead.get('/api/members').expect(200)).body as MemberListDTO;
    expect(members.map((m) => m.id).sort()).toEqual([team.admin.id, team.lead.id, team.engineer.id, team.viewer.id].sort());
    expect(members.map((m) => m.id)).not.toContain(gone.id);
    expect(Object.keys(members[0]).sort()).toEqual(['id', 'name', 'role']);
    expect((await (await signedInAgent(app, team.engineer)).get('/api/members')).status).toBe(403);
  });
});

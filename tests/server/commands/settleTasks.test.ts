import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import type { Repository } from '../../../server/models/Repository';
import type { CloneClassPageDTO } from '../../../shared/api/snapshots';
import type { TaskAnswerDTO, TaskDetailDTO } from '../../../shared/api/tasks';
import { buildRepository, buildTeam, loadFolder, mailTo, signedInAgent, useDatabase, useMail, type Agent } from '../../support';

useDatabase();
useMail();

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 240_000;

let app: Express;
const folders: string[] = [];
beforeAll(() => {
  app = createApp();
});
afterAll(() => {
  for (const folder of folders) fs.rmSync(folder, { recursive: true, force: true });
});

/** Two invented bodies of rail-freight code, each over the 50-token minimum and unlike each other. */
const WEIGH = (name: string) => `export function ${name}(train, limits) {
  const axleLoads = train.wagons.flatMap((wagon) => wagon.axles.map((axle) => ({ wagon: wagon.id, tonnes: axle.tonnes })));
  const heavy = axleLoads.filter((load) => load.tonnes > limits.maxAxleTonnes);
  const total = axleLoads.reduce((sum, load) => sum + load.tonnes, 0);
  if (total > limits.maxTrainTonnes) heavy.push({ wagon: 'train', tonnes: total });
  return { total, heavy, ok: heavy.length === 0 && train.wagons.length <= limits.maxWagons };
}
`;
const DISPATCH = (name: string) => `export function ${name}(slots, consignments) {
  const queue = [...consignments].sort((a, b) => a.readyAt - b.readyAt || b.priority - a.priority);
  const plan = [];
  for (const slot of slots) {
    const fits = queue.findIndex((c) => c.readyAt <= slot.departsAt && c.tonnes <= slot.capacity);
    if (fits < 0) continue;
    plan.push({ slot: slot.id, consignment: queue[fits].id });
    queue.splice(fits, 1);
  }
  return { plan, waiting: queue.map((c) => c.id) };
}
`;

/** Writes one invented release (path → text) into a temporary folder. */
function release(files: Record<string, string>): string {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-tasks-'));
  folders.push(folder);
  for (const [file, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(folder, file)), { recursive: true });
    fs.writeFileSync(path.join(folder, file), text);
  }
  return folder;
}

async function load(repository: Repository, label: string, files: Record<string, string>) {
  return (await loadFolder(repository, release(files), label)).snapshotId;
}

async function classesOf(agent: Agent, snapshotId: number) {
  const page = (await agent.get(`/api/snapshots/${snapshotId}/classes`).expect(200)).body as CloneClassPageDTO;
  return new Map(page.classes.map((c) => [c.paths.join(','), c]));
}

const task = async (agent: Agent, id: number) => (await agent.get(`/api/tasks/${id}`).expect(200)).body as TaskDetailDTO;

describe('the automatic check of refactor tasks on a load', () => {
  it('marks a task done when a later snapshot no longer has its copies, reopens it when they come back, and leaves other tasks alone', { timeout: SLOW }, async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const lead = await signedInAgent(app, team.lead);
    const engineer = await signedInAgent(app, team.engineer);
    const weighPair = { 'yard/weigh.js': WEIGH('weighTrain'), 'depot/weigh.js': WEIGH('weighTrain') };
    const dispatchPair = { 'yard/dispatch.js': DISPATCH('planSlots'), 'depot/dispatch.js': DISPATCH('planSlots') };

    const r1 = await load(repository, 'r1', { ...weighPair, ...dispatchPair });
    const first = await classesOf(lead, r1);
    const weigh = first.get('depot/weigh.js,yard/weigh.js')!;
    const dispatch = first.get('depot/dispatch.js,yard/dispatch.js')!;
    const create = async (cloneClassId: number, title: string) =>
      ((await lead.post('/api/tasks').send({ cloneClassId, assigneeId: team.engineer.id, title }).expect(201)).body as TaskAnswerDTO).task.id;
    const weighTask = await create(weigh.id, 'One axle-load check');
    const dispatchTask = await create(dispatch.id, 'One slot planner');
    await engineer.patch(`/api/tasks/${weighTask}`).send({ status: 'in_progress' }).expect(200);

    // r2: the depot's weighing copy was removed (the yard's is called from both): no class any more
    const r2 = await load(repository, 'r2', { 'yard/weigh.js': WEIGH('weighTrain'), ...dispatchPair });
    const done = await task(lead, weighTask);
    expect(done).toMatchObject({ status: 'done', closedBySnapshot: { id: r2, label: 'r2' } });
    const auto = done.events.at(-1)!;
    expect(auto).toMatchObject({ kind: 'status', automatic: true, actor: null, from: 'In progress', to: 'Done' });
    expect(auto.note).toContain('r2');
    // the other lineage still has its class: its task stays open
    expect((await task(lead, dispatchTask)).status).toBe('open');
    const [doneMail] = await mailTo(team.engineer.email, 3).then((m) => m.filter((x) => x.subject.startsWith('Task done by release')));
    expect(doneMail.subject).toBe('Task done by release r2: One axle-load check');
    expect(doneMail.text).toContain(`/tasks/${weighTask}`);

    // r3: nothing changes for the weighing copies: the task stays done, with no new entry
    const r3 = await load(repository, 'r3', { 'yard/weigh.js': WEIGH('weighTrain'), ...dispatchPair, 'README.md': 'yard tools' });
    expect(await task(lead, weighTask)).toMatchObject({ status: 'done', closedBySnapshot: { id: r2 } });
    expect((await task(lead, weighTask)).events).toHaveLength(done.events.length);
    expect(r3).toBeGreaterThan(r2);

    // r4: the copy is back (a new lineage, as lineages start afresh): the task reopens and follows it
    const r4 = await load(repository, 'r4', { ...weighPair, ...dispatchPair });
    const back = (await classesOf(lead, r4)).get('depot/weigh.js,yard/weigh.js')!;
    expect(back.lineageId).not.toBe(weigh.lineageId);
    const reopened = await task(lead, weighTask);
    expect(reopened).toMatchObject({ status: 'open', closedBySnapshot: null, lineageId: back.lineageId, cloneClassId: back.id, snapshotLabel: 'r4' });
    expect(reopened.events.at(-1)).toMatchObject({ kind: 'status', automatic: true, actor: null, from: 'Done', to: 'Open' });
    expect(reopened.events.at(-1)!.note).toContain('r4');
    const reopenedMail = (await mailTo(team.engineer.email, 4)).find((m) => m.subject.startsWith('Task reopened by release'));
    expect(reopenedMail?.subject).toBe('Task reopened by release r4: One axle-load check');
    expect((await task(lead, dispatchTask)).status).toBe('open');

    // a task a person marked done stays done when the copies go and come back
    await engineer.patch(`/api/tasks/${dispatchTask}`).send({ status: 'in_progress' }).expect(200);
    await engineer.patch(`/api/tasks/${dispatchTask}`).send({ status: 'in_review' }).expect(200);
    await engineer.patch(`/api/tasks/${dispatchTask}`).send({ status: 'done' }).expect(200);
    await load(repository, 'r5', { ...weighPair, 'yard/dispatch.js': DISPATCH('planSlots') });
    await load(repository, 'r6', { ...weighPair, ...dispatchPair });
    const manual = await task(lead, dispatchTask);
    expect(manual).toMatchObject({ status: 'done', closedBySnapshot: null });
    expect(manual.events.filter((e) => e.automatic)).toEqual([]);
    expect((await task(lead, weighTask)).status).toBe('open');
  });

  it('reopens one task only when the copies of two closed tasks come back as one class', { timeout: SLOW }, async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const lead = await signedInAgent(app, team.lead);
    const r1 = await load(repository, 'r1', { 'a/weigh.js': WEIGH('weighTrain'), 'b/weigh.js': WEIGH('weighTrain'), 'c/plan.js': DISPATCH('planSlots'), 'd/plan.js': DISPATCH('planSlots') });
    const first = await classesOf(lead, r1);
    const create = async (cloneClassId: number, title: string) =>
      ((await lead.post('/api/tasks').send({ cloneClassId, assigneeId: team.engineer.id, title }).expect(201)).body as TaskAnswerDTO).task.id;
    const weighTask = await create(first.get('a/weigh.js,b/weigh.js')!.id, 'Weighing');
    const planTask = await create(first.get('c/plan.js,d/plan.js')!.id, 'Planning');

    await load(repository, 'r2', { 'a/weigh.js': WEIGH('weighTrain'), 'c/plan.js': DISPATCH('planSlots') });
    expect([(await task(lead, weighTask)).status, (await task(lead, planTask)).status]).toEqual(['done', 'done']);

    // both returning copies are now the weighing routine: one class holds members of both lineages
    const r3 = await load(repository, 'r3', { 'a/weigh.js': WEIGH('weighTrain'), 'b/weigh.js': WEIGH('weighTrain'), 'c/plan.js': WEIGH('planSlots'), 'd/plan.js': WEIGH('planSlots') });
    const merged = (await classesOf(lead, r3)).get('a/weigh.js,b/weigh.js,c/plan.js,d/plan.js')!;
    expect(await task(lead, weighTask)).toMatchObject({ status: 'open', lineageId: merged.lineageId });
    expect(await task(lead, planTask)).toMatchObject({ status: 'done', closedBySnapshot: { label: 'r2' } });
  });
});

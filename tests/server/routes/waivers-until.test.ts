import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import type { CloneClassDetailDTO, CloneClassPageDTO, SnapshotDTO } from '../../../shared/api/snapshots';
import { buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 120_000;
const RULE = 'billing/tariff.js,yard/shunting.js';
const INSPECTION = 'tools/depot_inspect.py,tools/inspect.py';

let app: Express;
beforeAll(() => {
  app = createApp();
});

describe('a waiver "until release …"', () => {
  it('holds before that release and ends by itself when it, or a later version, is loaded, saying why', { timeout: SLOW * 3 }, async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const lead = await signedInAgent(app, team.lead);
    const classesOf = async (snapshotId: number) => ((await lead.get(`/api/snapshots/${snapshotId}/classes`).expect(200)).body as CloneClassPageDTO).classes;
    const byPaths = async (snapshotId: number, paths: string) => (await classesOf(snapshotId)).find((c) => c.paths.join(',') === paths)!;

    const v1 = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    // The inspection rule until exactly "2026.10"; the pricing rule until "2026.10.5", a release that is never loaded.
    await lead.post(`/api/clone-classes/${(await byPaths(v1.snapshotId, INSPECTION)).id}/waiver`).send({ reason: 'Depot tools retire in 2026.10', untilLabel: '2026.10' }).expect(201);
    await lead.post(`/api/clone-classes/${(await byPaths(v1.snapshotId, RULE)).id}/waiver`).send({ reason: 'Yard rewrite', untilLabel: '2026.10.5' }).expect(201);

    // 2026.10 is the inspection rule's release: its waiver ends, saying why.
    const v2 = await loadFolder(repository, `${RELEASES}/v2`, '2026.10');
    const inspection = await byPaths(v2.snapshotId, INSPECTION);
    expect(inspection.waiver).toBeNull();
    const inspectionDetail = (await lead.get(`/api/clone-classes/${inspection.id}`).expect(200)).body as CloneClassDetailDTO;
    expect(inspectionDetail.waiverEnded).toMatchObject({ snapshotLabel: '2026.10', reason: 'it was waived until release 2026.10' });
    // The pricing rule's member was edited, none joined, and 2026.10 comes before 2026.10.5: its waiver holds.
    const rule = await byPaths(v2.snapshotId, RULE);
    expect(rule.waiver).toMatchObject({ reason: 'Yard rewrite', untilLabel: '2026.10.5' });
    // The ended waiver counts again in 2026.10's unwaived figure; the one still active does not.
    const second = ((await lead.get(`/api/snapshots/${v2.snapshotId}`).expect(200)).body as SnapshotDTO).metrics!;
    expect(second.unwaivedCloneRatio).toBeLessThan(second.cloneRatio);
    expect(second.unwaivedCloneRatio).toBeGreaterThan(0);

    // 2026.11 is a later version than 2026.10.5 (11 > 10, number by number): that waiver ends too.
    // (A copy also joins the class in this release; the release is the reason given, checked first.)
    const v3 = await loadFolder(repository, `${RELEASES}/v3`, '2026.11');
    const [later] = await classesOf(v3.snapshotId);
    expect(later.lineageId).toBe(rule.lineageId);
    expect(later.waiver).toBeNull();
    const laterDetail = (await lead.get(`/api/clone-classes/${later.id}`).expect(200)).body as CloneClassDetailDTO;
    expect(laterDetail.waiverEnded).toMatchObject({ snapshotLabel: '2026.11', reason: 'it was waived until release 2026.10.5' });
    const third = ((await lead.get(`/api/snapshots/${v3.snapshotId}`).expect(200)).body as SnapshotDTO).metrics!;
    expect(third.unwaivedCloneRatio).toBe(third.cloneRatio);
  });

  it('cannot be given until a release that is already loaded (400 naming the field), and nothing is stored', { timeout: SLOW }, async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const lead = await signedInAgent(app, team.lead);
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, '2026.10');
    const [first] = ((await lead.get(`/api/snapshots/${snapshotId}/classes`).expect(200)).body as CloneClassPageDTO).classes;
    for (const untilLabel of ['2026.10', '2026.9']) {
      const res = await lead.post(`/api/clone-classes/${first.id}/waiver`).send({ reason: 'Too late', untilLabel }).expect(400);
      expect(res.body.error).toMatchObject({ field: 'untilLabel' });
      expect(res.body.error.message).toBe(`Until release: "${untilLabel}" is already loaded (the latest snapshot is 2026.10); name a later release, or leave it out.`);
    }
    expect(((await lead.get(`/api/clone-classes/${first.id}`).expect(200)).body as CloneClassDetailDTO).waiver).toBeNull();
    await lead.post(`/api/clone-classes/${first.id}/waiver`).send({ reason: 'Until the next one', untilLabel: '2026.11' }).expect(201);
  });
});

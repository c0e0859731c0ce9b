import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import type { CloneClassDetailDTO, CloneClassPageDTO, SnapshotDTO, WaiverCreatedDTO } from '../../../shared/api/snapshots';
import type { RepositoryDTO } from '../../../shared/api/repositories';
import { anonymousAgent, buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 120_000;

let app: Express;
beforeAll(() => {
  app = createApp();
});

const RULE = 'billing/tariff.js,yard/shunting.js';

async function releases(versions: string[]) {
  const team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id });
  const loads = [];
  for (const v of versions) loads.push(await loadFolder(repository, `${RELEASES}/${v}`, v));
  const lead = await signedInAgent(app, team.lead);
  const classes = (await lead.get(`/api/snapshots/${loads[0].snapshotId}/classes`).expect(200)).body as CloneClassPageDTO;
  const rule = classes.classes.find((c) => c.paths.join(',') === RULE)!;
  return { team, repository, loads, lead, rule };
}

describe('POST and DELETE /api/clone-classes/:id/waiver', () => {
  it('waives a class lineage, lists it apart with a count, shows both ratios, and lifts it', { timeout: SLOW }, async () => {
    const { team, repository, loads, lead, rule } = await releases(['v1']);
    expect(rule.waiver).toBeNull();
    const created = await lead.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: ' Kept apart until the yard rewrite ', untilLabel: 'v4' }).expect(201);
    const { waiver } = created.body as WaiverCreatedDTO;
    expect(waiver).toMatchObject({ reason: 'Kept apart until the yard rewrite', untilLabel: 'v4', createdByName: team.lead.name });
    expect(Date.parse(waiver.createdAt)).not.toBeNaN();
    // a second waiver of the same lineage conflicts
    await lead.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'again' }).expect(409);

    const viewer = await signedInAgent(app, team.viewer);
    const v1 = loads[0].snapshotId;
    const all = (await viewer.get(`/api/snapshots/${v1}/classes`).expect(200)).body as CloneClassPageDTO;
    expect(all.total).toBe(2);
    expect(all.waivedCount).toBe(1);
    const only = (await viewer.get(`/api/snapshots/${v1}/classes?waived=only`).expect(200)).body as CloneClassPageDTO;
    expect(only.classes.map((c) => c.id)).toEqual([rule.id]);
    expect(only.total).toBe(1);
    expect(only.classes[0].waiver?.reason).toBe('Kept apart until the yard rewrite');
    const rest = (await viewer.get(`/api/snapshots/${v1}/classes?waived=exclude`).expect(200)).body as CloneClassPageDTO;
    expect(rest.classes.map((c) => c.paths)).toEqual([['tools/depot_inspect.py', 'tools/inspect.py']]);
    expect(rest).toMatchObject({ total: 1, waivedCount: 1 });
    const detail = (await viewer.get(`/api/clone-classes/${rule.id}`).expect(200)).body as CloneClassDetailDTO;
    expect(detail.waiver?.untilLabel).toBe('v4');
    expect(detail.waiverEnded).toBeNull();

    const snapshot = (await viewer.get(`/api/snapshots/${v1}`).expect(200)).body as SnapshotDTO;
    expect(snapshot.metrics!.unwaivedCloneRatio).toBeLessThan(snapshot.metrics!.cloneRatio);
    const listed = (await viewer.get(`/api/repositories/${repository.id}`).expect(200)).body as RepositoryDTO;
    expect(listed.latestSnapshot!.unwaivedCloneRatio).toBeCloseTo(snapshot.metrics!.unwaivedCloneRatio, 12);

    await lead.delete(`/api/clone-classes/${rule.id}/waiver`).expect(204);
    await lead.delete(`/api/clone-classes/${rule.id}/waiver`).expect(404);
    const lifted = (await viewer.get(`/api/snapshots/${v1}/classes?waived=only`).expect(200)).body as CloneClassPageDTO;
    expect(lifted).toMatchObject({ total: 0, waivedCount: 0, classes: [] });
    const after = (await viewer.get(`/api/snapshots/${v1}`).expect(200)).body as SnapshotDTO;
    expect(after.metrics!.unwaivedCloneRatio).toBe(after.metrics!.cloneRatio);
  });

  it('shows on the class that its waiver ended when a new member joined', { timeout: SLOW }, async () => {
    const { team, repository, lead, rule } = await releases(['v1']);
    await lead.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'Accepted for now' }).expect(201);
    const v3 = await loadFolder(repository, `${RELEASES}/v3`, 'v3');
    const viewer = await signedInAgent(app, team.viewer);
    const page = (await viewer.get(`/api/snapshots/${v3.snapshotId}/classes?path=quotes`).expect(200)).body as CloneClassPageDTO;
    expect(page.waivedCount).toBe(0);
    const joined = page.classes.find((c) => c.lineageId === rule.lineageId)!;
    expect(joined.waiver).toBeNull();
    expect(joined.waiverEnded?.snapshotLabel).toBe('v3');
    expect(joined.waiverEnded?.reason).toMatch(/^a new member joined: billing\/quotes\.js /);
  });

  it('answers 400 for a bad body, 401 anonymous, 403 below lead, 404 for another organisation', { timeout: SLOW }, async () => {
    const { team, lead, rule } = await releases(['v1']);
    const bad = await lead.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: '   ' }).expect(400);
    expect(bad.body.error.field).toBe('reason');
    const long = await lead.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'x'.repeat(501) }).expect(400);
    expect(long.body.error.field).toBe('reason');
    await lead.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'ok', extra: 1 }).expect(400);
    await lead.post('/api/clone-classes/abc/waiver').send({ reason: 'ok' }).expect(400);
    expect((await (await anonymousAgent(app)).post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'ok' })).status).toBe(401);
    expect((await (await anonymousAgent(app)).delete(`/api/clone-classes/${rule.id}/waiver`)).status).toBe(401);
    const engineer = await signedInAgent(app, team.engineer);
    await engineer.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'ok' }).expect(403);
    await engineer.delete(`/api/clone-classes/${rule.id}/waiver`).expect(403);
    const stranger = await signedInAgent(app, (await buildTeam()).lead);
    await stranger.post(`/api/clone-classes/${rule.id}/waiver`).send({ reason: 'ok' }).expect(404);
    await stranger.delete(`/api/clone-classes/${rule.id}/waiver`).expect(404);
    // nothing stored by the refused requests
    const detail = (await lead.get(`/api/clone-classes/${rule.id}`).expect(200)).body as CloneClassDetailDTO;
    expect(detail.waiver).toBeNull();
  });
});

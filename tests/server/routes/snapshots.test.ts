import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import type { CloneClassDetailDTO, CloneClassPageDTO, SnapshotComparisonDTO } from '../../../shared/api/snapshots';
import { buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});

async function threeReleases() {
  const team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id });
  const loads = [];
  for (const v of ['v1', 'v2', 'v3']) loads.push(await loadFolder(repository, `${RELEASES}/${v}`, v));
  return { team, repository, loads };
}

describe('GET /api/snapshots/:id/classes', () => {
  it('sorts, filters by language, type, status and path, and pages on the server', async () => {
    const { team, loads } = await threeReleases();
    const viewer = await signedInAgent(app, team.viewer);
    const v1 = loads[0].snapshotId;
    const all = (await viewer.get(`/api/snapshots/${v1}/classes?sort=tokens&order=desc`).expect(200)).body as CloneClassPageDTO;
    expect(all.total).toBe(2);
    expect(all.classes[0].tokens).toBeGreaterThanOrEqual(all.classes[1].tokens);
    const python = (await viewer.get(`/api/snapshots/${v1}/classes?language=python`).expect(200)).body as CloneClassPageDTO;
    expect(python.classes.map((c) => c.paths)).toEqual([['tools/depot_inspect.py', 'tools/inspect.py']]);
    const byPath = (await viewer.get(`/api/snapshots/${v1}/classes?path=YARD`).expect(200)).body as CloneClassPageDTO;
    expect(byPath.classes.map((c) => c.language)).toEqual(['javascript']);
    const page2 = (await viewer.get(`/api/snapshots/${v1}/classes?pageSize=1&page=2&sort=tokens&order=desc`).expect(200)).body as CloneClassPageDTO;
    expect(page2.classes.map((c) => c.id)).toEqual([all.classes[1].id]);
    const drifted = (await viewer.get(`/api/snapshots/${loads[1].snapshotId}/classes?status=drifted`).expect(200)).body as CloneClassPageDTO;
    expect(drifted.classes.map((c) => c.paths)).toEqual([['billing/tariff.js', 'yard/shunting.js']]);
    const type1 = (await viewer.get(`/api/snapshots/${v1}/classes?type=1`).expect(200)).body as CloneClassPageDTO;
    expect(type1.classes.every((c) => c.cloneType === 1)).toBe(true);
  });

  it('answers 400 on a bad query and 404 for another organisation', async () => {
    const { team, loads } = await threeReleases();
    const viewer = await signedInAgent(app, team.viewer);
    const bad = await viewer.get(`/api/snapshots/${loads[0].snapshotId}/classes?pageSize=5000`).expect(400);
    expect(bad.body.error.field).toBe('pageSize');
    await viewer.get(`/api/snapshots/${loads[0].snapshotId}/classes?status=sideways`).expect(400);
    const stranger = await buildTeam();
    await (await signedInAgent(app, stranger.viewer)).get(`/api/snapshots/${loads[0].snapshotId}/classes`).expect(404);
  });
});

describe('GET /api/clone-classes/:id', () => {
  it("gives the members' code, what changed, and the pairs among them", async () => {
    const { team, loads } = await threeReleases();
    const viewer = await signedInAgent(app, team.viewer);
    const page = (await viewer.get(`/api/snapshots/${loads[1].snapshotId}/classes?status=drifted`).expect(200)).body as CloneClassPageDTO;
    const detail = (await viewer.get(`/api/clone-classes/${page.classes[0].id}`).expect(200)).body as CloneClassDetailDTO;
    expect(detail.members.map((m) => [m.path, m.name, m.changed])).toEqual([
      ['billing/tariff.js', 'priceConsignment', true],
      ['yard/shunting.js', 'quoteYardMove', false],
    ]);
    expect(detail.members[0].code).toMatch(/^export function priceConsignment\(wagons, distanceKm, contract\) \{/);
    expect(detail.members[0].code.split('\n')).toHaveLength(detail.members[0].endLine - detail.members[0].startLine + 1);
    expect(detail.pairs).toHaveLength(1);
    expect(detail.pairs[0].similarity).toBeGreaterThanOrEqual(0.8);
    await viewer.get('/api/clone-classes/0').expect(400);
    await viewer.get('/api/clone-classes/99999999').expect(404);
  });
});

describe('GET /api/snapshots/:id/comparison', () => {
  it('counts each status and lists the classes gone since the previous snapshot', async () => {
    const { team, loads } = await threeReleases();
    const viewer = await signedInAgent(app, team.viewer);
    const v3 = (await viewer.get(`/api/snapshots/${loads[2].snapshotId}/comparison`).expect(200)).body as SnapshotComparisonDTO;
    expect(v3.previous?.id).toBe(loads[1].snapshotId);
    expect(v3.counts).toMatchObject({ grown: 1, gone: 1, new: 0 });
    expect(v3.gone[0].paths).toEqual(['tools/depot_inspect.py', 'tools/inspect.py']);
    const v1 = (await viewer.get(`/api/snapshots/${loads[0].snapshotId}/comparison`).expect(200)).body as SnapshotComparisonDTO;
    expect(v1.previous).toBeNull();
    expect(v1.counts.new).toBe(2);
  });
});

describe('GET /api/snapshots/:id', () => {
  it('gives counts, timings and metrics of a loaded snapshot', async () => {
    const { team, loads } = await threeReleases();
    const res = await (await signedInAgent(app, team.viewer)).get(`/api/snapshots/${loads[0].snapshotId}`).expect(200);
    expect(res.body).toMatchObject({ label: 'v1', status: 'ready', fragmentCount: loads[0].fragmentCount, metrics: { pairCount: loads[0].pairCount } });
    expect(Object.keys(res.body.timings)).toEqual(expect.arrayContaining(['analyze', 'index', 'classes']));
  });
});

describe('another organisation', () => {
  it('gets 404 for a snapshot, its classes, its comparison and a class it does not own', async () => {
    const { team, loads } = await threeReleases();
    const page = (await (await signedInAgent(app, team.viewer)).get(`/api/snapshots/${loads[0].snapshotId}/classes`).expect(200)).body as CloneClassPageDTO;
    const stranger = await signedInAgent(app, (await buildTeam()).admin);
    const id = loads[0].snapshotId;
    for (const path of [`/api/snapshots/${id}`, `/api/snapshots/${id}/classes`, `/api/snapshots/${id}/comparison`, `/api/clone-classes/${page.classes[0].id}`]) {
      const res = await stranger.get(path).expect(404);
      expect(res.body.error.code, path).toBe('not_found');
    }
  });
});

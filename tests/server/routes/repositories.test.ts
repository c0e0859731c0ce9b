import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import type { RepositoryDTO, RepositoryMetricsDTO } from '../../../shared/api/repositories';
import { anonymousAgent, buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});

describe('GET /api/repositories', () => {
  it("lists the organisation's repositories with the latest snapshot and budget state", async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id, cloneBudget: 0.1 });
    const other = await buildRepository();
    const loaded = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
    const res = await (await signedInAgent(app, team.viewer)).get('/api/repositories').expect(200);
    const listed = res.body.repositories as RepositoryDTO[];
    expect(listed.map((r) => r.id)).toEqual([repository.id]);
    expect(listed.map((r) => r.id)).not.toContain(other.id);
    expect(listed[0].latestSnapshot).toMatchObject({ id: loaded.snapshotId, label: 'v1', cloneRatio: loaded.cloneRatio });
    expect(listed[0].overBudget).toBe(loaded.cloneRatio > 0.1);
  });

  it('answers 401 without a session', async () => {
    await (await anonymousAgent(app)).get('/api/repositories').expect(401);
  });
});

describe('POST /api/repositories', () => {
  it('creates a repository with default settings for a lead', async () => {
    const team = await buildTeam();
    const res = await (await signedInAgent(app, team.lead)).post('/api/repositories').send({ name: 'wagon-yard' }).expect(201);
    // 0.7: the default threshold chosen from the detection-quality benchmark (README "Why 0.7").
    expect(res.body).toMatchObject({ name: 'wagon-yard', threshold: 0.7, minTokens: 50, shingleSize: 3, ignore: [], cloneBudget: null, latestSnapshot: null });
  });

  it('keeps the threshold stored in an existing repository when the default changes', async () => {
    const team = await buildTeam();
    // A repository created while the default was 0.8 has 0.8 stored, and keeps it.
    const older = await buildRepository({ organisationId: team.organisation.id, threshold: 0.8 });
    const viewer = await signedInAgent(app, team.viewer);
    expect((await viewer.get(`/api/repositories/${older.id}`).expect(200)).body).toMatchObject({ threshold: 0.8 });
    // A row written without a threshold (SQL, not the app) gets the new default from the column.
    const [row] = await select<{ threshold: string }>(
      undefined,
      `insert into repositories (organisation_id, name) values ($1, 'raw-insert') returning threshold`,
      [team.organisation.id],
    );
    expect(Number(row!.threshold)).toBe(0.7);
  });

  it('answers 400 naming the field for a threshold under the index threshold or a bad name', async () => {
    const team = await buildTeam();
    const lead = await signedInAgent(app, team.lead);
    const low = await lead.post('/api/repositories').send({ name: 'ok', threshold: 0.5 }).expect(400);
    expect(low.body.error.field).toBe('threshold');
    const bad = await lead.post('/api/repositories').send({ name: '../etc' }).expect(400);
    expect(bad.body.error.field).toBe('name');
  });

  it('answers 409 for a name the organisation already uses, and 403 to an engineer', async () => {
    const team = await buildTeam();
    const lead = await signedInAgent(app, team.lead);
    await lead.post('/api/repositories').send({ name: 'dup' }).expect(201);
    await lead.post('/api/repositories').send({ name: 'dup' }).expect(409);
    await (await signedInAgent(app, team.engineer)).post('/api/repositories').send({ name: 'mine' }).expect(403);
  });

  it('answers 409 on name (not 500) when the unique constraint decides: a taken name, a rename, a race', async () => {
    const team = await buildTeam();
    const lead = await signedInAgent(app, team.lead);
    await lead.post('/api/repositories').send({ name: 'yard-a' }).expect(201);
    const taken = await lead.post('/api/repositories').send({ name: 'yard-a' }).expect(409);
    expect(taken.body.error).toMatchObject({ code: 'conflict', field: 'name' });
    expect(taken.body.error.message).toMatch(/already has this name/);
    const other = (await lead.post('/api/repositories').send({ name: 'yard-b' }).expect(201)).body as RepositoryDTO;
    const renamed = await lead.patch(`/api/repositories/${other.id}`).send({ name: 'yard-a' }).expect(409);
    expect(renamed.body.error.field).toBe('name');
    const race = await Promise.all([1, 2, 3, 4].map(() => lead.post('/api/repositories').send({ name: 'yard-c' })));
    expect(race.map((r) => r.status).sort()).toEqual([201, 409, 409, 409]);
    const names = (await lead.get('/api/repositories').expect(200)).body.repositories.map((r: RepositoryDTO) => r.name);
    expect(names).toEqual(['yard-a', 'yard-b', 'yard-c']);
  });
});

describe('PATCH /api/repositories/:id', () => {
  it('updates settings and the budget for a lead; 404 for another organisation', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const lead = await signedInAgent(app, team.lead);
    const res = await lead.patch(`/api/repositories/${repository.id}`).send({ threshold: 0.85, cloneBudget: 0.05, ignore: ['generated/'] }).expect(200);
    expect(res.body).toMatchObject({ threshold: 0.85, cloneBudget: 0.05, ignore: ['generated/'] });
    const stranger = await buildRepository();
    await lead.patch(`/api/repositories/${stranger.id}`).send({ minTokens: 40 }).expect(404);
    await lead.patch(`/api/repositories/${repository.id}`).send({ minTokens: 'many' }).expect(400);
    await (await signedInAgent(app, team.viewer)).patch(`/api/repositories/${repository.id}`).send({ minTokens: 40 }).expect(403);
  });
});

describe('DELETE /api/repositories/:id', () => {
  it('deletes the repository, its snapshots, and the file texts no other snapshot holds', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-delete-'));
    const unique = `export const marker = '${crypto.randomUUID()}';\n`;
    fs.writeFileSync(path.join(folder, 'marker.js'), unique);
    const loaded = await loadFolder(repository, folder, 'v1');
    const hash = crypto.createHash('sha256').update(unique).digest('hex');
    expect(await select(undefined, 'select 1 from file_contents where hash = $1', [hash])).toHaveLength(1);
    const lead = await signedInAgent(app, team.lead);
    await lead.delete(`/api/repositories/${repository.id}`).expect(204);
    await lead.get(`/api/repositories/${repository.id}`).expect(404);
    expect(await select(undefined, 'select 1 from snapshots where id = $1', [loaded.snapshotId])).toHaveLength(0);
    expect(await select(undefined, 'select 1 from file_contents where hash = $1', [hash])).toHaveLength(0);
    fs.rmSync(folder, { recursive: true });
    await (await signedInAgent(app, team.engineer)).delete(`/api/repositories/${repository.id}`).expect(403);
  });
});

describe('GET /api/repositories/:id/snapshots and /metrics', () => {
  it('lists snapshots newest first and the trend oldest first', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id, cloneBudget: 0.5 });
    for (const v of ['v1', 'v2', 'v3']) await loadFolder(repository, `${RELEASES}/${v}`, v);
    const viewer = await signedInAgent(app, team.viewer);
    const snapshots = await viewer.get(`/api/repositories/${repository.id}/snapshots`).expect(200);
    expect(snapshots.body.snapshots.map((s: { label: string }) => s.label)).toEqual(['v3', 'v2', 'v1']);
    expect(snapshots.body.snapshots[0]).toMatchObject({ status: 'ready', metrics: { classCount: 1, goneClassCount: 1 } });
    const metrics = (await viewer.get(`/api/repositories/${repository.id}/metrics`).expect(200)).body as RepositoryMetricsDTO;
    expect(metrics.cloneBudget).toBe(0.5);
    expect(metrics.points.map((p) => p.label)).toEqual(['v1', 'v2', 'v3']);
    for (const p of metrics.points) expect(p.cloneRatio).toBeCloseTo(p.clonedTokens / p.fragmentTokens, 12);
    await viewer.get('/api/repositories/abc/metrics').expect(400);
  });
});

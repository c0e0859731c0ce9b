import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import { buildCloneMap } from '../../../server/reports/clone-map';
import { organisationTrend } from '../../../server/reports/organisation-trend';
import type { LatestLoadsDTO, OrganisationTrendDTO } from '../../../shared/api/organisation';
import type { CloneMapDTO, CloneMapNodeDTO } from '../../../shared/api/repositories';
import { buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});

const metricsOf = async (snapshotId: number) =>
  (await select<{ fragmentTokens: string; clonedTokens: string }>(
    undefined,
    'select fragment_tokens as "fragmentTokens", cloned_tokens as "clonedTokens" from snapshot_metrics where snapshot_id = $1',
    [snapshotId],
  ))[0];

describe('GET /api/repositories/:id/clone-map', () => {
  it("gives the latest snapshot's directory tree, whose tokens add up to the snapshot's own figures", async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    await loadFolder(repository, `${RELEASES}/v1`, 'v1');
    const v2 = await loadFolder(repository, `${RELEASES}/v2`, 'v2');
    const viewer = await signedInAgent(app, team.viewer);
    const map = (await viewer.get(`/api/repositories/${repository.id}/clone-map`).expect(200)).body as CloneMapDTO;
    expect(map.snapshot).toEqual({ id: v2.snapshotId, label: 'v2' });
    expect(map.complete).toBe(true);
    const root = map.root!;
    expect(root.children!.map((c) => c.path).sort()).toEqual(['billing/', 'tools/', 'yard/']);
    // The clone ratio counts each token once by position: the map's sums are the snapshot's figures.
    const metrics = await metricsOf(v2.snapshotId);
    expect([root.tokens, root.clonedTokens]).toEqual([Number(metrics.fragmentTokens), Number(metrics.clonedTokens)]);
    const sum = (nodes: CloneMapNodeDTO[], key: 'tokens' | 'clonedTokens') => nodes.reduce((s, n) => s + n[key], 0);
    for (const dir of root.children!) {
      expect(dir.tokens).toBe(sum(dir.children!, 'tokens'));
      expect(dir.clonedTokens).toBe(sum(dir.children!, 'clonedTokens'));
      expect(dir.clonedTokens).toBeLessThanOrEqual(dir.tokens);
    }
    expect(root.children!.find((c) => c.path === 'billing/')!.children!.map((c) => c.path)).toEqual(['billing/tariff.js']);
  });

  it('answers with no tree before a snapshot is ready, and 404 for another organisation', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const viewer = await signedInAgent(app, team.viewer);
    expect((await viewer.get(`/api/repositories/${repository.id}/clone-map`).expect(200)).body).toEqual({ repositoryId: repository.id, snapshot: null, root: null, complete: true });
    const stranger = await buildTeam();
    await (await signedInAgent(app, stranger.viewer)).get(`/api/repositories/${repository.id}/clone-map`).expect(404);
  });
});

describe('buildCloneMap', () => {
  const files = [
    { path: 'a/b/c/one.js', tokens: 10, clonedTokens: 5 },
    { path: 'a/b/two.js', tokens: 30, clonedTokens: 0 },
    { path: 'top.js', tokens: 60, clonedTokens: 60 },
  ];

  it('sums files into their directories, largest first', () => {
    const { root, depth, complete } = buildCloneMap(files, 100);
    expect([root.tokens, root.clonedTokens, depth, complete]).toEqual([100, 65, 4, true]);
    expect(root.children!.map((c) => [c.path, c.tokens, c.clonedTokens])).toEqual([
      ['top.js', 60, 60],
      ['a/', 40, 5],
    ]);
  });

  it('drops the deepest levels until the tree fits, keeping the sums', () => {
    // 7 nodes in all: a/, top.js | a/b/ | a/b/c/, a/b/two.js | a/b/c/one.js
    const { root, depth, complete } = buildCloneMap(files, 4);
    expect([depth, complete]).toEqual([2, false]);
    const b = root.children!.find((c) => c.path === 'a/')!.children![0];
    expect([b.path, b.tokens, b.clonedTokens, b.children]).toEqual(['a/b/', 40, 5, undefined]);
  });
});

describe('GET /api/organisation/loads and /trend', () => {
  it('lists the latest loads of every repository, newest first, and the clone ratio over all of them after each load', async () => {
    const team = await buildTeam();
    const platform = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
    const depot = await buildRepository({ organisationId: team.organisation.id, name: 'depot-tools' });
    const a = await loadFolder(platform, `${RELEASES}/v1`, 'v1');
    const b = await loadFolder(depot, `${RELEASES}/v2`, 'd1');
    const c = await loadFolder(platform, `${RELEASES}/v3`, 'v3');
    const viewer = await signedInAgent(app, team.viewer);
    const loads = (await viewer.get('/api/organisation/loads?limit=2').expect(200)).body as LatestLoadsDTO;
    expect(loads.loads.map((l) => [l.repository.name, l.label, l.status])).toEqual([
      ['freight-platform', 'v3', 'ready'],
      ['depot-tools', 'd1', 'ready'],
    ]);
    await viewer.get('/api/organisation/loads?limit=51').expect(400);

    const trend = (await viewer.get('/api/organisation/trend').expect(200)).body as OrganisationTrendDTO;
    const [ma, mb, mc] = await Promise.all([a, b, c].map((l) => metricsOf(l.snapshotId)));
    const n = (x: string) => Number(x);
    expect(trend.points.map((p) => [p.label, p.repositoryCount, p.fragmentTokens, p.clonedTokens])).toEqual([
      ['v1', 1, n(ma.fragmentTokens), n(ma.clonedTokens)],
      ['d1', 2, n(ma.fragmentTokens) + n(mb.fragmentTokens), n(ma.clonedTokens) + n(mb.clonedTokens)],
      // v3 replaces v1 in the sum: each repository counts with its latest snapshot
      ['v3', 2, n(mc.fragmentTokens) + n(mb.fragmentTokens), n(mc.clonedTokens) + n(mb.clonedTokens)],
    ]);
    expect(trend.points[2].cloneRatio).toBeCloseTo((n(mc.clonedTokens) + n(mb.clonedTokens)) / (n(mc.fragmentTokens) + n(mb.fragmentTokens)), 12);
    const stranger = await buildTeam();
    expect(((await (await signedInAgent(app, stranger.viewer)).get('/api/organisation/trend').expect(200)).body as OrganisationTrendDTO).points).toEqual([]);
  });

  it('keeps only the latest points', () => {
    const load = (i: number) => ({ snapshotId: i, repositoryId: 1, repositoryName: 'r', label: `v${i}`, createdAt: new Date(0), fragmentTokens: 10, clonedTokens: i });
    expect(organisationTrend([1, 2, 3].map(load), 2).map((p) => [p.label, p.cloneRatio])).toEqual([
      ['v2', 0.2],
      ['v3', 0.3],
    ]);
  });
});

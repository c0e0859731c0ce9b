import { createRepositorySchema, repositoryParamsSchema, updateRepositorySchema, type RepositoryListDTO, type RepositoryMetricsDTO } from '../../shared/api/repositories';
import { currentUser } from '../auth/current-user';
import { select } from '../clone-index/sql';
import { createRepository, updateRepository } from '../commands/createRepository';
import { deleteRepository } from '../commands/deleteRepository';
import { NotFoundError } from '../errors';
import { Repository, Snapshot, SnapshotMetric } from '../models';
import type { User } from '../models/User';
import { authorize } from '../policies';
import { presentRepository, presentTrendPoint, type LatestSnapshot } from '../presenters/repository';
import { presentSnapshot } from '../presenters/snapshot';
import { defineRoutes } from './define';
import { parse } from './validate';

/** A repository of the actor's organisation, or 404. */
export async function loadRepository(actor: User, id: number): Promise<Repository> {
  const repository = await Repository.findOne({ where: { id, organisationId: actor.organisationId } });
  if (!repository) throw new NotFoundError('Repository');
  return repository;
}

async function latestSnapshots(ids: number[]): Promise<Map<number, LatestSnapshot>> {
  const rows = await select<LatestSnapshot & { repositoryId: number }>(
    undefined,
    `select distinct on (repository_id) repository_id as "repositoryId", id, label, clone_ratio as "cloneRatio", created_at as "createdAt"
       from snapshots where status = 'ready' and repository_id = any($1::int[]) order by repository_id, id desc`,
    [ids],
  );
  return new Map(rows.map((r) => [r.repositoryId, r]));
}

/** /api/repositories: tracked codebases, their settings, snapshots and trend. */
export const repositoryRoutes = defineRoutes('/repositories', [
  {
    method: 'get',
    path: '/',
    guard: 'repositories.read',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const repositories = await Repository.findAll({ where: { organisationId: actor.organisationId }, order: [['name', 'ASC']] });
      const latest = await latestSnapshots(repositories.map((r) => r.id));
      const answer: RepositoryListDTO = { repositories: repositories.map((r) => presentRepository(r, latest.get(r.id) ?? null)) };
      res.json(answer);
    },
  },
  {
    method: 'post',
    path: '/',
    guard: 'repositories.create',
    handler: async (req, res) => {
      const input = parse(createRepositorySchema, req.body);
      const actor = currentUser(req);
      authorize(actor, 'repositories.create', { organisationId: actor.organisationId });
      res.status(201).json(presentRepository(await createRepository(actor.organisationId, input), null));
    },
  },
  {
    method: 'get',
    path: '/:id',
    guard: 'repositories.read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = await loadRepository(currentUser(req), id);
      authorize(currentUser(req), 'repositories.read', repository);
      res.json(presentRepository(repository, (await latestSnapshots([id])).get(id) ?? null));
    },
  },
  {
    method: 'patch',
    path: '/:id',
    guard: 'repositories.update',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const input = parse(updateRepositorySchema, req.body);
      const repository = await loadRepository(currentUser(req), id);
      authorize(currentUser(req), 'repositories.update', repository);
      await updateRepository(repository, input);
      res.json(presentRepository(repository, (await latestSnapshots([id])).get(id) ?? null));
    },
  },
  {
    method: 'delete',
    path: '/:id',
    guard: 'repositories.delete',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = await loadRepository(currentUser(req), id);
      authorize(currentUser(req), 'repositories.delete', repository);
      await deleteRepository(repository);
      res.status(204).end();
    },
  },
  {
    method: 'get',
    path: '/:id/snapshots',
    guard: 'snapshots.read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = await loadRepository(currentUser(req), id);
      authorize(currentUser(req), 'snapshots.read', repository);
      const snapshots = await Snapshot.findAll({ where: { repositoryId: id }, order: [['id', 'DESC']] });
      const metrics = await SnapshotMetric.findAll({ where: { snapshotId: snapshots.map((s) => s.id) } });
      const bySnapshot = new Map(metrics.map((m) => [m.snapshotId, m]));
      res.json({ snapshots: snapshots.map((s) => presentSnapshot(s, bySnapshot.get(s.id) ?? null)) });
    },
  },
  {
    method: 'get',
    path: '/:id/metrics',
    guard: 'snapshots.read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = await loadRepository(currentUser(req), id);
      authorize(currentUser(req), 'snapshots.read', repository);
      const rows = await select<Parameters<typeof presentTrendPoint>[0]>(
        undefined,
        `select s.id as "snapshotId", s.label, s.created_at as "createdAt", m.clone_ratio as "cloneRatio",
                m.fragment_tokens as "fragmentTokens", m.cloned_tokens as "clonedTokens", m.pair_count as "pairCount",
                m.class_count as "classCount", m.cross_pair_count as "crossPairCount", m.new_class_count as "newClassCount",
                m.drifted_class_count as "driftedClassCount", m.gone_class_count as "goneClassCount"
           from snapshots s join snapshot_metrics m on m.snapshot_id = s.id
          where s.repository_id = $1 and s.status = 'ready' order by s.id`,
        [id],
      );
      const answer: RepositoryMetricsDTO = {
        repositoryId: id,
        cloneBudget: repository.cloneBudget === null ? null : Number(repository.cloneBudget),
        points: rows.map(presentTrendPoint),
      };
      res.json(answer);
    },
  },
]);

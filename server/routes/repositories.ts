import fs from 'node:fs/promises';
import {
  CLONE_MAP_MAX_NODES,
  createRepositorySchema,
  repositoryParamsSchema,
  updateRepositorySchema,
  type CloneMapDTO,
  type RepositoryListDTO,
  type RepositoryMetricsDTO,
} from '../../shared/api/repositories';
import { uploadSnapshotSchema, type SnapshotAnswerDTO, type SnapshotListDTO } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { createRepository, updateRepository } from '../commands/createRepository';
import { deleteRepository } from '../commands/deleteRepository';
import { uploadSnapshot } from '../commands/uploadSnapshot';
import { found, ValidationError } from '../errors';
import { tokenScopeOf } from '../policies/api-tokens';
import { authorize } from '../policies';
import { presentRepository, presentTrendPoint } from '../presenters/repository';
import { presentSnapshot } from '../presenters/snapshot';
import { findRepository, latestReadySnapshot, latestReadySnapshots, listRepositories, repositoryTrend } from '../queries/repositories';
import { fileFigures } from '../queries/clone-map';
import { listSnapshots, snapshotMetric } from '../queries/snapshots';
import { buildCloneMap } from '../reports/clone-map';
import { defineRoutes } from './define';
import { receiveArchive } from './receive-archive';
import { parse } from './validate';

/** /api/repositories: tracked codebases, their settings, snapshots and trend. */
export const repositoryRoutes = defineRoutes('/repositories', [
  {
    method: 'get',
    path: '/',
    guard: 'repositories.read',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const repositories = await listRepositories(actor.organisationId);
      const latest = await latestReadySnapshots(repositories.map((r) => r.id));
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
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'repositories.read', repository);
      res.json(presentRepository(repository, await latestReadySnapshot(id)));
    },
  },
  {
    method: 'patch',
    path: '/:id',
    guard: 'repositories.update',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const input = parse(updateRepositorySchema, req.body);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'repositories.update', repository);
      await updateRepository(repository, input);
      res.json(presentRepository(repository, await latestReadySnapshot(id)));
    },
  },
  {
    method: 'delete',
    path: '/:id',
    guard: 'repositories.delete',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'repositories.delete', repository);
      await deleteRepository(repository);
      res.status(204).end();
    },
  },
  {
    method: 'post',
    path: '/:id/snapshots',
    guard: 'snapshots.upload',
    token: 'upload',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const actor = currentUser(req);
      const repository = found(await findRepository(actor.organisationId, id), 'Repository');
      authorize(actor, 'snapshots.upload', repository);
      // Only now, with the caller allowed, is the body read: streamed to a temporary file.
      const tempFile = await receiveArchive(req, res);
      let label: string;
      try {
        ({ label } = parse(uploadSnapshotSchema, req.body));
        if (!tempFile) throw new ValidationError('Send the archive (.zip, .tar, .tar.gz) as multipart/form-data in the field "archive".', 'archive');
      } catch (error) {
        if (tempFile) await fs.rm(tempFile, { force: true });
        throw error;
      }
      const { snapshot, created } = await uploadSnapshot({ repository, label, tempFile, startedBy: tokenScopeOf(actor) ? null : actor.id });
      const answer: SnapshotAnswerDTO = { snapshot: presentSnapshot(snapshot, created ? null : await snapshotMetric(snapshot.id)) };
      res.status(created ? 202 : 200).json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id/snapshots',
    guard: 'snapshots.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'snapshots.read', repository);
      const answer: SnapshotListDTO = { snapshots: (await listSnapshots(id)).map(({ snapshot, metric }) => presentSnapshot(snapshot, metric)) };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id/metrics',
    guard: 'snapshots.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'snapshots.read', repository);
      const answer: RepositoryMetricsDTO = {
        repositoryId: id,
        cloneBudget: repository.cloneBudget === null ? null : Number(repository.cloneBudget),
        points: (await repositoryTrend(id)).map(presentTrendPoint),
      };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id/clone-map',
    guard: 'snapshots.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'snapshots.read', repository);
      const latest = await latestReadySnapshot(id);
      const map = latest ? buildCloneMap(await fileFigures(latest.id), CLONE_MAP_MAX_NODES) : null;
      const answer: CloneMapDTO = {
        repositoryId: id,
        snapshot: latest && { id: latest.id, label: latest.label },
        root: map?.root ?? null,
        complete: map?.complete ?? true,
      };
      res.json(answer);
    },
  },
]);

import { classListQuerySchema, idParamsSchema, type CloneClassPageDTO, type SnapshotComparisonDTO } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { allSnapshotClasses, goneClasses, listSnapshotClasses } from '../clone-index/snapshot-classes';
import { select } from '../clone-index/sql';
import { NotFoundError } from '../errors';
import { Snapshot, SnapshotMetric } from '../models';
import type { User } from '../models/User';
import { authorize } from '../policies';
import { presentCloneClass, presentGoneClass, presentSnapshot } from '../presenters/snapshot';
import { defineRoutes } from './define';
import { loadRepository } from './repositories';
import { parse } from './validate';

/** A snapshot whose repository is in the actor's organisation, with that repository, or 404. */
async function loadSnapshot(actor: User, id: number) {
  const snapshot = await Snapshot.findByPk(id);
  if (!snapshot) throw new NotFoundError('Snapshot');
  const repository = await loadRepository(actor, snapshot.repositoryId).catch(() => {
    throw new NotFoundError('Snapshot');
  });
  return { snapshot, repository };
}

/** /api/snapshots: one snapshot, its clone classes, and its comparison with the previous one. */
export const snapshotRoutes = defineRoutes('/snapshots', [
  {
    method: 'get',
    path: '/:id',
    guard: 'snapshots.read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const { snapshot, repository } = await loadSnapshot(currentUser(req), id);
      authorize(currentUser(req), 'snapshots.read', repository);
      res.json(presentSnapshot(snapshot, await SnapshotMetric.findByPk(id)));
    },
  },
  {
    method: 'get',
    path: '/:id/classes',
    guard: 'cloneClasses.read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const query = parse(classListQuerySchema, req.query);
      const { repository } = await loadSnapshot(currentUser(req), id);
      authorize(currentUser(req), 'cloneClasses.read', repository);
      const { rows, total } = await listSnapshotClasses(id, query);
      const answer: CloneClassPageDTO = { classes: rows.map(presentCloneClass), total, page: query.page, pageSize: query.pageSize };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id/comparison',
    guard: 'cloneClasses.read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const { snapshot, repository } = await loadSnapshot(currentUser(req), id);
      authorize(currentUser(req), 'cloneClasses.read', repository);
      const [previous] = await select<{ id: number; label: string }>(
        undefined,
        `select id, label from snapshots where repository_id = $1 and status = 'ready' and id < $2 order by id desc limit 1`,
        [snapshot.repositoryId, id],
      );
      const classes = (await allSnapshotClasses(id)).map(presentCloneClass);
      const gone = previous ? (await goneClasses(id, previous.id)).map(presentGoneClass) : [];
      const counts = { new: 0, unchanged: 0, grown: 0, shrunk: 0, edited: 0, drifted: 0, gone: gone.length };
      for (const c of classes) counts[c.status]++;
      const answer: SnapshotComparisonDTO = { snapshotId: id, previous: previous ?? null, counts, classes, gone };
      res.json(answer);
    },
  },
]);

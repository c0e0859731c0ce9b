import { classListQuerySchema, idParamsSchema, type CloneClassPageDTO, type SnapshotAnswerDTO } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { cancelSnapshotLoad } from '../commands/uploadSnapshot';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentCloneClass, presentComparison, presentSnapshot } from '../presenters/snapshot';
import { allSnapshotClasses, goneClasses, listSnapshotClasses } from '../queries/classes';
import { findSnapshot, previousReadySnapshot, snapshotMetric } from '../queries/snapshots';
import { defineRoutes } from './define';
import { parse } from './validate';

/** /api/snapshots: one snapshot, its clone classes, and its comparison with the previous one. */
export const snapshotRoutes = defineRoutes('/snapshots', [
  {
    method: 'get',
    path: '/:id',
    guard: 'snapshots.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const { snapshot, repository } = found(await findSnapshot(currentUser(req).organisationId, id), 'Snapshot');
      authorize(currentUser(req), 'snapshots.read', repository);
      res.json(presentSnapshot(snapshot, await snapshotMetric(id)));
    },
  },
  {
    method: 'post',
    path: '/:id/cancel',
    guard: 'snapshots.cancel',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const actor = currentUser(req);
      const { snapshot, repository } = found(await findSnapshot(actor.organisationId, id), 'Snapshot');
      authorize(actor, 'snapshots.cancel', { organisationId: repository.organisationId, repositoryId: repository.id, startedBy: snapshot.startedBy });
      const answer: SnapshotAnswerDTO = { snapshot: presentSnapshot(await cancelSnapshotLoad(snapshot), null) };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id/classes',
    guard: 'cloneClasses.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const query = parse(classListQuerySchema, req.query);
      const { repository } = found(await findSnapshot(currentUser(req).organisationId, id), 'Snapshot');
      authorize(currentUser(req), 'cloneClasses.read', repository);
      const { rows, total, waivedCount } = await listSnapshotClasses(id, query);
      const answer: CloneClassPageDTO = { classes: rows.map(presentCloneClass), total, waivedCount, page: query.page, pageSize: query.pageSize };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/:id/comparison',
    guard: 'cloneClasses.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const { snapshot, repository } = found(await findSnapshot(currentUser(req).organisationId, id), 'Snapshot');
      authorize(currentUser(req), 'cloneClasses.read', repository);
      const previous = await previousReadySnapshot(undefined, snapshot.repositoryId, id);
      const gone = previous ? await goneClasses(id, previous.id) : [];
      res.json(presentComparison(id, previous, await allSnapshotClasses(id), gone));
    },
  },
]);

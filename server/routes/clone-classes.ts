import { idParamsSchema } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { classMembers, findClass } from '../clone-index/snapshot-classes';
import { NotFoundError } from '../errors';
import { authorize } from '../policies';
import { presentCloneClassDetail } from '../presenters/snapshot';
import { defineRoutes } from './define';
import { loadRepository } from './repositories';
import { parse } from './validate';

/** /api/clone-classes: one class with its members' code, for the side-by-side view. */
export const cloneClassRoutes = defineRoutes('/clone-classes', [
  {
    method: 'get',
    path: '/:id',
    guard: 'cloneClasses.read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const row = await findClass(id);
      if (!row) throw new NotFoundError('Clone class');
      const repository = await loadRepository(currentUser(req), row.repositoryId).catch(() => {
        throw new NotFoundError('Clone class');
      });
      authorize(currentUser(req), 'cloneClasses.read', repository);
      const { members, pairs } = await classMembers(id, row.threshold);
      res.json(presentCloneClassDetail(row, members, pairs));
    },
  },
]);
